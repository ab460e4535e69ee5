/**
 * Every page, signed out and as each role: no serious or critical axe-core violations, and no
 * Content-Security-Policy errors in the console (the app must work under its own CSP).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { launchBrowser } from '../helpers/browser';
import { startE2eServer } from '../helpers/e2e-server';
import { seriousViolations } from '../helpers/axe';
import type { RunningServer } from '../../server/index';
import { seedDemoIfEmpty, DEMO_SIGN_INS } from '../../server/seed/demo';

let server: RunningServer;
let browser: BrowserContext;
let guildId: number;
let swapId: number;
let sewDayId: number;

beforeAll(async () => {
  server = await startE2eServer();
  const demo = await seedDemoIfEmpty(server.deps.sequelize, { ...server.deps.config, NODE_ENV: 'development' });
  guildId = demo!.guild.id;
  const [swaps] = await server.deps.sequelize.query(`SELECT id FROM swaps WHERE state = 'collecting' LIMIT 1`);
  const [days] = await server.deps.sequelize.query(`SELECT id FROM sew_days ORDER BY starts_at LIMIT 1`);
  swapId = (swaps[0] as { id: number }).id;
  sewDayId = (days[0] as { id: number }).id;
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

/** Visits a page, waits for it to settle, and returns its axe findings and CSP console errors. */
async function audit(page: Page, path: string) {
  const cspErrors: string[] = [];
  const onConsole = (m: { type(): string; text(): string }) => {
    if (m.type() === 'error' && /Content.Security.Policy|Refused to/i.test(m.text())) cspErrors.push(m.text());
  };
  page.on('console', onConsole);
  await page.goto(`${server.url}${path}`);
  await page.waitForLoadState('networkidle');
  await page.locator('main h1, main h2').first().waitFor();
  const violations = await seriousViolations(page);
  page.off('console', onConsole);
  return { violations, cspErrors };
}

async function signIn(page: Page, email: string) {
  await page.goto(`${server.url}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(DEMO_SIGN_INS.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL('**/guilds');
}

const signedOutPages = [
  '/',
  '/sign-in',
  '/register',
  '/forgot-password',
  '/reset-password?token=not-a-real-token-but-long-enough',
];
const memberPages = () => {
  const swap = `/guilds/${guildId}/swaps/${swapId}`;
  return [
    '/guilds',
    `/guilds/${guildId}`,
    `/guilds/${guildId}/about`,
    `/guilds/${guildId}/members`,
    '/planner',
    '/settings',
    '/settings/email',
    swap,
    `${swap}/roster`,
    `${swap}/board`,
    `${swap}/chat`,
    `${swap}/sheet`,
    `/guilds/${guildId}/sew-days`,
    `/guilds/${guildId}/sew-days/${sewDayId}`,
  ];
};
const officerPages: Record<string, () => string[]> = {
  'member@demo.test': () => [],
  'coordinator@demo.test': () => [
    `/guilds/${guildId}/swaps/new`,
    `/guilds/${guildId}/swaps/${swapId}/return`,
    `/guilds/${guildId}/swaps/${swapId}/intake`,
    `/guilds/${guildId}/sew-days/new`,
  ],
  'admin@demo.test': () => [`/guilds/${guildId}/mail`],
};

describe('signed out', () => {
  for (const path of signedOutPages) {
    it(`${path} has no serious accessibility problems or CSP errors`, async () => {
      const page = await browser.newPage();
      const { violations, cspErrors } = await audit(page, path);
      expect(violations, JSON.stringify(violations, null, 2)).toEqual([]);
      expect(cspErrors).toEqual([]);
      await page.close();
    });
  }
});

for (const who of ['member@demo.test', 'coordinator@demo.test', 'admin@demo.test']) {
  describe(who, () => {
    it('every page passes axe and runs under the CSP', async () => {
      const page = await browser.newPage();
      await browser.clearCookies();
      await signIn(page, who);
      const problems: Record<string, unknown> = {};
      for (const path of [...memberPages(), ...officerPages[who]!()]) {
        const { violations, cspErrors } = await audit(page, path);
        if (violations.length || cspErrors.length) problems[path] = { violations, cspErrors };
      }
      expect(problems).toEqual({});
      await page.close();
    });
  });
}

it('can be walked through by keyboard alone: sign in with Tab and Enter', async () => {
  const page = await browser.newPage();
  await browser.clearCookies();
  await page.goto(`${server.url}/sign-in`);
  await page.getByLabel('E-mail').focus();
  await page.keyboard.type('member@demo.test');
  await page.keyboard.press('Tab');
  await page.keyboard.type(DEMO_SIGN_INS.password);
  await page.keyboard.press('Enter');
  await page.waitForURL('**/guilds');
  await page.getByRole('heading', { name: 'Your guilds' }).waitFor();
  await page.getByRole('link', { name: /^Kestrel Hollow Quilters/ }).waitFor(); // the list loads after the heading
  // Focus moved to the new page's content, so the next Tab reaches the page (what is next, then the guilds), not the header.
  expect(await page.evaluate(() => document.activeElement?.id)).toBe('main');
  await page.keyboard.press('Tab');
  expect(await page.evaluate(() => Boolean(document.activeElement?.closest('main')))).toBe(true);
  for (
    let i = 0;
    i < 40 && !/^Kestrel Hollow Quilters/.test((await page.evaluate(() => document.activeElement?.textContent)) ?? '');
    i++
  ) {
    await page.keyboard.press('Tab');
  }
  expect(await page.evaluate(() => document.activeElement?.textContent)).toMatch(/^Kestrel Hollow Quilters/);
  await page.keyboard.press('Enter');
  await page.getByRole('heading', { name: 'Kestrel Hollow Quilters' }).waitFor();
});

it('lets a member sign up for a swap with the keyboard alone', async () => {
  const [rows] = await server.deps.sequelize.query(
    `SELECT s.id AS swap_id, u.email FROM swaps s JOIN memberships m ON m.guild_id = s.guild_id AND m.role = 'member' JOIN users u ON u.id = m.user_id
      WHERE s.state = 'signup' AND NOT EXISTS (SELECT 1 FROM signups x WHERE x.swap_id = s.id AND x.user_id = u.id) ORDER BY u.id LIMIT 1`,
  );
  const { swap_id: signupSwap, email } = rows[0] as { swap_id: number; email: string };
  const page = await browser.newPage();
  await browser.clearCookies();
  await page.goto(`${server.url}/sign-in`);
  await page.getByLabel('E-mail').focus();
  await page.keyboard.type(email);
  await page.keyboard.press('Tab');
  await page.keyboard.type(DEMO_SIGN_INS.password);
  await page.keyboard.press('Enter');
  await page.waitForURL('**/guilds');
  await page.goto(`${server.url}/guilds/${guildId}/swaps/${signupSwap}`);
  await page.getByLabel('Blocks I will make').waitFor();
  // Tab from the top of the page until the pledge field has focus, as a keyboard user would.
  let reached = false;
  for (let i = 0; i < 120 && !reached; i++) {
    await page.keyboard.press('Tab');
    reached = await page.getByLabel('Blocks I will make').evaluate((el) => el === document.activeElement);
  }
  expect(reached).toBe(true);
  await page.keyboard.press('Control+A');
  await page.keyboard.type('4');
  await page.keyboard.press('Enter');
  await page.getByRole('heading', { name: 'Cutting plan for your 4 blocks' }).waitFor();
});
