/**
 * Script injection through every text a person can type (names, guild and swap texts, colour notes,
 * sew-day texts, chat) is shown as text and never runs, on every page that shows it.
 */
import supertest from 'supertest';
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { BrowserContext } from 'playwright-core';
import { launchBrowser } from '../helpers/browser';
import { startE2eServer } from '../helpers/e2e-server';
import { insertConfirmedAccount, PASSWORD, signIn as signInAgent, uniqueEmail } from '../helpers/factories';
import { swapBody } from '../api/swaps-support';
import type { RunningServer } from '../../server/index';

// Short enough for a display name (80 characters).
const payload = (where: string) => `${where} <img src=x onerror=window.__pwned=1><script>window.__pwned=2</script>`;

let server: RunningServer;
let browser: BrowserContext;
const seen: Record<string, number> = {};
const email = uniqueEmail('inject');

beforeAll(async () => {
  server = await startE2eServer();
  const agent = supertest.agent(server.url).set('X-Requested-With', 'blockpost');
  await insertConfirmedAccount(server.deps.pool, { email, displayName: payload('name') });
  await signInAgent(agent, email);
  const guild = await agent
    .post('/api/guilds')
    .send({ name: payload('guild') })
    .expect(201);
  const swap = await agent
    .post(`/api/guilds/${guild.body.id}/swaps`)
    .send(
      swapBody({
        title: payload('swap'),
        description: payload('description'),
        colourRules: [{ role: 'light', note: payload('colour') }],
      }),
    )
    .expect(201);
  await agent.post(`/api/swaps/${swap.body.id}/transitions`).send({ to: 'signup' }).expect(200);
  await agent.post(`/api/swaps/${swap.body.id}/signups`).send({ blocks: 1 }).expect(200);
  const day = await agent
    .post(`/api/guilds/${guild.body.id}/sew-days`)
    .send({
      title: payload('sewday'),
      startsAt: '2027-06-01T10:00',
      endsAt: '2027-06-01T14:00',
      place: payload('place'),
      notes: payload('notes'),
    })
    .expect(201);
  const room = await agent.get(`/api/swaps/${swap.body.id}/chat`).expect(200);
  await agent
    .post(`/api/chat/rooms/${room.body.id ?? room.body.room?.id}/messages`)
    .send({ body: payload('chat') })
    .expect(201);
  Object.assign(seen, { guild: guild.body.id, swap: swap.body.id, day: day.body.id });
  browser = await launchBrowser();
}, 60_000);
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

it('shows every injected text as text and runs none of it', async () => {
  const page = await browser.newPage();
  const dialogs: string[] = [];
  page.on('dialog', (d) => {
    dialogs.push(d.message());
    void d.dismiss();
  });
  await page.goto(`${server.url}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL('**/guilds');
  const g = seen.guild;
  const s = seen.swap;
  const visits: [string, string[]][] = [
    ['/guilds', ['guild']],
    [`/guilds/${g}`, ['swap']],
    [`/guilds/${g}/members`, ['name']],
    [`/guilds/${g}/swaps/${s}`, ['swap', 'description', 'colour']],
    [`/guilds/${g}/swaps/${s}/roster`, ['name']],
    [`/guilds/${g}/swaps/${s}/board`, ['name']],
    [`/guilds/${g}/swaps/${s}/chat`, ['chat']],
    [`/guilds/${g}/sew-days/${seen.day}`, ['sewday', 'place', 'notes']],
  ];
  for (const [path, texts] of visits) {
    await page.goto(`${server.url}${path}`);
    await page.waitForLoadState('networkidle');
    for (const where of texts) {
      await page.getByText(`${where} <img src=x`, { exact: false }).first().waitFor({ timeout: 10_000 });
    }
    expect(await page.evaluate(() => (window as unknown as { __pwned?: string }).__pwned), path).toBeUndefined();
    expect(await page.locator('main img[src="x"], main script:not([src])').count(), path).toBe(0);
  }
  expect(dialogs).toEqual([]);
});
