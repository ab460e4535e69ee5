/**
 * Forms on a phone never lose what was typed: the Cutting planner keeps its last good results and
 * every input through typos, keeps its inputs in the page address, reads bare numbers as millimetres
 * in millimetre mode, and says exactly what each field allows. Intake on a phone goes width, Next,
 * height, Save with the on-screen keyboard.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import type { BrowserContext, Page } from 'playwright-core';
import { launchBrowser } from '../helpers/browser';
import { startE2eServer } from '../helpers/e2e-server';
import {
  finishSignUp,
  insertConfirmedAccount,
  mailJobsOn,
  PASSWORD,
  signIn as signInAgent,
  uniqueEmail,
} from '../helpers/factories';
import { swapBody } from '../api/swaps-support';
import type { IntakePackDto } from '../../shared/schemas/intake';
import type { RunningServer } from '../../server/index';

let server: RunningServer;
let browser: BrowserContext;
let page: Page;
beforeAll(async () => {
  server = await startE2eServer(mailJobsOn);
  browser = await launchBrowser({ viewport: { width: 360, height: 740 } });
  page = await browser.newPage();
  await page.goto(`${server.url}/register?next=/planner`);
  await page.getByLabel('Your name').fill('Wilhelmina Acheson');
  const email = uniqueEmail('phone-forms');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(PASSWORD);
  await page.getByRole('button', { name: 'Create account' }).click();
  await finishSignUp(page, email);
  await page.getByRole('heading', { name: 'Cutting planner' }).waitFor();
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

async function freshPlanner(query = '') {
  await page.goto(`${server.url}/planner${query}`);
  await page.getByRole('heading', { name: 'Cutting planner' }).waitFor();
}

describe('Cutting planner', () => {
  it('keeps the last good results, marked out of date, and every quilt field through a typo', async () => {
    await freshPlanner();
    await page.getByLabel('Blocks across').fill('3');
    await page.getByLabel('Sashing (finished width)').fill('1');
    await page.getByLabel('Borders (finished widths)').fill('2, 4');
    const top = await page.getByTestId('top-size').textContent();

    // Half-way to "1 1/2": the field says what is wrong, the results stay, marked out of date.
    await page.getByLabel('Row cut heights').fill('4, 3, 2, 1 1/');
    await page.getByText(/Entry 4 \(“1 1\/”\)/).waitFor();
    await page.getByText('Out of date', { exact: true }).waitFor();
    expect(await page.getByTestId('unfinished-size').textContent()).toBe('8½″ × 8½″');
    expect(await page.getByLabel('Sashing (finished width)').inputValue()).toBe('1');

    await page.getByLabel('Row cut heights').fill('4, 3, 2, 1 1/2');
    await expect.poll(() => page.getByText('Out of date', { exact: true }).count()).toBe(0);
    expect(await page.getByLabel('Blocks across').inputValue()).toBe('3');
    expect(await page.getByLabel('Sashing (finished width)').inputValue()).toBe('1');
    expect(await page.getByLabel('Borders (finished widths)').inputValue()).toBe('2, 4');
    expect(await page.getByTestId('top-size').textContent()).not.toBe(top); // the shorter block changed the top
  });

  it('keeps its inputs in the page address, so a reload or a shared link shows the same plan', async () => {
    await freshPlanner();
    await page.getByLabel('Column cut widths').fill('3 1/2, 3 1/2');
    await page.getByLabel('Blocks across').fill('4');
    await expect.poll(() => new URL(page.url()).searchParams.get('cols')).toBe('3 1/2, 3 1/2');
    await page.reload();
    await page.getByRole('heading', { name: 'Cutting planner' }).waitFor();
    expect(await page.getByLabel('Column cut widths').inputValue()).toBe('3 1/2, 3 1/2');
    expect(await page.getByLabel('Blocks across').inputValue()).toBe('4');
  });

  it('reads bare numbers as millimetres in millimetre mode and shows the unit beside each field', async () => {
    await freshPlanner();
    await page.getByText('Millimetres').click();
    await page.getByLabel('Seam allowance').fill('6.35'); // ¼″ is 6.35 mm (1 in = 25.4 mm exactly, NIST SP 811)
    await page.getByLabel('Column cut widths').fill('64, 64, 64');
    await page.getByLabel('Row cut heights').fill('64, 64, 64');
    // 3 × 64 mm less two seams of 2 × 6.35 mm: 166.6 mm (unfinished = Σ cuts − 2 × SA × seams, common practice, no source).
    expect(await page.getByTestId('unfinished-size').textContent()).toBe('166.6 mm × 166.6 mm');
    expect(await page.getByText(/is longer than|does not fit/).count()).toBe(0);
    expect(await page.locator('[id$="-unit"]', { hasText: 'mm' }).count()).toBeGreaterThan(4);
    expect(new URL(page.url()).searchParams.get('u')).toBe('mm');
  });

  it('lets "Blocks in the quilt" follow "How many blocks" until it is changed', async () => {
    await freshPlanner();
    await page.getByLabel('How many blocks or units').fill('20');
    expect(await page.getByLabel('Blocks in the quilt').inputValue()).toBe('20');
    await page.getByLabel('Blocks in the quilt').fill('24');
    await page.getByLabel('How many blocks or units').fill('30');
    expect(await page.getByLabel('Blocks in the quilt').inputValue()).toBe('24');
  });

  it('says what a length field allows, for a negative number and for zero alike', async () => {
    await freshPlanner();
    await page.getByLabel('Seam allowance').fill('-2');
    await page.getByText('Enter a length greater than zero; “-2” is negative.').waitFor();
    await page.getByLabel('Seam allowance').fill('0');
    await page.getByText('Enter a length greater than zero.', { exact: true }).waitFor();
  });

  it('refuses a fabric narrower than the widest strip set and asks before planning with a narrow one', async () => {
    await freshPlanner();
    await page.getByLabel('Usable width of fabric (WOF)').fill('3');
    await page.getByText('The fabric must be at least as wide as the widest piece or strip set, 8½″.').waitFor();
    await page.getByText('Out of date', { exact: true }).waitFor();
    await page.getByLabel('Usable width of fabric (WOF)').fill('30');
    await page.getByText(/narrower than most quilting cotton/).waitFor();
    await page.getByText('Out of date', { exact: true }).waitFor();
    await page.getByLabel('My fabric really is this narrow').check();
    await expect.poll(() => page.getByText('Out of date', { exact: true }).count()).toBe(0);
    expect(await page.getByText(/Strips across the width of fabric \(30″\)/).count()).toBe(1);
  });

  it('points at an empty entry in a list instead of dropping it', async () => {
    await freshPlanner();
    await page.getByLabel('Column cut widths').fill('2 1/2, , 2');
    await page.getByText('Entry 2 is empty: type a length there or remove the extra comma.').waitFor();
    expect(await page.getByLabel('Column cut widths').inputValue()).toBe('2 1/2, , 2');
  });
});

describe('Intake on a phone', () => {
  let phone: BrowserContext;
  let agent: ReturnType<typeof supertest.agent>;
  let path: string;
  let code: string;
  beforeAll(async () => {
    agent = supertest.agent(server.url).set('X-Requested-With', 'blockpost');
    const email = uniqueEmail('phone-intake');
    await insertConfirmedAccount(server.deps.pool, { email, displayName: 'Ottoline Brackley' });
    await signInAgent(agent, email);
    const guildId = (await agent.post('/api/guilds').send({ name: 'Weir Lane Stitchers' }).expect(201)).body.id as number;
    const swapId = (
      await agent
        .post(`/api/guilds/${guildId}/swaps`)
        .send(swapBody({ title: 'Phone Nine-Patch' }))
        .expect(201)
    ).body.id as number;
    await agent.post(`/api/swaps/${swapId}/transitions`).send({ to: 'signup' }).expect(200);
    await agent.post(`/api/swaps/${swapId}/signups`).send({ blocks: 1 }).expect(200);
    for (const to of ['sewing', 'collecting']) await agent.post(`/api/swaps/${swapId}/transitions`).send({ to }).expect(200);
    const pack = (await agent.get(`/api/swaps/${swapId}/intake`).expect(200)).body as IntakePackDto;
    code = pack.blocks[0]!.shortCode;
    path = `/guilds/${guildId}/swaps/${swapId}/intake`;
    phone = await launchBrowser({ viewport: { width: 390, height: 844 } });
    const page = await phone.newPage();
    await page.goto(`${server.url}/sign-in?next=${encodeURIComponent(path)}`);
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill(PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((url) => url.pathname === path);
    await page.close();
  });
  afterAll(async () => {
    await phone?.close();
  });

  async function openCard() {
    const page = await phone.newPage();
    await page.goto(`${server.url}${path}`);
    await page.getByText('width, Next, height, Save').first().waitFor();
    await page.getByLabel('Short code from the label').fill(code);
    await page.keyboard.press('Enter');
    await page.getByLabel('Width').waitFor();
    return page;
  }

  it('moves from width to height with the keyboard’s Next key and records with its Save key', async () => {
    const page = await openCard();
    const width = page.getByLabel('Width');
    expect(await width.getAttribute('enterkeyhint')).toBe('next');
    expect(await width.getAttribute('inputmode')).toBe('text'); // fractions need a space and a slash
    expect(await page.getByLabel('Height').getAttribute('enterkeyhint')).toBe('done');
    await width.fill('9 1/2');
    // The height has the cursor as the Next key is handled, not a moment later: a fast typist's (or a
    // keyboard wedge's) next keys would land in the width.
    const movedAtOnce = await width.evaluate((el) => {
      el.dispatchEvent(new KeyboardEvent('keydown', { key: 'Enter', bubbles: true, cancelable: true }));
      return (document.activeElement as HTMLInputElement | null)?.labels?.[0]?.textContent;
    });
    expect(movedAtOnce).toBe('Height');
    await width.focus();
    await width.press('Enter');
    await expect.poll(() => page.getByLabel('Height').evaluate((el) => el === document.activeElement)).toBe(true);
    expect(await page.getByText('Type the height').count()).toBe(0); // Next did not try to record half a measurement
    await page.keyboard.type('9 1/2');
    await page.keyboard.press('Enter');
    // 9½″ against the swap's 9½″ ± ⅛″ (3 × 3″ finished + ½″ seams, common practice, no source).
    await page.getByText('True to size').first().waitFor();
    await page.close();
  });

  it('reads bare numbers as millimetres for a person who works in millimetres', async () => {
    await agent.patch('/api/me').send({ units: 'mm' }).expect(200);
    const page = await openCard();
    const width = page.getByLabel('Width');
    expect(await width.getAttribute('inputmode')).toBe('decimal');
    expect(await page.locator('[id$="-unit"]', { hasText: 'mm' }).count()).toBeGreaterThanOrEqual(2);
    // 9½″ is 241.3 mm (1 in = 25.4 mm exactly, NIST SP 811, Appendix B.8).
    await width.fill('241.3');
    await width.press('Enter');
    await page.keyboard.type('241.3');
    await page.keyboard.press('Enter');
    await page.getByText('True to size').first().waitFor();
    await page.close();
  });
});

describe('A guild that works in millimetres', () => {
  it('starts its members in millimetres until they choose a unit of their own, and lets its admin switch it', async () => {
    const agent = supertest.agent(server.url).set('X-Requested-With', 'blockpost');
    const email = uniqueEmail('mm-guild');
    await insertConfirmedAccount(server.deps.pool, { email, displayName: 'Henrietta Voss' });
    await signInAgent(agent, email);
    const guildId = (await agent.post('/api/guilds').send({ name: 'Ashgrove Metric Quilters' }).expect(201)).body.id as number;
    const context = await launchBrowser({ viewport: { width: 360, height: 740 } });
    const page = await context.newPage();
    await page.goto(`${server.url}/sign-in?next=${encodeURIComponent(`/guilds/${guildId}/about`)}`);
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill(PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('heading', { name: 'Lengths in this guild' }).waitFor();
    await page.getByRole('radio', { name: /Millimetres/ }).check();
    await page.getByText('Saved.').waitFor();

    await page.goto(`${server.url}/planner`);
    expect(await page.getByRole('radio', { name: 'Millimetres' }).isChecked()).toBe(true);
    expect(await page.getByLabel('Usable width of fabric (WOF)').inputValue()).toBe('1066.8'); // 42″ (NIST SP 811: 25.4 mm to the inch)

    // Setting up a swap: a bare 216 for a column is 216 mm, and the swap is saved as 8.5039…″ (216 / 25.4).
    await page.goto(`${server.url}/guilds/${guildId}/swaps/new`);
    await page.getByLabel('Title').fill('Ashgrove metric nine-patch');
    await page.getByRole('button', { name: 'Next' }).click();
    expect(await page.getByLabel('Column 1').inputValue()).toBe('88.9'); // 3½″
    expect(await page.locator('[id$="-unit"]', { hasText: 'mm' }).count()).toBeGreaterThanOrEqual(8);
    // 3 × 88.9 mm cut less 2 seams of 2 × 6.35 mm: 241.3 mm (Σ cuts − 2 × SA × seams, common practice, no source).
    await page.getByText('241.3 mm × 241.3 mm').first().waitFor();
    await page.getByLabel('Column 1').fill('216');
    await page.getByText('368.4 mm × 241.3 mm').first().waitFor(); // 216 + 2 × 88.9 − 4 × 6.35
    for (let i = 0; i < 3; i++) await page.getByRole('button', { name: 'Next' }).click();
    await page.getByRole('button', { name: 'Save as draft' }).click();
    await page.waitForURL(/\/swaps\/\d+$/);
    const swapId = Number(new URL(page.url()).pathname.split('/').pop());
    const saved = (await agent.get(`/api/swaps/${swapId}`).expect(200)).body;
    expect(saved.block.columns[0]).toBeCloseTo(216 / 25.4, 9);
    expect(saved.block.columns[1]).toBe(3.5);
    expect([saved.block.seam, saved.tolerance]).toEqual([0.25, 0.125]);

    // Saving Settings without touching the unit keeps following the guild; choosing one wins over the guild's.
    await page.goto(`${server.url}/settings`);
    const unit = page.getByLabel('Show lengths in');
    expect(await unit.inputValue()).toBe('');
    await page.getByRole('button', { name: 'Save', exact: true }).click();
    await page.getByText('Saved.').waitFor();
    expect((await agent.get('/api/me').expect(200)).body.user.unitsChosen).toBe(false);
    await unit.selectOption('in');
    await page.getByRole('button', { name: 'Save', exact: true }).click();
    await expect.poll(async () => (await agent.get('/api/me').expect(200)).body.user.unitsChosen).toBe(true);
    await page.goto(`${server.url}/planner`);
    expect(await page.getByRole('radio', { name: 'Inches' }).isChecked()).toBe(true);
    await context.close();
  });
});

describe('The menu on a phone', () => {
  it('opens and closes from the keyboard, names its state, and closes when a link is followed', async () => {
    await freshPlanner();
    const menu = page.getByRole('button', { name: 'Menu' });
    expect(await menu.getAttribute('aria-expanded')).toBe('false');
    expect(await page.getByRole('link', { name: 'Settings' }).isVisible()).toBe(false);
    await menu.focus();
    await page.keyboard.press('Enter');
    expect(await menu.getAttribute('aria-expanded')).toBe('true');
    await page.getByRole('link', { name: 'Settings' }).waitFor();
    await page.keyboard.press('Tab');
    await page.keyboard.press('Escape');
    expect(await menu.getAttribute('aria-expanded')).toBe('false');
    expect(await menu.evaluate((el) => el === document.activeElement)).toBe(true);

    await menu.click();
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Settings' }).click();
    await page.getByRole('heading', { name: 'Settings' }).waitFor();
    expect(await page.getByRole('button', { name: 'Menu' }).getAttribute('aria-expanded')).toBe('false');
  });
});
