import { afterAll, beforeAll, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { launchBrowser, pageWithSession } from '../helpers/browser';
import { startE2eServer } from '../helpers/e2e-server';
import type { RunningServer } from '../../server/index';
import type { SewDayDetailDto } from '../../shared/schemas/sewdays';
import { liveGuild, type Person } from '../live/live-helpers';

let server: RunningServer;
let memberBrowser: BrowserContext;
let adminBrowser: BrowserContext;

const signedInPage = (context: BrowserContext, person: Person): Promise<Page> =>
  pageWithSession(context, person.cookie, server.url);

beforeAll(async () => {
  server = await startE2eServer();
  memberBrowser = await launchBrowser({ viewport: { width: 360, height: 800 } });
  adminBrowser = await launchBrowser();
});
afterAll(async () => {
  await memberBrowser?.close();
  await adminBrowser?.close();
  await server?.close();
});

it('answers, chats live, shows markup as text, and lets the admin remove a message', async () => {
  const g = await liveGuild(server.url);
  const year = new Date().getUTCFullYear() + 1;
  const sewDay = (
    await g.coordinator.api<SewDayDetailDto>('POST', `/guilds/${g.guildId}/sew-days`, {
      title: 'Spring binding bee',
      startsAt: `${year}-03-13T10:00`,
      endsAt: `${year}-03-13T15:30`,
      place: 'Library community room',
    })
  ).body;
  const url = `${server.url}/guilds/${g.guildId}/sew-days/${sewDay.id}`;

  const member = await signedInPage(memberBrowser, g.member);
  await member.goto(url);
  await member.getByRole('heading', { name: 'Spring binding bee' }).waitFor();
  await member.getByText(/rest on its heel|stand it on its heel/).waitFor();
  await member.getByRole('button', { name: 'Going', exact: true }).click();
  await member.getByText('Your answer:').waitFor();
  expect(await member.getByRole('button', { name: 'Going', exact: true }).getAttribute('aria-pressed')).toBe('true');

  const admin = await signedInPage(adminBrowser, g.admin);
  await admin.goto(url);
  await admin.getByRole('heading', { name: 'Going (1)' }).waitFor();
  await admin.getByText('Here now: Milo Member.').waitFor();

  await member.getByLabel('Your message').fill('<b>Parking</b> is behind the hall, see https://example.org/map');
  await admin.getByText('Milo Member is typing…').waitFor();
  await member.getByRole('button', { name: 'Send' }).click();
  const line = admin.getByRole('listitem').filter({ hasText: 'Parking' });
  await line.getByText('<b>Parking</b> is behind the hall, see').waitFor();
  expect(await line.locator('b').count()).toBe(0);
  expect(await line.getByRole('link', { name: 'https://example.org/map' }).getAttribute('rel')).toContain('noopener');
  expect(await member.getByLabel('Your message').inputValue()).toBe('');

  admin.once('dialog', (d) => void d.accept());
  await line.getByRole('button', { name: 'Remove' }).click();
  await member.getByText('This message was removed by a moderator.').waitFor();
  await admin.getByText('This message was removed by a moderator.').waitFor();
});

it('shows the messages sent while the reader was on another page, without a reload', async () => {
  const g = await liveGuild(server.url);
  const year = new Date().getUTCFullYear() + 1;
  const sewDay = (
    await g.coordinator.api<SewDayDetailDto>('POST', `/guilds/${g.guildId}/sew-days`, {
      title: 'Autumn appliqué afternoon',
      startsAt: `${year}-10-02T13:00`,
      endsAt: `${year}-10-02T17:00`,
      place: 'Church hall',
    })
  ).body;
  const roomId = sewDay.chatRoomId!;
  expect((await g.admin.api('POST', `/chat/rooms/${roomId}/messages`, { body: 'Tables are up.' })).status).toBe(201);

  const member = await signedInPage(memberBrowser, g.member);
  await member.goto(`${server.url}/guilds/${g.guildId}/sew-days/${sewDay.id}`);
  await member.getByText('Tables are up.').waitFor();
  await member.evaluate(() => ((window as unknown as { stayedOpen: boolean }).stayedOpen = true));

  // Off to the swaps page (in the app, no reload) while the room goes on.
  await member.getByRole('link', { name: 'Swaps', exact: true }).first().click();
  await member.waitForURL((u) => !u.pathname.includes('/sew-days/'));
  expect((await g.admin.api('POST', `/chat/rooms/${roomId}/messages`, { body: 'Irons are on: mind the cords.' })).status).toBe(
    201,
  );

  await member.goBack();
  await member.getByText('Tables are up.').waitFor();
  await member.getByText('Irons are on: mind the cords.').waitFor({ timeout: 5000 });
  expect(await member.evaluate(() => (window as unknown as { stayedOpen?: boolean }).stayedOpen)).toBe(true);
  await member.close();
});
