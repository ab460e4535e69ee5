/**
 * Sign-up by mail in the browser: the form leads to a check-your-inbox screen, the mailed link to a
 * confirm screen whose button makes the account, signs in and goes on to where the person was
 * headed. An address that already has an account sees exactly the same screens; its owner gets a
 * note instead of a link. Screens are checked on a 360 px phone and on a laptop.
 */
import { mkdirSync } from 'node:fs';
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { launchBrowser } from '../helpers/browser';
import { startE2eServer } from '../helpers/e2e-server';
import { seriousViolations } from '../helpers/axe';
import { waitForMail } from '../helpers/maildev';
import { confirmLinkFor, insertConfirmedAccount, mailJobsOn, uniqueEmail } from '../helpers/factories';
import type { RunningServer } from '../../server/index';

/** Screenshots for looking at, not asserting (set SIGNUP_SHOTS to keep them elsewhere). */
const shots = process.env.SIGNUP_SHOTS ?? '/tmp/shots-auth';

let server: RunningServer;
let phone: BrowserContext;
let laptop: BrowserContext;
beforeAll(async () => {
  mkdirSync(shots, { recursive: true });
  server = await startE2eServer(mailJobsOn);
  phone = await launchBrowser({ viewport: { width: 360, height: 740 } });
  laptop = await launchBrowser({ viewport: { width: 1280, height: 900 } });
});
afterAll(async () => {
  await phone?.close();
  await laptop?.close();
  await server?.close();
});

async function fillSignUp(page: Page, path: string, fields: { name: string; email: string; password: string }) {
  await page.goto(`${server.url}${path}`);
  await page.getByLabel('Your name').fill(fields.name);
  await page.getByLabel('E-mail').fill(fields.email);
  await page.getByLabel('Password', { exact: true }).fill(fields.password);
}

/** Nothing wider than the screen: no sideways scrolling on a phone. */
async function fitsTheScreen(page: Page) {
  return page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth);
}

it('signs up on a phone: check your inbox, the mailed link, confirm, and on to where the person was going', async () => {
  const page = await phone.newPage();
  const email = uniqueEmail('phone-signup');
  await fillSignUp(page, '/register?next=/planner', {
    name: 'Clementine Ashby',
    email,
    password: 'thimble orchard copper lantern',
  });
  await page.getByText('Strength: Very strong.').waitFor();
  await page.getByRole('button', { name: 'Create account' }).click();

  await page.getByRole('heading', { name: 'Check your inbox' }).waitFor();
  await page.getByText(email).waitFor();
  expect(await fitsTheScreen(page)).toBe(true);
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: `${shots}/check-inbox-360.png`, fullPage: true });

  // Going back to the form keeps what was typed.
  await page.getByRole('button', { name: 'Back to the form' }).click();
  expect(await page.getByLabel('Your name').inputValue()).toBe('Clementine Ashby');
  expect(await page.getByLabel('E-mail').inputValue()).toBe(email);

  const link = await confirmLinkFor(email);
  expect(new URL(link).searchParams.get('next')).toBe('/planner');
  await page.goto(link);
  await page.getByRole('heading', { name: 'Confirm your address' }).waitFor();
  expect(await fitsTheScreen(page)).toBe(true);
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: `${shots}/confirm-360.png`, fullPage: true });

  await page.getByRole('button', { name: 'Confirm and sign in' }).click();
  await page.getByRole('heading', { name: 'Cutting planner' }).waitFor();
  const me = await page.evaluate(() => fetch('/api/me').then((r) => r.json()));
  expect(me.user).toMatchObject({ email, displayName: 'Clementine Ashby' });

  // The link is spent: opening it again says so, with a way forward.
  await phone.clearCookies();
  await page.goto(link);
  await page.getByRole('button', { name: 'Confirm and sign in' }).click();
  await page.getByRole('alert').filter({ hasText: 'already used' }).waitFor();
  await page.getByRole('link', { name: 'Sign up again' }).waitFor();
  await page.screenshot({ path: `${shots}/confirm-used-360.png`, fullPage: true });
});

it('shows the same screens for an address that has an account, and mails its owner a note instead of a link', async () => {
  const owner = uniqueEmail('owner');
  await insertConfirmedAccount(server.deps.pool, { email: owner, displayName: 'Beatrix Holloway' });
  const page = await laptop.newPage();
  await fillSignUp(page, '/register', { name: 'Not Beatrix', email: owner, password: 'walnut selvage meadow bobbin' });
  await page.getByRole('button', { name: 'Create account' }).click();
  await page.getByRole('heading', { name: 'Check your inbox' }).waitFor();
  await page.getByText(owner).waitFor();
  await page.screenshot({ path: `${shots}/check-inbox-desktop.png`, fullPage: true });

  const note = await waitForMail(owner, (m) => /Someone tried to sign up with your address/.test(m.subject), 20_000);
  expect(note.text).toContain('Hello Beatrix Holloway');
  expect(note.text).not.toContain('confirm-email');

  const fresh = uniqueEmail('laptop-signup');
  await page.getByRole('button', { name: 'Back to the form' }).click();
  await page.getByLabel('E-mail').fill(fresh);
  await page.getByRole('button', { name: 'Create account' }).click();
  await page.getByRole('heading', { name: 'Check your inbox' }).waitFor();
  await page.goto(await confirmLinkFor(fresh));
  await page.getByRole('heading', { name: 'Confirm your address' }).waitFor();
  await page.screenshot({ path: `${shots}/confirm-desktop.png`, fullPage: true });
  await page.getByRole('button', { name: 'Confirm and sign in' }).click();
  await page.getByRole('heading', { name: 'Your guilds' }).waitFor();
});
