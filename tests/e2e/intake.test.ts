/**
 * Meeting-night intake in Chromium: three blocks taken in and measured with the keyboard alone while
 * the browser is offline, synced once when it comes back; and label sheets of the right size.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import type { BrowserContext, Page } from 'playwright-core';
import { launchBrowser } from '../helpers/browser';
import { startE2eServer } from '../helpers/e2e-server';
import { seriousViolations } from '../helpers/axe';
import { insertConfirmedAccount, PASSWORD, signIn as signInAgent, uniqueEmail } from '../helpers/factories';
import { swapBody } from '../api/swaps-support';
import type { RunningServer } from '../../server/index';
import type { IntakePackDto } from '../../shared/schemas/intake';

let server: RunningServer;
let browser: BrowserContext;
let coordinator: { agent: ReturnType<typeof supertest.agent>; email: string };
let guildId: number;
let swapId: number;

async function register(displayName: string) {
  const agent = supertest.agent(server.url).set('X-Requested-With', 'blockpost');
  const email = uniqueEmail('intake');
  const id = await insertConfirmedAccount(server.deps.pool, { email, displayName });
  await signInAgent(agent, email);
  return { agent, email, id };
}

/** A guild whose swap is collecting 25 blocks: the coordinator's 5 and four members' 5 each. */
beforeAll(async () => {
  server = await startE2eServer();
  const admin = await register('Wilhelmina Oduya');
  guildId = (await admin.agent.post('/api/guilds').send({ name: 'Millrace Quilters' }).expect(201)).body.id;
  const { Membership } = await import('../../server/db/models');
  const coord = await register('Rosalind Featherstone');
  await Membership.create({ guildId, userId: coord.id, role: 'coordinator' });
  coordinator = coord;
  const makers = [coord];
  for (const name of ['Imogen Haldane', 'Tobias Wren', 'Marguerite Osei', 'Florence Ackland']) {
    const m = await register(name);
    await Membership.create({ guildId, userId: m.id, role: 'member' });
    makers.push(m);
  }
  swapId = (
    await coord.agent
      .post(`/api/guilds/${guildId}/swaps`)
      .send(swapBody({ title: 'Lantern Nine-Patch' }))
      .expect(201)
  ).body.id;
  await coord.agent.post(`/api/swaps/${swapId}/transitions`).send({ to: 'signup' }).expect(200);
  for (const m of makers) await m.agent.post(`/api/swaps/${swapId}/signups`).send({ blocks: 5 }).expect(200);
  for (const to of ['sewing', 'collecting']) await coord.agent.post(`/api/swaps/${swapId}/transitions`).send({ to }).expect(200);
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

/** Collects the page's Content-Security-Policy refusals: the app must work under its own CSP. */
function cspRefusals(page: Page): string[] {
  const refusals: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error' && /Content.Security.Policy|Refused to/i.test(m.text())) refusals.push(m.text());
  });
  return refusals;
}

/** Opens a page as the coordinator, signing in on the way when the browser is not signed in yet. */
async function openAs(page: Page, email: string, path: string) {
  // The sign-in page sends a signed-in visitor straight on to `next`.
  await page.goto(`${server.url}/sign-in?next=${encodeURIComponent(path)}`);
  const form = page.getByLabel('E-mail');
  await Promise.race([
    form.waitFor().catch(() => undefined),
    page.waitForURL((url) => url.pathname === path).catch(() => undefined),
  ]);
  if (new URL(page.url()).pathname === path) return;
  await form.fill(email);
  await page.getByLabel('Password').fill(PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => url.pathname === path);
}

/** Types a label's short code, then width, Tab, height, Enter on the measuring card. */
async function takeInAndMeasure(page: Page, shortCode: string, width: string, height: string) {
  await page.getByLabel('Short code from the label').fill(shortCode);
  await page.keyboard.press('Enter');
  await page.getByLabel('Width').waitFor();
  await page.keyboard.type(width);
  await page.keyboard.press('Tab');
  await page.keyboard.type(height);
  await page.keyboard.press('Enter');
}

/** The verdicts the server holds for a block, newest first. */
const storedVerdicts = async (blockId: number): Promise<string[]> =>
  (await coordinator.agent.get(`/api/blocks/${blockId}/measurements`).expect(200)).body.map(
    (m: { verdict: string }) => m.verdict,
  );

describe('intake', () => {
  it('measures three blocks offline with the keyboard alone, then syncs each exactly once', async () => {
    const page = await browser.newPage();
    const refusals = cspRefusals(page);
    await openAs(page, coordinator.email, `/guilds/${guildId}/swaps/${swapId}/intake`);
    await page.getByRole('heading', { name: 'Intake: Lantern Nine-Patch' }).waitFor();
    await page.getByText('All synced').waitFor();
    expect(await seriousViolations(page)).toEqual([]);

    const pack: IntakePackDto = (await coordinator.agent.get(`/api/swaps/${swapId}/intake`).expect(200)).body;
    const picked = [pack.blocks[0]!, pack.blocks[7]!, pack.blocks[19]!];
    // Target 9½″ ± ⅛″, diagonals within ¼″ (the swap's settings; 9½″ = 3 × 3″ finished + ½″ seams).
    const sizes = [
      { keys: ['9 1/2', '9½'], verdict: 'True to size' },
      { keys: ['9 7/8', '9.5'], verdict: 'Trim to size' },
      // 13½″ against 13⅞″: ⅜″ apart, over the ¼″ squareness limit.
      { keys: ['9.5', '241.3 mm', '13 1/2', '13 7/8'], verdict: 'Out of square' },
    ];

    await browser.setOffline(true);
    const code = page.getByLabel('Short code from the label');
    expect(await code.evaluate((el) => el === document.activeElement)).toBe(true);
    // Keys at 150 ms each, a steady typist's pace (about 80 words a minute), so the figure below is
    // handling time a person could match; it is printed, not asserted.
    const delay = 150;
    const seconds: number[] = [];
    let keys = 0;
    for (const [i, block] of picked.entries()) {
      const started = performance.now();
      // Typed the way a person reads it off the label: lower case, with the hyphen.
      const typed = `${block.shortCode.slice(0, 4)}-${block.shortCode.slice(4)}`.toLowerCase();
      await page.keyboard.type(typed, { delay });
      await page.keyboard.press('Enter');
      keys += typed.length + 1;
      await page.getByRole('heading', { name: `Block ${block.ordinal} of ${block.of} · ${block.maker.displayName}` }).waitFor();
      const width = page.getByLabel('Width');
      await expect.poll(() => width.evaluate((el) => el === document.activeElement)).toBe(true);
      for (const [k, text] of sizes[i]!.keys.entries()) {
        if (k > 0) await page.keyboard.press('Tab', { delay });
        await page.keyboard.type(text, { delay });
        keys += text.length + (k > 0 ? 1 : 0);
      }
      await page.keyboard.press('Enter');
      keys += 1;
      await page.getByTestId('verdict').getByText(sizes[i]!.verdict).waitFor();
      await expect.poll(() => code.evaluate((el) => el === document.activeElement)).toBe(true);
      seconds.push((performance.now() - started) / 1000);
      expect(await page.getByTestId('verdict-status').textContent()).toMatch(/waiting for Blockpost to confirm/);
    }
    console.log(
      `intake offline, keyboard only, ${delay} ms a key: ${seconds.map((x) => x.toFixed(1)).join(' s, ')} s per block ` +
        `(${keys} keys in all; mean ${(seconds.reduce((a, b) => a + b, 0) / seconds.length).toFixed(1)} s)`,
    );

    await page.getByText('Waiting to sync: 3').waitFor();
    await page.getByText(/No connection: kept on this device/).waitFor();
    // Nothing has reached the server yet.
    for (const block of picked) {
      const stored = await coordinator.agent.get(`/api/blocks/${block.id}/measurements`).expect(200);
      expect(stored.body).toEqual([]);
    }

    await browser.setOffline(false);
    await page.getByText('All synced').waitFor({ timeout: 20_000 });
    await page.getByTestId('verdict-status').getByText('Confirmed by Blockpost').waitFor();

    const expected = ['true', 'trim', 'skewed'];
    for (const [i, block] of picked.entries()) {
      const stored = await coordinator.agent.get(`/api/blocks/${block.id}/measurements`).expect(200);
      expect(stored.body, `block ${block.id}`).toHaveLength(1);
      expect(stored.body[0]).toMatchObject({ verdict: expected[i], source: 'ruler', width: 9.5 + (i === 1 ? 0.375 : 0) });
      const after = await coordinator.agent.get(`/api/blocks/${block.id}`).expect(200);
      expect(after.body).toMatchObject({ state: 'measured', verdict: expected[i] });
    }
    // A second sync pass (another "online" event) sends nothing again.
    await page.evaluate(() => window.dispatchEvent(new Event('online')));
    await page.getByText('All synced').waitFor();
    const roster = await coordinator.agent.get(`/api/swaps/${swapId}/roster`).expect(200);
    expect(roster.body.totals).toMatchObject({ received: 3, measured: 3 });
    expect(refusals).toEqual([]);
    await page.close();
  });

  it('online: takes a block in at once, and refuses an unknown code with the reason, keeping what was typed', async () => {
    const page = await browser.newPage();
    await openAs(page, coordinator.email, `/guilds/${guildId}/swaps/${swapId}`);
    await page.getByRole('navigation', { name: 'Swap sections' }).getByRole('link', { name: 'Intake' }).click();
    await page.getByRole('heading', { name: 'Intake: Lantern Nine-Patch' }).waitFor();
    const code = page.getByLabel('Short code from the label');
    const pack: IntakePackDto = (await coordinator.agent.get(`/api/swaps/${swapId}/intake`).expect(200)).body;
    const block = pack.blocks[12]!;
    await code.fill(block.shortCode);
    await page.keyboard.press('Enter');
    await page.getByLabel('Width').waitFor();
    await page.keyboard.press('Escape');
    await expect.poll(() => code.evaluate((el) => el === document.activeElement)).toBe(true);
    await expect.poll(async () => (await coordinator.agent.get(`/api/blocks/${block.id}`)).body.state).toBe('received');

    await code.fill('ZZZZ-ZZZ0');
    await page.keyboard.press('Enter');
    await page.getByText('Short codes have no 0, O, 1 or I.', { exact: false }).waitFor();
    expect(await code.inputValue()).toBe('ZZZZ-ZZZ0');
    await code.fill('ZZZZ-ZZZZ');
    await page.keyboard.press('Enter');
    await page.getByText('No block in this swap has the code ZZZZ-ZZZZ', { exact: false }).waitFor();
    await page.close();
  });

  it('opens again without a network (service worker) and keeps taking blocks in', async () => {
    const page = await browser.newPage();
    await openAs(page, coordinator.email, `/guilds/${guildId}/swaps/${swapId}/intake`);
    await page.getByText('All synced').waitFor();
    await page.waitForFunction(() => navigator.serviceWorker.controller !== null);
    await browser.setOffline(true);
    await page.reload();
    await page.getByRole('heading', { name: 'Intake: Lantern Nine-Patch' }).waitFor();
    const pack: IntakePackDto = (await coordinator.agent.get(`/api/swaps/${swapId}/intake`).expect(200)).body;
    const block = pack.blocks[21]!;
    await takeInAndMeasure(page, block.shortCode, '9 1/4', '9 1/2');
    await page.getByTestId('verdict').getByText('Runs short').waitFor();
    await page.getByText('Waiting to sync: 1').waitFor();
    await browser.setOffline(false);
    await page.getByText('All synced').waitFor({ timeout: 20_000 });
    expect(await storedVerdicts(block.id)).toEqual(['short']);
    await page.close();
  });

  it('sends what was measured offline from any page later, without opening the intake view again', async () => {
    const page = await browser.newPage();
    await openAs(page, coordinator.email, `/guilds/${guildId}/swaps/${swapId}/intake`);
    await page.getByText('All synced').waitFor();
    const pack: IntakePackDto = (await coordinator.agent.get(`/api/swaps/${swapId}/intake`).expect(200)).body;
    const block = pack.blocks[23]!;
    await browser.setOffline(true);
    await takeInAndMeasure(page, block.shortCode, '9 1/2', '9 1/2');
    await page.getByText('Waiting to sync: 1').waitFor();
    await page.close(); // the hall closes; the queue stays on the device

    await browser.setOffline(false);
    const later = await browser.newPage();
    await later.goto(`${server.url}/guilds`);
    await later.getByRole('heading', { name: 'Your guilds' }).waitFor();
    await expect.poll(() => storedVerdicts(block.id), { timeout: 20_000 }).toEqual(['true']);
    expect((await coordinator.agent.get(`/api/blocks/${block.id}`).expect(200)).body).toMatchObject({
      state: 'measured',
      verdict: 'true',
    });
    await later.close();
  });
});

describe('label sheets', () => {
  const mm = (x: number) => (x / 25.4) * 96; // CSS pixels: 96 to the inch, 25.4 mm to the inch

  it('puts 25 labels on two A4 sheets of 21, each 63.5 × 38.1 mm', async () => {
    const page = await browser.newPage();
    const refusals = cspRefusals(page);
    await openAs(page, coordinator.email, `/guilds/${guildId}/swaps/${swapId}/labels`);
    await page.goto(`${server.url}/guilds/${guildId}/swaps/${swapId}/labels?maker=all&sheet=a4-21`);
    await page.getByRole('heading', { name: 'Labels: Lantern Nine-Patch' }).waitFor();
    await expect.poll(() => page.getByTestId('label').count()).toBe(25);
    expect(await page.getByTestId('label-sheet').count()).toBe(2);
    expect(await page.getByTestId('label-sheet').first().getByTestId('label').count()).toBe(21);
    expect(await seriousViolations(page)).toEqual([]);

    await page.emulateMedia({ media: 'print' });
    expect(await page.getByRole('button', { name: 'Print' }).isVisible()).toBe(false);
    const sheet = (await page.getByTestId('label-sheet').first().boundingBox())!;
    expect(sheet.width).toBeCloseTo(mm(210), 0);
    expect(sheet.height).toBeCloseTo(mm(297), 0);
    const first = (await page.getByTestId('label').nth(0).boundingBox())!;
    const second = (await page.getByTestId('label').nth(1).boundingBox())!;
    const below = (await page.getByTestId('label').nth(3).boundingBox())!;
    expect(first.width).toBeCloseTo(mm(63.5), 0);
    expect(first.height).toBeCloseTo(mm(38.1), 0);
    expect(first.x - sheet.x).toBeCloseTo(mm(7.25), 0);
    expect(first.y - sheet.y).toBeCloseTo(mm(15.15), 0);
    expect(second.x - first.x).toBeCloseTo(mm(66), 0); // 63.5 mm label + 2.5 mm gap
    expect(below.y - first.y).toBeCloseTo(mm(38.1), 0);

    const pdf = await page.pdf({ preferCSSPageSize: true, printBackground: true });
    expect(pdf.toString('latin1').match(/\/Type\s*\/Page\b/g)).toHaveLength(2);
    expect(refusals).toEqual([]);
    await page.close();
  });

  it('puts the same 25 labels on one US Letter sheet of 30, each 2⅝ × 1 in', async () => {
    const page = await browser.newPage();
    await openAs(page, coordinator.email, `/guilds/${guildId}/swaps/${swapId}/labels`);
    await page.goto(`${server.url}/guilds/${guildId}/swaps/${swapId}/labels?maker=all&sheet=letter-30`);
    await expect.poll(() => page.getByTestId('label').count()).toBe(25);
    expect(await page.getByTestId('label-sheet').count()).toBe(1);
    await page.emulateMedia({ media: 'print' });
    const sheet = (await page.getByTestId('label-sheet').boundingBox())!;
    const first = (await page.getByTestId('label').first().boundingBox())!;
    expect(sheet.width).toBeCloseTo(8.5 * 96, 0);
    expect(first.width).toBeCloseTo(2.625 * 96, 0);
    expect(first.height).toBeCloseTo(96, 0);
    expect(first.y - sheet.y).toBeCloseTo(0.5 * 96, 0);
    const pdf = await page.pdf({ preferCSSPageSize: true, printBackground: true });
    expect(pdf.toString('latin1').match(/\/Type\s*\/Page\b/g)).toHaveLength(1);

    // Eleven positions already used on a part-used sheet: 19 labels fit on the first, 6 on a second.
    await page.emulateMedia({ media: 'screen' });
    await page.goto(`${server.url}/guilds/${guildId}/swaps/${swapId}/labels?maker=all&sheet=letter-30&skip=11`);
    await expect.poll(() => page.getByTestId('label').count()).toBe(25);
    expect(await page.getByTestId('label-sheet').count()).toBe(2);
    expect(await page.getByTestId('label-sheet').first().getByTestId('label').count()).toBe(19);
    await page.close();
  });
});

describe('signing out', () => {
  it('deletes the kept API answers and swap data from the device', async () => {
    const page = await browser.newPage();
    await openAs(page, coordinator.email, `/guilds/${guildId}/swaps/${swapId}/intake`);
    await page.getByText('All synced').waitFor();
    await page.waitForFunction(() => navigator.serviceWorker.controller !== null);
    const kept = () =>
      page.evaluate(async () => {
        const api = await (await caches.open('blockpost-api-v1')).keys();
        const packs = await new Promise<number>((resolve) => {
          const open = indexedDB.open('blockpost-intake');
          open.onsuccess = () => {
            const request = open.result.transaction('packs').objectStore('packs').count();
            request.onsuccess = () => {
              open.result.close(); // an open connection would hold up the sign-out's delete
              resolve(request.result);
            };
          };
        });
        return { api: api.map((r) => new URL(r.url).pathname).sort(), packs };
      });
    expect(await kept()).toEqual({
      api: ['/api/guilds/' + guildId, '/api/session', `/api/swaps/${swapId}/intake`].sort(),
      packs: 1,
    });
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL((url) => url.pathname === '/sign-in');
    await page.getByRole('heading', { name: /sign in/i }).waitFor();
    await expect.poll(kept).toEqual({ api: [], packs: 0 });
    await page.close();
  });
});
