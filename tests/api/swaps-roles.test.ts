import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { move, myBlocks, receiveAndMeasure, sewingSwap, swapBody, type Roles } from './swaps-support';

let app: TestApp;
let roles: Roles;
let swapId: number;
let blockId: number;
let trimBlockId: number;

type Who = 'admin' | 'coordinator' | 'member' | 'stranger' | 'anon';
const WHO: Who[] = ['admin', 'coordinator', 'member', 'stranger', 'anon'];

beforeAll(async () => {
  app = await createTestApp();
  roles = await guildWithRoles(app);
  await roles.member.agent.patch('/api/me').send({ mailingAddress: '9 Weaver Close, Fernbank' }).expect(200);
  const { swap } = await sewingSwap(app, roles, { pledges: [3, 1] });
  swapId = swap.id;
  await move(roles.coordinator.agent, swapId, 'collecting');
  const blocks = await myBlocks(roles.member.agent, swapId);
  blockId = blocks[0]!.id;
  trimBlockId = blocks[1]!.id;
  await receiveAndMeasure(roles.coordinator.agent, trimBlockId, { width: 10, height: 10 });
});
afterAll(() => app.close());

function agentOf(who: Who) {
  return who === 'anon' ? app.agent() : roles[who].agent;
}

interface Row {
  name: string;
  call: (agent: ReturnType<TestApp['agent']>) => Promise<{ status: number; body: unknown }>;
  expect: [number, number, number, number, number];
}

const later = () => new Date(Date.now() + 50 * 86_400_000).toISOString();

// Rows run in order: the maker's steps come before the coordinator takes the block in.
const rows = (): Row[] => [
  { name: 'GET guild swaps', call: (a) => a.get(`/api/guilds/${roles.guildId}/swaps`), expect: [200, 200, 200, 404, 401] },
  {
    name: 'POST guild swaps',
    call: (a) => a.post(`/api/guilds/${roles.guildId}/swaps`).send(swapBody()),
    expect: [201, 201, 403, 404, 401],
  },
  { name: 'GET swap', call: (a) => a.get(`/api/swaps/${swapId}`), expect: [200, 200, 200, 404, 401] },
  {
    name: 'PATCH swap (schedule)',
    call: (a) => a.patch(`/api/swaps/${swapId}`).send({ dueAt: later() }),
    expect: [200, 200, 403, 404, 401],
  },
  { name: 'GET transitions', call: (a) => a.get(`/api/swaps/${swapId}/transitions`), expect: [200, 200, 200, 404, 401] },
  // Officers pass the role check and meet the state check (collecting cannot go back to draft).
  {
    name: 'POST transitions',
    call: (a) => a.post(`/api/swaps/${swapId}/transitions`).send({ to: 'draft' }),
    expect: [409, 409, 403, 404, 401],
  },
  {
    name: 'POST signups',
    call: (a) => a.post(`/api/swaps/${swapId}/signups`).send({ blocks: 1 }),
    expect: [409, 409, 409, 404, 401],
  },
  { name: 'DELETE signups/me', call: (a) => a.delete(`/api/swaps/${swapId}/signups/me`), expect: [404, 409, 409, 404, 401] },
  { name: 'GET roster', call: (a) => a.get(`/api/swaps/${swapId}/roster`), expect: [200, 200, 200, 404, 401] },
  { name: 'GET blocks (all)', call: (a) => a.get(`/api/swaps/${swapId}/blocks`), expect: [200, 200, 403, 404, 401] },
  { name: 'GET blocks?maker=me', call: (a) => a.get(`/api/swaps/${swapId}/blocks?maker=me`), expect: [200, 200, 200, 404, 401] },
  { name: 'GET block', call: (a) => a.get(`/api/blocks/${blockId}`), expect: [200, 200, 200, 404, 401] },
  { name: 'POST sewn', call: (a) => a.post(`/api/blocks/${blockId}/sewn`), expect: [403, 403, 200, 404, 401] },
  {
    name: 'POST handed-in',
    call: (a) => a.post(`/api/blocks/${blockId}/handed-in`).send({ how: 'in-person' }),
    expect: [403, 403, 200, 404, 401],
  },
  { name: 'POST received', call: (a) => a.post(`/api/blocks/${blockId}/received`).send({}), expect: [200, 200, 403, 404, 401] },
  {
    name: 'POST measurements',
    call: (a) => a.post(`/api/blocks/${blockId}/measurements`).send({ width: 9.5, height: 9.5 }),
    expect: [201, 201, 201, 404, 401],
  },
  { name: 'GET measurements', call: (a) => a.get(`/api/blocks/${blockId}/measurements`), expect: [200, 200, 200, 404, 401] },
  { name: 'POST trimmed', call: (a) => a.post(`/api/blocks/${trimBlockId}/trimmed`), expect: [200, 200, 403, 404, 401] },
  {
    name: 'POST distribution/plan',
    call: (a) => a.post(`/api/swaps/${swapId}/distribution/plan`),
    expect: [200, 200, 403, 404, 401],
  },
  {
    name: 'POST distribution/confirm',
    call: (a) =>
      a
        .post(`/api/swaps/${swapId}/distribution/confirm`)
        .send({ transfers: [{ from: roles.member.id, to: roles.coordinator.id, count: 1 }] }),
    expect: [409, 409, 403, 404, 401],
  },
  { name: 'GET roster.csv', call: (a) => a.get(`/api/swaps/${swapId}/export/roster.csv`), expect: [200, 200, 403, 404, 401] },
  {
    name: 'GET distribution.csv',
    call: (a) => a.get(`/api/swaps/${swapId}/export/distribution.csv`),
    expect: [409, 409, 403, 404, 401],
  },
];

describe('role matrix for every swap and block route', () => {
  it('answers each role as the policy says', async () => {
    const table: string[] = [];
    const mismatches: string[] = [];
    for (const row of rows()) {
      const got: number[] = [];
      for (const who of WHO) got.push((await row.call(agentOf(who))).status);
      table.push(`${row.name}: ${got.join(' ')}`);
      if (got.join() !== row.expect.join())
        mismatches.push(`${row.name}: expected ${row.expect.join(' ')}, got ${got.join(' ')}`);
    }
    expect(mismatches, table.join('\n')).toEqual([]);
  });

  it('shows mailing addresses to officers only, and only of the swap’s members', async () => {
    const asCoordinator = await roles.coordinator.agent.get(`/api/swaps/${swapId}/roster`).expect(200);
    const memberRow = asCoordinator.body.rows.find((r: { userId: number }) => r.userId === roles.member.id);
    expect(memberRow.mailingAddress).toBe('9 Weaver Close, Fernbank');
    expect(asCoordinator.body.rows.map((r: { userId: number }) => r.userId)).not.toContain(roles.admin.id);
    const asMember = await roles.member.agent.get(`/api/swaps/${swapId}/roster`).expect(200);
    expect(JSON.stringify(asMember.body)).not.toContain('Weaver Close');
    expect(asMember.body.rows[0]).not.toHaveProperty('mailingAddress');
  });

  it('keeps a member from another maker’s block', async () => {
    const coordinatorBlocks = await roles.coordinator.agent.get(`/api/swaps/${swapId}/blocks?maker=me`).expect(200);
    const theirs = coordinatorBlocks.body[0].id;
    const res = await roles.member.agent.post(`/api/blocks/${theirs}/handed-in`).send({ how: 'post' }).expect(403);
    expect(res.body.error.message).toMatch(/another maker/);
    await roles.member.agent.post(`/api/blocks/${theirs}/measurements`).send({ width: 9.5, height: 9.5 }).expect(403);
    await roles.member.agent.get(`/api/swaps/${swapId}/blocks?maker=${roles.coordinator.id}`).expect(403);
  });
});
