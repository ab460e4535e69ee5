/**
 * Paying a swap fee in Chromium, against the local payments fake: a member on a phone opens the
 * hosted page, declines once (nothing is marked paid), pays, and comes back to a page that waits for
 * the service's webhook; the treasurer's view and CSV agree; cancelling the swap refunds the fee.
 */
import { mkdirSync } from 'node:fs';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { inject } from 'vitest';
import supertest from 'supertest';
import Stripe from 'stripe';
import type { BrowserContext, Page } from 'playwright-core';
import { launchBrowser } from '../helpers/browser';
import { startE2eServer } from '../helpers/e2e-server';
import { insertConfirmedAccount, PASSWORD, signIn as signInAgent, uniqueEmail } from '../helpers/factories';
import { paymentsOverrides } from '../helpers/payments';
import { freePort } from '../../scripts/lib/ports';
import type { RunningServer } from '../../server/index';

let server: RunningServer;
let phone: BrowserContext;
let desk: BrowserContext;
type Person = { agent: ReturnType<typeof supertest.agent>; email: string; id: number };
let admin: Person;
let coordinator: Person;
let member: Person;
let guildId: number;
let swapId: number;
const shots = process.env.SCREENSHOT_DIR;

async function register(displayName: string): Promise<Person> {
  const agent = supertest.agent(server.url).set('X-Requested-With', 'blockpost');
  const email = uniqueEmail('pay');
  const id = await insertConfirmedAccount(server.deps.pool, { email, displayName });
  await signInAgent(agent, email);
  return { agent, email, id };
}

async function signIn(page: Page, email: string) {
  await page.goto(`${server.url}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

async function shot(page: Page, name: string) {
  if (!shots) return;
  mkdirSync(shots, { recursive: true });
  await page.screenshot({ path: `${shots}/${name}.png`, fullPage: true });
}

beforeAll(async () => {
  const port = await freePort();
  const sdk = new Stripe('sk_test_blockpost', { host: '127.0.0.1', port: inject('paymentsPort'), protocol: 'http' });
  const endpoint = await sdk.webhookEndpoints.create({
    url: `http://127.0.0.1:${port}/api/payments/webhook`,
    enabled_events: ['*'],
  });
  server = await startE2eServer({
    PORT: String(port),
    PUBLIC_URL: `http://127.0.0.1:${port}`,
    ...paymentsOverrides(endpoint.secret!),
  });
  admin = await register('Marguerite Abernathy');
  guildId = (
    await admin.agent.post('/api/guilds').send({ name: 'Tollgate Lane Piecers', timeZone: 'America/Denver' }).expect(201)
  ).body.id;
  const { Membership } = await import('../../server/db/models');
  coordinator = await register('Ines Whitlock');
  member = await register('Dorothea Pike');
  await Membership.create({ guildId, userId: coordinator.id, role: 'coordinator' });
  await Membership.create({ guildId, userId: member.id, role: 'member' });
  const DAY = 86_400_000;
  const swap = await coordinator.agent
    .post(`/api/guilds/${guildId}/swaps`)
    .send({
      title: 'Weathervane Stars',
      block: { kind: 'grid', columns: [3.5, 3.5, 3.5], rows: [3.5, 3.5, 3.5], seam: 0.25 },
      quota: { min: 1, max: 4 },
      signupClosesAt: new Date(Date.now() + 10 * DAY).toISOString(),
      dueAt: new Date(Date.now() + 40 * DAY).toISOString(),
      fees: { entry: 600 },
    })
    .expect(201);
  swapId = swap.body.id;
  await coordinator.agent.post(`/api/swaps/${swapId}/transitions`).send({ to: 'signup' }).expect(200);
  await member.agent.post(`/api/swaps/${swapId}/signups`).send({ blocks: 2 }).expect(200);
  phone = await launchBrowser({ viewport: { width: 390, height: 844 } });
  desk = await launchBrowser();
});

afterAll(async () => {
  await phone?.close();
  await desk?.close();
  await server?.close();
});

it('a declined payment stays unpaid; a paid one is confirmed by the webhook and agrees everywhere; cancelling refunds it', async () => {
  const page = await phone.newPage();
  await signIn(page, member.email);
  await page.goto(`${server.url}/guilds/${guildId}/swaps/${swapId}`);
  await page.getByRole('link', { name: 'Fees' }).click();
  await expect.poll(() => page.getByText('Not paid yet').count()).toBeGreaterThan(0);
  await expect.poll(() => page.getByText('Test payments only').count()).toBe(1);
  await shot(page, 'payments-1-fees-owed');

  // Decline on the hosted page: nothing paid.
  await page.getByRole('button', { name: 'Pay $6.00 online' }).click();
  await page.waitForURL(/\/checkout\/cs_test_/);
  await expect.poll(() => page.getByText('No money moves').count()).toBeGreaterThan(0);
  await shot(page, 'payments-2-fake-checkout');
  await page.getByRole('button', { name: 'Decline' }).click();
  await page.getByText('The test payment was declined.').waitFor();
  await page.getByRole('link', { name: 'Back without paying' }).click();
  await page.getByText('No payment made').waitFor();
  await page.getByRole('link', { name: 'Back to where you were' }).click();
  await page.getByText('Did not go through').first().waitFor();
  await shot(page, 'payments-3-declined');

  // Pay: the return page waits for the confirmation, then says paid.
  await page.getByRole('button', { name: 'Pay $6.00 online' }).click();
  await page.waitForURL(/\/checkout\/cs_test_/);
  await page.getByRole('button', { name: 'Pay', exact: true }).click();
  await page.waitForURL(/\/payments\/return\?session_id=/);
  await page.getByText('$6.00 paid. Thank you.').waitFor({ timeout: 15_000 });
  await shot(page, 'payments-4-return-paid');
  await page.getByRole('link', { name: 'Back to where you were' }).click();
  await page
    .getByText(/^\W*Paid$/)
    .first()
    .waitFor();
  expect(await page.getByRole('button', { name: /Pay .* online/ }).count()).toBe(0);
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
  expect(overflow).toBeLessThanOrEqual(0);

  // The treasurer's view and the CSV say the same.
  const treasurer = await desk.newPage();
  await signIn(treasurer, admin.email);
  await treasurer.goto(`${server.url}/guilds/${guildId}/payments`);
  await treasurer.getByText('Dorothea Pike · $6.00').first().waitFor();
  const row = treasurer.locator('li', { hasText: 'Dorothea Pike · $6.00' }).filter({ hasText: 'Paid' });
  expect(await row.count()).toBe(1);
  // The declined try is kept, marked as not gone through.
  expect(
    await treasurer.locator('li', { hasText: 'Dorothea Pike · $6.00' }).filter({ hasText: 'Did not go through' }).count(),
  ).toBe(1);
  await treasurer.getByText('Weathervane Stars: $6.00 paid').waitFor();
  await shot(treasurer, 'payments-5-treasurer');
  const csv = await admin.agent.get(`/api/guilds/${guildId}/payments?format=csv&status=paid`).expect(200);
  const lines = csv.text.trim().split('\r\n');
  expect(lines).toHaveLength(2);
  expect(lines[1]).toContain('Dorothea Pike');
  expect(lines[1]).toContain('6.00');
  expect(lines[1]).toContain('Weathervane Stars');

  // The coordinator sees who has paid beside the roster.
  const coordinatorDesk = await launchBrowser();
  const coord = await coordinatorDesk.newPage();
  await signIn(coord, coordinator.email);
  await coord.goto(`${server.url}/guilds/${guildId}/swaps/${swapId}/roster`);
  await coord.getByRole('heading', { name: 'Who has paid' }).waitFor();
  await expect.poll(() => coord.getByText('1 of 1 paid', { exact: false }).count()).toBe(1);
  await shot(coord, 'payments-7-roster-who-paid');
  await coordinatorDesk.close();

  // Cancelling the swap refunds the fee; the member's payments list says so.
  await coordinator.agent.post(`/api/swaps/${swapId}/transitions`).send({ to: 'cancelled' }).expect(200);
  await page.goto(`${server.url}/settings/payments`);
  await page
    .getByText(/^\W*Refunded$/)
    .first()
    .waitFor({ timeout: 15_000 });
  await shot(page, 'payments-6-refunded');
});
