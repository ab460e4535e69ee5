/**
 * Swap pages follow the swap's live changes like the board does: a block measured in another
 * session shows on the coordinator's open Roster page and on the maker's swap overview without a reload.
 */
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { BrowserContext } from 'playwright-core';
import { launchBrowser, pageWithSession } from '../helpers/browser';
import { startE2eServer } from '../helpers/e2e-server';
import type { RunningServer } from '../../server/index';
import { liveGuild } from '../live/live-helpers';
import { collectingSwap } from '../live/swap-setup';

let server: RunningServer;
let browser: BrowserContext;

beforeAll(async () => {
  server = await startE2eServer();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

it('updates the open Roster page when another session measures a block', async () => {
  const g = await liveGuild(server.url);
  const { swapId, blockIds } = await collectingSwap(g.coordinator, g.guildId, [g.member, g.coordinator]);
  const blockId = blockIds.get(g.member.id)![0]!;

  const page = await pageWithSession(browser, g.coordinator.cookie, server.url);
  const rosterFetches: string[] = [];
  page.on('request', (r) => {
    if (new URL(r.url()).pathname === `/api/swaps/${swapId}/roster`) rosterFetches.push(r.url());
  });
  await page.goto(`${server.url}/guilds/${g.guildId}/swaps/${swapId}/roster`);
  const stat = (label: string) => page.locator('dt', { hasText: label }).first().locator('xpath=following-sibling::dd');
  await expect.poll(() => stat('Measured').textContent()).toBe('0');
  await expect.poll(() => stat('Received').textContent()).toBe('0');
  // Joining the swap's live room fetches the roster once more (a change may have slipped in meanwhile).
  await expect.poll(() => rosterFetches.length).toBe(2);
  // A reload would lose this mark.
  await page.evaluate(() => ((window as unknown as { stayedOpen: boolean }).stayedOpen = true));

  // The admin, signed in elsewhere, takes the block in and measures it through the API.
  expect((await g.admin.api('POST', `/blocks/${blockId}/received`, {})).status).toBe(200);
  expect((await g.admin.api('POST', `/blocks/${blockId}/measurements`, { width: '9 1/2', height: '9 1/2' })).status).toBe(201);

  await expect.poll(() => stat('Measured').textContent(), { timeout: 5000 }).toBe('1');
  expect(await stat('Accepted').textContent()).toBe('1');
  const memberRow = page.getByRole('row').filter({ hasText: 'Milo Member' });
  await memberRow.getByText('True to size').first().waitFor({ timeout: 5000 });
  expect(await page.evaluate(() => (window as unknown as { stayedOpen?: boolean }).stayedOpen)).toBe(true);
  // The rows came with the live changes themselves: the roster was not fetched again.
  expect(rosterFetches).toHaveLength(2);
});

it('shows the maker, on the swap overview, the verdict on their block as the coordinator gives it', async () => {
  const g = await liveGuild(server.url);
  const { swapId, blockIds } = await collectingSwap(g.coordinator, g.guildId, [g.member], 1);
  const blockId = blockIds.get(g.member.id)![0]!;

  const page = await pageWithSession(browser, g.member.cookie, server.url);
  const blockFetches: string[] = [];
  page.on('request', (r) => {
    if (new URL(r.url()).pathname === `/api/swaps/${swapId}/blocks`) blockFetches.push(r.url());
  });
  await page.goto(`${server.url}/guilds/${g.guildId}/swaps/${swapId}`);
  await page.getByText('Not measured yet').first().waitFor();
  await page.evaluate(() => ((window as unknown as { stayedOpen: boolean }).stayedOpen = true));
  const before = blockFetches.length;

  expect((await g.coordinator.api('POST', `/blocks/${blockId}/received`, {})).status).toBe(200);
  expect((await g.coordinator.api('POST', `/blocks/${blockId}/measurements`, { width: '9', height: '9 1/2' })).status).toBe(201);

  await page.getByText('Runs short').first().waitFor({ timeout: 5000 });
  expect(blockFetches.length).toBeGreaterThan(before);
  expect(await page.evaluate(() => (window as unknown as { stayedOpen?: boolean }).stayedOpen)).toBe(true);
});
