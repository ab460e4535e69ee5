import { afterAll, beforeAll, expect, it } from 'vitest';
import type { BrowserContext } from 'playwright-core';
import { launchBrowser } from '../helpers/browser';
import { startE2eServer } from '../helpers/e2e-server';
import { linkIn, waitForMail } from '../helpers/maildev';
import { finishSignUp, mailJobsOn, uniqueEmail } from '../helpers/factories';
import type { RunningServer } from '../../server/index';

let server: RunningServer;
let officer: BrowserContext;
let invitee: BrowserContext;

beforeAll(async () => {
  server = await startE2eServer(mailJobsOn);
  officer = await launchBrowser();
  invitee = await launchBrowser({ viewport: { width: 390, height: 844 } }); // a phone
});
afterAll(async () => {
  await officer?.close();
  await invitee?.close();
  await server?.close();
});

it('registers, creates a guild, invites a member who accepts in another browser, and lists them', async () => {
  const page = await officer.newPage();
  const officerEmail = uniqueEmail('officer');
  await page.goto(`${server.url}/register`);
  await page.getByLabel('Your name').fill('Ottilie Brandt');
  await page.getByLabel('E-mail').fill(officerEmail);
  await page.getByLabel('Password', { exact: true }).fill('seam-ripper-2027');
  await page.getByRole('button', { name: 'Create account' }).click();
  await finishSignUp(page, officerEmail);
  await page.getByRole('heading', { name: 'Your guilds' }).waitFor();

  await page.getByLabel('Guild name').fill('Fernbrook Patchwork Circle');
  await page.getByRole('button', { name: 'Create guild' }).click();
  await page.getByRole('heading', { name: 'Fernbrook Patchwork Circle' }).waitFor();
  await page.getByRole('heading', { name: /Members \(1\)/ }).waitFor();

  const inviteeEmail = uniqueEmail('newcomer');
  await page.getByLabel('Their e-mail').fill(inviteeEmail);
  await page.getByRole('button', { name: 'Send invitation' }).click();
  await page.getByText(`We e-mailed a link to ${inviteeEmail}`).waitFor();

  const mail = await waitForMail(inviteeEmail);
  const link = linkIn(mail, new RegExp(`${server.url.replace(/[.:/]/g, '\\$&')}/invitations/[\\w-]+`));

  const phone = await invitee.newPage();
  await phone.goto(link);
  await phone.getByRole('heading', { name: 'Join Fernbrook Patchwork Circle' }).waitFor();
  await phone.getByRole('link', { name: 'Create an account to join' }).click();
  await phone.getByLabel('Your name').fill('Cosmo Achterberg');
  await phone.getByLabel('E-mail').fill(inviteeEmail);
  await phone.getByLabel('Password', { exact: true }).fill('quarter-inch-seam');
  await phone.getByRole('button', { name: 'Create account' }).click();
  await finishSignUp(phone, inviteeEmail); // the link brings the newcomer back to the invitation
  await phone.getByRole('button', { name: 'Join the guild' }).click();
  await phone.getByRole('heading', { name: 'Fernbrook Patchwork Circle' }).waitFor();

  await page.reload();
  await page.getByRole('heading', { name: /Members \(2\)/ }).waitFor();
  const row = page.getByRole('row', { name: /Cosmo Achterberg/ });
  expect(await row.getByRole('combobox').inputValue()).toBe('member');
});

it('signs out to the sign-in page, and the guild pages then ask to sign in again', async () => {
  const page = await officer.newPage();
  await page.goto(`${server.url}/guilds`);
  await page.getByRole('link', { name: 'Fernbrook Patchwork Circle' }).click();
  await page.getByRole('heading', { name: 'Fernbrook Patchwork Circle' }).waitFor();

  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.waitForURL((url) => url.pathname === '/sign-in' && url.search === '');
  await page.getByRole('link', { name: 'Sign in' }).waitFor(); // the header is the signed-out one

  // Sign-out replaced the guild page in the history, so Back goes to the guild list, which is shut.
  await page.goBack();
  await page.waitForURL((url) => url.pathname === '/sign-in' && url.searchParams.get('next') === '/guilds');
  expect(await page.getByText('Fernbrook Patchwork Circle').count()).toBe(0);
});

it('keeps what was typed when sign-in fails, and shows the reason beside the form', async () => {
  const page = await officer.newPage();
  await officer.clearCookies();
  await page.goto(`${server.url}/sign-in`);
  await page.getByLabel('E-mail').fill('nobody@example.test');
  await page.getByLabel('Password').fill('not-the-password');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByText('That e-mail and password do not match an account.').waitFor();
  expect(await page.getByLabel('E-mail').inputValue()).toBe('nobody@example.test');
});
