/**
 * The treasurer's CSV writes its dates and times in the guild's time zone, as the guild's pages,
 * mail and calendar files do, not in UTC. The outside check is the platform's own Intl formatter.
 */
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles, joinGuild } from '../helpers/factories';
import { paymentsOverrides } from '../helpers/payments';

let app: TestApp;
beforeAll(async () => {
  app = await createTestApp(paymentsOverrides());
});
afterAll(async () => {
  await app?.close();
});

/** "2027-01-16 10:00" in `timeZone`: Swedish dates are written year-month-day with a 24-hour clock. */
const wallTime = (iso: string, timeZone: string) =>
  new Intl.DateTimeFormat('sv-SE', {
    timeZone,
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
  }).format(new Date(iso));

it('writes each payment’s date in the guild’s time zone', async () => {
  const roles = await guildWithRoles(app);
  await roles.admin.agent
    .patch(`/api/guilds/${roles.guildId}`)
    .send({ timeZone: 'Pacific/Chatham', currency: 'cad', dues: { amount: 2500, year: 2027 } })
    .expect(200);
  const member = await joinGuild(app, roles.guildId, 'member');
  await member.agent.post(`/api/guilds/${roles.guildId}/dues/checkout`).send({}).expect(200);

  const json = await roles.admin.agent.get(`/api/guilds/${roles.guildId}/payments?kind=dues`).expect(200);
  const payment = json.body.payments.find((p: { userId: number }) => p.userId === member.id);
  const res = await roles.admin.agent.get(`/api/guilds/${roles.guildId}/payments?format=csv&kind=dues`).expect(200);
  const line = res.text.split('\r\n').find((l) => l.includes(payment.displayName))!;

  // Chatham is UTC+12:45 or +13:45, so no part of the UTC time can pass for the local one.
  const local = wallTime(payment.createdAt, 'Pacific/Chatham');
  expect(line.split(',')[0]).toBe(local);
  expect(line).not.toContain(payment.createdAt);
  expect(line).toContain(',pending,');
});
