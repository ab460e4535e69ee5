/**
 * Running a swap without fear, in Chromium: a member hands in both blocks with one tap and can undo it;
 * the coordinator's big step shows what it will do and what is unusual before anything happens; an
 * off-size block is accepted with a reason; the confirmed return lists each recipient's bundle with
 * its label codes and tick boxes. Phone-sized (360 px) and laptop-sized screens.
 */
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { launchBrowser, pageWithSession } from '../helpers/browser';
import { startE2eServer } from '../helpers/e2e-server';
import type { RunningServer } from '../../server/index';
import { liveGuild, type Person } from '../live/live-helpers';
import { moveSwap, receiveAndMeasure, swapBody } from '../live/swap-setup';

let server: RunningServer;
let phone: BrowserContext;
let laptop: BrowserContext;
const shots = process.env.SCREENSHOT_DIR;

const signedInPage = (context: BrowserContext, person: Person): Promise<Page> =>
  pageWithSession(context, person.cookie, server.url);
const shot = async (page: Page, name: string) => {
  if (shots) await page.screenshot({ path: `${shots}/${name}.png`, fullPage: true });
};

beforeAll(async () => {
  server = await startE2eServer();
  phone = await launchBrowser({ viewport: { width: 360, height: 780 } });
  laptop = await launchBrowser();
});
afterAll(async () => {
  await phone?.close();
  await laptop?.close();
  await server?.close();
});

it('hands in several blocks at once, asks before big steps, accepts with a reason and prints bundles', async () => {
  const g = await liveGuild(server.url);
  const created = await g.coordinator.api('POST', `/guilds/${g.guildId}/swaps`, swapBody('Kestrel Hollow Star'));
  const swapId = (created.body as { id: number }).id;
  await moveSwap(g.coordinator, swapId, 'signup');
  await g.member.api('POST', `/swaps/${swapId}/signups`, { blocks: 2 });
  await g.coordinator.api('POST', `/swaps/${swapId}/signups`, { blocks: 2 });
  await moveSwap(g.coordinator, swapId, 'sewing');
  const swapUrl = `${server.url}/guilds/${g.guildId}/swaps/${swapId}`;

  // The member, on a phone, hands in both blocks with one tap, then undoes it.
  const member = await signedInPage(phone, g.member);
  await member.goto(swapUrl);
  const several = member.getByRole('region', { name: 'Hand in several blocks at once' });
  await several.getByRole('button', { name: 'Hand in 2 blocks' }).click();
  await several.getByText('2 blocks handed in.').waitFor();
  await shot(member, 'hand-in-several-360');
  await several.getByRole('button', { name: 'Undo' }).click();
  await several.getByRole('button', { name: 'Hand in 2 blocks' }).waitFor();
  const states = await g.member.api('GET', `/swaps/${swapId}/blocks?maker=me`);
  expect((states.body as { state: string }[]).map((b) => b.state)).toEqual(['pledged', 'pledged']);
  await several.getByRole('button', { name: 'Hand in 2 blocks' }).click();
  await several.getByText('2 blocks handed in.').waitFor();

  // The coordinator moves on to collecting; the dialog says nobody is e-mailed and what is still owed.
  const desk = await signedInPage(laptop, g.coordinator);
  await desk.goto(swapUrl);
  await desk.getByRole('button', { name: 'Start collecting blocks' }).click();
  const dialog = desk.getByRole('dialog', { name: 'Start collecting blocks?' });
  await dialog.getByText('Nobody is e-mailed.').waitFor();
  await dialog.getByText('2 pledged blocks are still owed by makers.').waitFor();
  await shot(desk, 'move-dialog-desktop');
  await dialog.getByRole('button', { name: 'Start collecting blocks' }).click();
  await dialog.waitFor({ state: 'hidden' });
  await desk.getByText('Collecting', { exact: true }).first().waitFor();

  // Measured: the member's two blocks are fine, one of the coordinator's runs short.
  const mine = (await g.member.api('GET', `/swaps/${swapId}/blocks?maker=me`)).body as { id: number }[];
  const theirs = (await g.coordinator.api('GET', `/swaps/${swapId}/blocks?maker=me`)).body as { id: number }[];
  for (const b of [...mine, theirs[0]!]) await receiveAndMeasure(g.coordinator, b.id);
  await receiveAndMeasure(g.coordinator, theirs[1]!.id, '9 1/4', '9 1/2');

  // Start sorting: before the due date, so the dialog warns; the step is taken only on confirming.
  await desk.reload();
  await desk.getByRole('button', { name: 'Start sorting' }).click();
  const sorting = desk.getByRole('dialog', { name: 'Start sorting?' });
  await sorting.getByText(/Blocks are not due until .* \(in 40 days\)/).waitFor();
  await sorting.getByRole('button', { name: 'Go back' }).click();
  expect(((await g.coordinator.api('GET', `/swaps/${swapId}`)).body as { state: string }).state).toBe('collecting');

  // The short block is accepted with a reason from the roster.
  await desk.goto(`${swapUrl}/roster`);
  await desk.getByRole('button', { name: `Blocks of ${g.coordinator.displayName}` }).click();
  await desk.getByRole('button', { name: /Accept anyway/ }).click();
  await desk.getByLabel('Why it is accepted').fill('Only a quarter inch short; the sashing hides it');
  await desk.getByRole('button', { name: /Accept block 2/ }).click();
  await desk.getByText('Accepted by decision', { exact: false }).first().waitFor();
  await desk.getByRole('button', { name: /^Undo/ }).waitFor();
  await shot(desk, 'roster-accept-desktop');

  await moveSwap(g.coordinator, swapId, 'sorting');
  const plan = (await g.coordinator.api('POST', `/swaps/${swapId}/distribution/plan`)).body as {
    transfers: { from: number; to: number; count: number }[];
  };
  expect(plan.transfers.reduce((s, t) => s + t.count, 0)).toBe(4);
  await g.coordinator.api('POST', `/swaps/${swapId}/distribution/confirm`, {
    transfers: plan.transfers.map(({ from, to, count }) => ({ from, to, count })),
  });

  // Hand-out night: bundles by recipient, each block's label code and a tick box.
  const night = await signedInPage(phone, g.coordinator);
  await night.goto(`${swapUrl}/return`);
  const bundle = night.getByRole('region', { name: `Bundle for ${g.member.displayName}` });
  await bundle.getByText(`For ${g.member.displayName}: 2 blocks`).waitFor();
  const boxes = bundle.getByRole('checkbox');
  expect(await boxes.count()).toBe(2);
  await boxes.first().check();
  expect(await bundle.textContent()).toMatch(/[2-9A-HJ-NP-Z]{8}/);
  await shot(night, 'bundles-360');
  const wide = await signedInPage(laptop, g.coordinator);
  await wide.goto(`${swapUrl}/return`);
  await wide.getByRole('region', { name: `Bundle for ${g.coordinator.displayName}` }).waitFor();
  await shot(wide, 'bundles-desktop');
});

it('picks the guild time zone from a searchable list and keeps what was typed when it is refused', async () => {
  const g = await liveGuild(server.url);
  for (const [context, name] of [
    [phone, 'time-zone-360'],
    [laptop, 'time-zone-desktop'],
  ] as const) {
    const page = await signedInPage(context, g.admin);
    await page.goto(`${server.url}/guilds/${g.guildId}/about`);
    const card = page
      .getByRole('region', { name: 'Time zone' })
      .or(page.locator('section', { hasText: 'Save the time zone' }))
      .first();
    const field = card.getByLabel('Time zone');
    const listId = await field.getAttribute('list');
    // The browser's own list of IANA zones backs the box, so typing narrows it.
    expect(await page.locator(`datalist[id="${listId}"] option[value="America/Chicago"]`).count()).toBe(1);
    await field.fill('Mars/Olympus_Mons');
    await card.getByRole('button', { name: 'Save the time zone' }).click();
    await card.getByText('Choose a time zone such as America/Chicago.').waitFor();
    expect(await field.inputValue()).toBe('Mars/Olympus_Mons');
    await field.fill('America/Chicago');
    await card.getByRole('button', { name: 'Save the time zone' }).click();
    await card.getByText('Saved: dates now show in America/Chicago.').waitFor();
    await shot(page, name);
    await g.admin.api('PATCH', `/guilds/${g.guildId}`, { timeZone: 'UTC' });
  }
  const guild = await g.admin.api<{ timeZone: string }>('GET', `/guilds/${g.guildId}`);
  expect(guild.body.timeZone).toBe('UTC');
});

it('undoes a measurement and a block taken in by mistake at intake, with the keyboard', async () => {
  const g = await liveGuild(server.url);
  const created = await g.coordinator.api('POST', `/guilds/${g.guildId}/swaps`, swapBody('Kestrel Hollow Pinwheel'));
  const swapId = (created.body as { id: number }).id;
  await moveSwap(g.coordinator, swapId, 'signup');
  await g.member.api('POST', `/swaps/${swapId}/signups`, { blocks: 1 });
  await moveSwap(g.coordinator, swapId, 'sewing');
  await moveSwap(g.coordinator, swapId, 'collecting');
  const [block] = (await g.member.api('GET', `/swaps/${swapId}/blocks?maker=me`)).body as { id: number }[];
  const labels = (await g.coordinator.api('GET', `/swaps/${swapId}/labels?maker=all`)).body as {
    labels: { blockId: number; shortCode: string }[];
  };
  const code = labels.labels.find((l) => l.blockId === block!.id)!.shortCode;

  const page = await signedInPage(laptop, g.coordinator);
  await page.goto(`${server.url}/guilds/${g.guildId}/swaps/${swapId}/intake`);
  await page.getByLabel('Short code from the label').fill(code);
  await page.keyboard.press('Enter');
  await page.getByLabel('Width').waitFor();
  await page.keyboard.type('9 1/2');
  await page.keyboard.press('Tab');
  await page.keyboard.type('9');
  await page.keyboard.press('Enter');
  await page.getByText('Confirmed by Blockpost').waitFor();

  const undoMeasure = page.getByRole('button', { name: 'Undo this measurement' });
  await undoMeasure.focus();
  await page.keyboard.press('Enter');
  await page.getByText(/The measurement is withdrawn/).waitFor();
  const measurements = (await g.coordinator.api('GET', `/blocks/${block!.id}/measurements`)).body as {
    withdrawnAt: string | null;
  }[];
  expect(measurements.map((m) => m.withdrawnAt !== null)).toEqual([true]);
  await page.getByRole('button', { name: 'Undo taking this block in too' }).focus();
  await page.keyboard.press('Enter');
  await page.getByText(/is no longer taken in/).waitFor();
  await shot(page, 'intake-undo-desktop');
  const after = (await g.coordinator.api('GET', `/blocks/${block!.id}`)).body as { state: string };
  expect(after.state).toBe('pledged');
});

it('says which size a unit asks for and shows finished and unfinished as you type', async () => {
  const g = await liveGuild(server.url);
  const page = await signedInPage(phone, g.coordinator);
  await page.goto(`${server.url}/guilds/${g.guildId}/swaps/new`);
  await page.getByLabel('Title').fill('Kestrel Hollow Triangles');
  await page.getByRole('button', { name: 'Next' }).click();
  await page.getByLabel('Kind of block').selectOption('hst');
  await page.getByLabel('Finished size of the unit (sewn into the quilt)').fill('3');
  // HST finished 3″ → unfinished 3½″ with ¼″ seams (finished + 2 × seam allowance; common practice, no source).
  await page.getByText('As typed: finished 3″ × 3″; unfinished 3½″ × 3½″ (cut edge to cut edge, what you measure).').waitFor();
  await shot(page, 'setup-unit-360');
});
