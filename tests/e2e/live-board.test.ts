import { afterAll, beforeAll, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { launchBrowser, pageWithSession } from '../helpers/browser';
import { startE2eServer } from '../helpers/e2e-server';
import type { RunningServer } from '../../server/index';
import { liveGuild, type Person } from '../live/live-helpers';
import { collectingSwap } from '../live/swap-setup';

let server: RunningServer;
let watcher: BrowserContext;
let officer: BrowserContext;

const signedInPage = (context: BrowserContext, person: Person): Promise<Page> =>
  pageWithSession(context, person.cookie, server.url);

beforeAll(async () => {
  server = await startE2eServer();
  watcher = await launchBrowser({ viewport: { width: 390, height: 844 } }); // a member on a phone
  officer = await launchBrowser();
});
afterAll(async () => {
  await watcher?.close();
  await officer?.close();
  await server?.close();
});

it('shows a measurement made in another browser on the board without a reload', async () => {
  const g = await liveGuild(server.url);
  const { swapId, blockIds } = await collectingSwap(g.coordinator, g.guildId, [g.member, g.coordinator]);
  const blockId = blockIds.get(g.member.id)![0]!;

  const board = await signedInPage(watcher, g.member);
  await board.goto(`${server.url}/guilds/${g.guildId}/swaps/${swapId}/board`);
  await board.getByText('Live: changes appear by themselves.').waitFor();
  const measured = board.locator('dt', { hasText: 'Measured' }).first().locator('xpath=following-sibling::dd');
  await expect.poll(() => measured.textContent()).toBe('0');
  await board.evaluate(() => ((window as unknown as { stayedOpen: boolean }).stayedOpen = true));

  // The coordinator, in their own browser, receives and measures the block through the API.
  const desk = await signedInPage(officer, g.coordinator);
  await desk.goto(`${server.url}/guilds/${g.guildId}/swaps/${swapId}/board`);
  const status = await desk.evaluate(async (id) => {
    const post = (path: string, body: unknown) =>
      fetch(`/api/blocks/${id}/${path}`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', 'x-requested-with': 'blockpost' },
        body: JSON.stringify(body),
      }).then((r) => r.status);
    return [await post('received', {}), await post('measurements', { width: '9 1/2', height: '9 1/2' })];
  }, blockId);
  expect(status).toEqual([200, 201]);

  await expect.poll(() => measured.textContent(), { timeout: 5000 }).toBe('1');
  await board.getByText(/measured Milo Member’s block 1/).waitFor();
  await board.getByRole('listitem').filter({ hasText: 'Milo Member' }).getByText('True to size').first().waitFor();
  expect(await board.evaluate(() => (window as unknown as { stayedOpen?: boolean }).stayedOpen)).toBe(true);
  // The officer's own board followed too, and both see each other viewing.
  await desk.getByText(/Viewing now: .*Milo Member/).waitFor();
});
