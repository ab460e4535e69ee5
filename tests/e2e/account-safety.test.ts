/**
 * The account forms as a person meets them: the strength meter rates a password while it is typed,
 * a weak one is refused with the reason beside the field and nothing typed is lost, the settings
 * page changes the password, and an officer sees how many invitations are left today.
 */
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { launchBrowser } from '../helpers/browser';
import { startE2eServer } from '../helpers/e2e-server';
import { finishSignUp, mailJobsOn, uniqueEmail } from '../helpers/factories';
import type { RunningServer } from '../../server/index';

let server: RunningServer;
let phone: BrowserContext;

beforeAll(async () => {
  server = await startE2eServer({ ...mailJobsOn, INVITES_PER_INVITER_DAY: '4', INVITES_PER_GUILD_DAY: '10' });
  phone = await launchBrowser({ viewport: { width: 360, height: 800 } });
});
afterAll(async () => {
  await phone?.close();
  await server?.close();
});

async function fillRegistration(page: Page, email: string, password: string) {
  await phone.clearCookies(); // a new person each time
  await page.goto(`${server.url}/register`);
  await page.getByLabel('Your name').fill('Philippa Marchetti');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
}

it('rates the password while it is typed and refuses a weak one without losing the form', async () => {
  const page = await phone.newPage();
  const email = uniqueEmail('meter');
  await fillRegistration(page, email, 'password12');
  await page.getByText('Strength: Weak.').waitFor();
  await page.getByText('This is a very common password.').first().waitFor();

  // The server refuses it too, with the reason beside the field; what was typed stays.
  await page.getByRole('button', { name: 'Create account' }).click();
  await page.getByRole('alert').filter({ hasText: 'very common password' }).first().waitFor();
  expect(await page.getByLabel('E-mail').inputValue()).toBe(email);
  expect(await page.getByLabel('Your name').inputValue()).toBe('Philippa Marchetti');

  await page.getByLabel('Password', { exact: true }).fill('thimble orchard copper lantern');
  await page.getByText('Strength: Very strong.').waitFor();
  await page.getByRole('button', { name: 'Create account' }).click();
  await finishSignUp(page, email);
  await page.getByRole('heading', { name: 'Your guilds' }).waitFor();
});

it('changes the password in the settings, with the meter there too', async () => {
  const page = await phone.newPage();
  const email = uniqueEmail('change');
  await fillRegistration(page, email, 'thimble orchard copper lantern');
  await page.getByRole('button', { name: 'Create account' }).click();
  await finishSignUp(page, email);
  await page.getByRole('heading', { name: 'Your guilds' }).waitFor();
  await page.goto(`${server.url}/settings`);
  await page.getByLabel('Current password').fill('thimble orchard copper lantern');
  await page.getByLabel('New password').fill('aaaaaaaaaa');
  await page.getByText('Strength: Very weak.').waitFor();
  await page.getByLabel('New password').fill('walnut selvage meadow bobbin');
  await page.getByText('Strength: Very strong.').waitFor();
  await page.getByRole('button', { name: 'Change password' }).click();
  await page.getByText('Your password is changed.').waitFor();
});

it('shows an officer how many invitations are left today', async () => {
  const page = await phone.newPage();
  const officer = uniqueEmail('officer');
  await fillRegistration(page, officer, 'thimble orchard copper lantern');
  await page.getByRole('button', { name: 'Create account' }).click();
  await finishSignUp(page, officer);
  await page.getByLabel('Guild name').fill('Larkspur Lane Quilters');
  await page.getByRole('button', { name: 'Create guild' }).click();
  await page.getByRole('heading', { name: 'Larkspur Lane Quilters' }).waitFor();
  await page.getByText('You can send 4 more invitations today.').waitFor();
  const email = uniqueEmail('guest');
  await page.getByLabel('Their e-mail').fill(email);
  await page.getByRole('button', { name: 'Send invitation' }).click();
  await page.getByText(`We e-mailed a link to ${email}`).waitFor();
  await page.getByText('You can send 3 more invitations today.').waitFor();
  await page.getByText(/only for the address it was sent to/).waitFor();
});
