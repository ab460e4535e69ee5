/**
 * A block swap from end to end in Chromium: the coordinator sets it up in the multi-step form, a
 * member signs up on a phone and posts a photo of the finished block, the coordinator takes the
 * block in, measures it and sees the verdict, plans and confirms the return and downloads the CSV.
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, expect, it } from 'vitest';
import supertest from 'supertest';
import sharp from 'sharp';
import type { BrowserContext, Page } from 'playwright-core';
import { launchBrowser } from '../helpers/browser';
import { startE2eServer } from '../helpers/e2e-server';
import { insertConfirmedAccount, PASSWORD, signIn as signInAgent, uniqueEmail } from '../helpers/factories';
import type { RunningServer } from '../../server/index';

let server: RunningServer;
let desk: BrowserContext;
let phone: BrowserContext;
type Person = { agent: ReturnType<typeof supertest.agent>; email: string; id: number };
let coordinator: Person;
let member: Person;
let guildId: number;

async function register(displayName: string): Promise<Person> {
  const agent = supertest.agent(server.url).set('X-Requested-With', 'blockpost');
  const email = uniqueEmail('swap');
  const id = await insertConfirmedAccount(server.deps.pool, { email, displayName });
  await signInAgent(agent, email);
  return { agent, email, id };
}

/** A big step asks first: press its button, then confirm it in the dialog that says what it will do. */
async function takeStep(page: Page, label: string) {
  await page.getByRole('button', { name: label }).click();
  const dialog = page.getByRole('dialog');
  await dialog.getByRole('button', { name: label }).click();
  await dialog.waitFor({ state: 'hidden' });
}

async function signIn(page: Page, email: string) {
  await page.goto(`${server.url}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/guilds/);
}

beforeAll(async () => {
  server = await startE2eServer();
  const admin = await register('Henrietta Vasquez');
  guildId = (
    await admin.agent.post('/api/guilds').send({ name: 'Bramblegate Quilt Circle', timeZone: 'Europe/London' }).expect(201)
  ).body.id;
  const { Membership } = await import('../../server/db/models');
  coordinator = await register('Odile Farraday');
  member = await register('Tamsin Okoro');
  await Membership.create({ guildId, userId: coordinator.id, role: 'coordinator' });
  await Membership.create({ guildId, userId: member.id, role: 'member' });
  desk = await launchBrowser();
  phone = await launchBrowser({ viewport: { width: 390, height: 844 } });
});
afterAll(async () => {
  await desk?.close();
  await phone?.close();
  await server?.close();
});

it('runs a swap from set-up to a confirmed return and a CSV download', async () => {
  // The coordinator sets the swap up; the guild's front page is its list of swaps.
  const page = await desk.newPage();
  await signIn(page, coordinator.email);
  await page.goto(`${server.url}/guilds/${guildId}`);
  await page.getByRole('link', { name: 'Set up a swap' }).click();
  await page.getByRole('button', { name: 'Next' }).click();
  await page.getByText('Give the swap a title of at least 2 characters.').waitFor();
  await page.getByLabel('Title').fill('Bramble Nine-Patch');
  await page.getByRole('button', { name: 'Next' }).click();
  // 3 × 3½″ columns and rows with ¼″ seams: 9½″ unfinished, shown while typing.
  await page.getByText('9½″ × 9½″', { exact: true }).waitFor();
  await page.getByLabel('Column 2').fill('two');
  await page.getByRole('button', { name: 'Next' }).click();
  await page
    .getByText(/“two” is not a length we can read/)
    .first()
    .waitFor();
  await page.getByLabel('Column 2').fill('3½');
  await page.getByRole('button', { name: 'Next' }).click();
  await page.getByRole('button', { name: 'Checkerboard' }).click();
  await page.getByRole('button', { name: 'Next' }).click();
  await page.getByRole('button', { name: 'Next' }).click();
  await page.getByRole('heading', { name: 'Step 5 of 5: Review' }).waitFor();
  await page.getByRole('button', { name: 'Save as draft' }).click();
  await page.getByRole('heading', { name: 'Bramble Nine-Patch' }).waitFor();
  const swapId = Number(/swaps\/(\d+)/.exec(page.url())![1]);
  await takeStep(page, 'Open sign-up');
  await page.getByText('Sign-up open', { exact: true }).first().waitFor();

  // The member signs up on a phone and gets the cutting plan for exactly one block.
  const mobile = await phone.newPage();
  await signIn(mobile, member.email);
  await mobile.goto(`${server.url}/guilds/${guildId}/swaps/${swapId}`);
  await mobile.getByLabel('Blocks I will make').fill('1');
  await mobile.getByRole('button', { name: 'Sign up' }).click();
  await mobile.getByRole('heading', { name: 'Cutting plan for your 1 block' }).waitFor();
  await mobile.getByText('Close or cover the rotary cutter blade', { exact: false }).waitFor();
  await mobile.getByRole('heading', { name: 'Block 1' }).waitFor();

  // A photo of the finished block marks it sewn.
  await mobile.getByText('Add photos of this block').click();
  const photo = await sharp({ create: { width: 900, height: 700, channels: 3, background: '#2f4b7c' } })
    .jpeg()
    .toBuffer();
  await mobile.locator('input[type=file]').first().setInputFiles({ name: 'my-block.jpg', mimeType: 'image/jpeg', buffer: photo });
  await mobile.getByRole('button', { name: 'Upload 1 photo' }).click();
  await mobile.getByText('The photo was added.').waitFor();
  await mobile.getByText('Sewn', { exact: true }).waitFor();

  // The coordinator pledges too (so there is someone to swap with) and moves the swap on.
  await coordinator.agent.post(`/api/swaps/${swapId}/signups`).send({ blocks: 1 }).expect(200);
  await page.reload();
  await takeStep(page, 'Close sign-up and start sewing');
  await takeStep(page, 'Start collecting blocks');
  await page.getByRole('button', { name: 'Start sorting' }).waitFor();

  // Intake: receive and measure the member's block in the roster; the verdict shows at once.
  await page.getByRole('link', { name: 'Roster' }).click();
  await page.getByLabel('Search by name').fill('tams');
  await page.getByRole('button', { name: /Blocks of Tamsin Okoro/ }).click();
  await expect.poll(() => page.getByRole('img', { name: /Block 1 by Tamsin Okoro/ }).count()).toBeGreaterThan(0);
  await page.getByRole('button', { name: /Mark received block 1 of Tamsin Okoro/ }).click();
  await page.getByRole('button', { name: /^Measure block 1 of Tamsin Okoro/ }).click();
  await page.getByLabel('Width').fill('9 5/8');
  await page.getByLabel('Height').fill('241 mm');
  await page.getByText('As typed:').waitFor();
  await page.getByRole('button', { name: 'Save measurement' }).click();
  await page.getByText('Saved:').waitFor();
  expect(await page.getByRole('status').filter({ hasText: 'Saved:' }).innerText()).toMatch(/True to size/);

  // The coordinator's own block is taken in through the API, as an intake tool would.
  const own = (await coordinator.agent.get(`/api/swaps/${swapId}/blocks?maker=me`).expect(200)).body[0];
  await coordinator.agent.post(`/api/blocks/${own.id}/received`).send({}).expect(200);
  await coordinator.agent.post(`/api/blocks/${own.id}/measurements`).send({ width: 9.5, height: 9.5 }).expect(201);

  // Sorting, then the return: plan, review, confirm.
  await page.getByRole('link', { name: 'Overview' }).click();
  await takeStep(page, 'Start sorting');
  await page.getByRole('link', { name: 'Return of blocks' }).click();
  await page.getByRole('button', { name: 'Make a plan' }).click();
  await page.getByRole('spinbutton', { name: 'Blocks from Tamsin Okoro to Odile Farraday' }).waitFor();
  await page.getByRole('spinbutton', { name: 'Blocks from Tamsin Okoro to Odile Farraday' }).fill('2');
  await page.getByText('Tamsin Okoro has 1 accepted block but sends 2.').waitFor();
  expect(await page.getByRole('button', { name: 'Confirm the return' }).isDisabled()).toBe(true);
  await page.getByRole('spinbutton', { name: 'Blocks from Tamsin Okoro to Odile Farraday' }).fill('1');
  await takeStep(page, 'Confirm the return');
  await page.getByRole('heading', { name: 'The return is confirmed' }).waitFor();

  const [download] = await Promise.all([
    page.waitForEvent('download'),
    page.getByRole('link', { name: 'Download the return (CSV)' }).click(),
  ]);
  expect(download.suggestedFilename()).toBe(`bramble-nine-patch-swap-${swapId}-distribution.csv`);
  const csv = readFileSync((await download.path())!, 'utf8')
    .replace(/^\uFEFF/, '')
    .trim()
    .split('\r\n');
  expect(csv[0]).toBe('From (maker),To (recipient),Blocks,Block numbers');
  expect(csv.slice(1).sort()).toEqual(['Odile Farraday,Tamsin Okoro,1,#1', 'Tamsin Okoro,Odile Farraday,1,#1']);

  // The member sees what comes back.
  await mobile.reload();
  await mobile.getByText('You receive 1 block:').waitFor();
  await mobile.getByText('1 from Odile Farraday (block 1)').waitFor();
});
