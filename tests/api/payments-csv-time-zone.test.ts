/**
 * The treasurer's CSV writes its dates and times in the guild's time zone, as the guild's pages,
 * mail and calendar files do, not in UTC. The outside check is the platform's own Intl formatter.
 * The yearly totals and the year filter count a payment in the year on the guild's calendar too.
 */
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles, joinGuild } from '../helpers/factories';
import { paymentsOverrides } from '../helpers/payments';
import { createSwap, move } from './swaps-support';

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

it('counts a payment in the year on the guild’s calendar, not the UTC year', async () => {
  const roles = await guildWithRoles(app);
  await roles.admin.agent.patch(`/api/guilds/${roles.guildId}`).send({ timeZone: 'America/Chicago' }).expect(200);
  const swap = await createSwap(roles.coordinator.agent, roles.guildId, { fees: { entry: 500 } });
  await move(roles.coordinator.agent, swap.id, 'signup');
  const makers = [await joinGuild(app, roles.guildId, 'member'), await joinGuild(app, roles.guildId, 'member')];
  for (const maker of makers) {
    await maker.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 1 }).expect(200);
    await maker.agent.post(`/api/swaps/${swap.id}/checkout`).send({}).expect(200);
  }
  // Chicago is UTC−6 in winter: 00:30 UTC on New Year's Day is 18:30 on 31 December there, and
  // 06:30 UTC is 00:30 on 1 January. The checkouts were made now; their times are set to those two.
  const at = ['2027-01-01T00:30:00Z', '2027-01-01T06:30:00Z'];
  for (const [i, maker] of makers.entries()) {
    await app.deps.pool.query('UPDATE payments SET created_at = $1 WHERE user_id = $2 AND swap_id = $3', [
      at[i],
      maker.id,
      swap.id,
    ]);
  }
  expect(at.map((iso) => wallTime(iso, 'America/Chicago').slice(0, 4))).toEqual(['2026', '2027']);

  const all = await roles.admin.agent.get(`/api/guilds/${roles.guildId}/payments?kind=entry`).expect(200);
  expect(all.body.totals.byYear).toEqual([
    { year: 2027, paid: 0, refunded: 0, pending: 500, failed: 0, count: 1 },
    { year: 2026, paid: 0, refunded: 0, pending: 500, failed: 0, count: 1 },
  ]);
  const earlier = await roles.admin.agent.get(`/api/guilds/${roles.guildId}/payments?kind=entry&year=2026`).expect(200);
  expect(earlier.body.payments.map((p: { userId: number }) => p.userId)).toEqual([makers[0]!.id]);
  const later = await roles.admin.agent.get(`/api/guilds/${roles.guildId}/payments?kind=entry&year=2027`).expect(200);
  expect(later.body.payments.map((p: { userId: number }) => p.userId)).toEqual([makers[1]!.id]);
});
