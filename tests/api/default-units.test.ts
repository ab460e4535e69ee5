/** A guild's default unit, and a member's own choice overriding it. */
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { MeDto } from '@shared/types';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';

let app: TestApp;
let g: Awaited<ReturnType<typeof guildWithRoles>>;
beforeAll(async () => {
  app = await createTestApp();
  g = await guildWithRoles(app);
});
afterAll(() => app.close());

const me = async (agent: typeof g.member.agent) => (await agent.get('/api/me').expect(200)).body as MeDto;

it('starts in inches and lets an admin, and only an admin, switch the guild to millimetres', async () => {
  expect((await g.member.agent.get(`/api/guilds/${g.guildId}`).expect(200)).body.defaultUnit).toBe('in');
  await g.coordinator.agent.patch(`/api/guilds/${g.guildId}`).send({ defaultUnit: 'mm' }).expect(403);
  const res = await g.admin.agent.patch(`/api/guilds/${g.guildId}`).send({ defaultUnit: 'mm' }).expect(200);
  expect(res.body.defaultUnit).toBe('mm');
  const bad = await g.admin.agent.patch(`/api/guilds/${g.guildId}`).send({ defaultUnit: 'cubits' }).expect(400);
  expect(bad.body.error.fields).toHaveProperty('defaultUnit');
});

it('applies the guild default to a member until they choose a unit of their own, and again once they clear it', async () => {
  await g.admin.agent.patch(`/api/guilds/${g.guildId}`).send({ defaultUnit: 'mm' }).expect(200);
  let mine = await me(g.member.agent);
  expect(mine.user.unitsChosen).toBe(false);
  expect(mine.memberships.find((m) => m.guildId === g.guildId)?.defaultUnit).toBe('mm');

  await g.member.agent.patch('/api/me').send({ units: 'in' }).expect(200);
  mine = await me(g.member.agent);
  expect(mine.user).toMatchObject({ units: 'in', unitsChosen: true });

  await g.member.agent.patch('/api/me').send({ units: null }).expect(200);
  expect((await me(g.member.agent)).user.unitsChosen).toBe(false);
});
