import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { move, myBlocks, receiveAndMeasure, sewingSwap, type Roles } from './swaps-support';

let app: TestApp;
let roles: Roles;
let swapId: number;
let makers: Awaited<ReturnType<typeof sewingSwap>>['makers'];
/** each maker's one block, in the makers' order: member, coordinator, a second member */
let blockIds: number[];

interface Row {
  userId: number;
  measured: number;
  verdicts?: unknown;
  accepted?: unknown;
  blocks: Record<string, unknown>[];
}
const rosterOf = async (agent: Roles['member']['agent']) =>
  (await agent.get(`/api/swaps/${swapId}/roster`).expect(200)).body as { rows: Row[] };
const rowOf = (roster: { rows: Row[] }, userId: number) => roster.rows.find((r) => r.userId === userId)!;

beforeAll(async () => {
  app = await createTestApp();
  roles = await guildWithRoles(app);
  const made = await sewingSwap(app, roles, { pledges: [1, 1, 1] });
  swapId = made.swap.id;
  makers = made.makers;
  await move(roles.coordinator.agent, swapId, 'collecting');
  blockIds = [];
  for (const maker of makers) blockIds.push((await myBlocks(maker.agent, swapId))[0]!.id);
  // Target 9½″ ± ⅛″ (the swap's settings): short, true to size, and one to trim.
  await receiveAndMeasure(roles.coordinator.agent, blockIds[0]!, { width: 9.25, height: 9.5 });
  await receiveAndMeasure(roles.coordinator.agent, blockIds[1]!, { width: 9.5, height: 9.5 });
  await receiveAndMeasure(roles.coordinator.agent, blockIds[2]!, { width: '9 7/8', height: 9.5 });
});
afterAll(() => app.close());

describe('who sees verdicts', () => {
  it('keeps verdicts to officers by default', async () => {
    const guild = await roles.member.agent.get(`/api/guilds/${roles.guildId}`).expect(200);
    expect(guild.body.verdictsVisibleTo).toBe('officers');
  });

  it('shows a member their own verdict and leaves other makers’ verdicts out of the roster', async () => {
    const roster = await rosterOf(roles.member.agent);
    const own = rowOf(roster, roles.member.id);
    expect(own.verdicts).toMatchObject({ short: 1 });
    expect(own.blocks[0]).toMatchObject({ state: 'measured', verdict: 'short' });
    for (const maker of makers.slice(1)) {
      const row = rowOf(roster, maker.id);
      expect(row.measured).toBe(1);
      // Absent, not null: nothing in the answer hints at the verdict.
      expect(row).not.toHaveProperty('verdicts');
      expect(row).not.toHaveProperty('accepted');
      expect(row.blocks[0]).toMatchObject({ state: 'measured' });
      for (const key of ['verdict', 'trimmed', 'acceptedByDecision', 'photoEstimate'])
        expect(row.blocks[0]).not.toHaveProperty(key);
    }
  });

  it('leaves another maker’s verdict out of the block answer, but not the member’s own', async () => {
    const own = await roles.member.agent.get(`/api/blocks/${blockIds[0]}`).expect(200);
    expect(own.body).toMatchObject({ state: 'measured', verdict: 'short', accepted: false });
    expect(own.body.latest.ruler).toMatchObject({ verdict: 'short' });
    const other = await roles.member.agent.get(`/api/blocks/${blockIds[2]}`).expect(200);
    expect(other.body).toMatchObject({ state: 'measured', maker: { id: makers[2]!.id } });
    for (const key of ['verdict', 'trimmed', 'accepted', 'decision', 'latest', 'photoEstimate'])
      expect(other.body).not.toHaveProperty(key);
    expect(other.body.times.trimmed).toBeNull();
  });

  it('leaves other makers’ verdicts out of the activity list, keeping the lines', async () => {
    type Line = { kind: string; subject: { userId: number } | null; detail: Record<string, unknown> };
    const lines = (await roles.member.agent.get(`/api/swaps/${swapId}/activity?limit=100`).expect(200)).body as Line[];
    const measured = lines.filter((l) => l.kind === 'block.measured');
    expect(measured.length).toBeGreaterThanOrEqual(3);
    for (const line of measured) {
      if (line.subject?.userId === roles.member.id) expect(line.detail.verdict).toBe('short');
      else expect(line.detail).not.toHaveProperty('verdict');
    }
    const officers = (await roles.coordinator.agent.get(`/api/swaps/${swapId}/activity?limit=100`).expect(200)).body as Line[];
    expect(officers.filter((l) => l.kind === 'block.measured').every((l) => typeof l.detail.verdict === 'string')).toBe(true);
  });

  it('always shows officers every verdict', async () => {
    for (const officer of [roles.coordinator, roles.admin]) {
      const roster = await rosterOf(officer.agent);
      expect(rowOf(roster, makers[2]!.id).blocks[0]).toMatchObject({ verdict: 'trim', trimmed: false });
      expect(rowOf(roster, roles.member.id).verdicts).toMatchObject({ short: 1 });
      const block = await officer.agent.get(`/api/blocks/${blockIds[0]}`).expect(200);
      expect(block.body.verdict).toBe('short');
    }
  });

  it('lets only admins change the setting, and only to a known value', async () => {
    await roles.member.agent.patch(`/api/guilds/${roles.guildId}`).send({ verdictsVisibleTo: 'guild' }).expect(403);
    const bad = await roles.admin.agent.patch(`/api/guilds/${roles.guildId}`).send({ verdictsVisibleTo: 'everyone' }).expect(400);
    expect(bad.body.error.fields).toHaveProperty('verdictsVisibleTo');
  });

  it('shows every member all verdicts once the guild chooses so', async () => {
    const changed = await roles.admin.agent
      .patch(`/api/guilds/${roles.guildId}`)
      .send({ verdictsVisibleTo: 'guild' })
      .expect(200);
    expect(changed.body.verdictsVisibleTo).toBe('guild');
    const roster = await rosterOf(roles.member.agent);
    expect(rowOf(roster, makers[1]!.id)).toMatchObject({ verdicts: { true: 1 }, accepted: 1 });
    expect(rowOf(roster, makers[2]!.id).blocks[0]).toMatchObject({ verdict: 'trim', trimmed: false, acceptedByDecision: false });
    const other = await roles.member.agent.get(`/api/blocks/${blockIds[2]}`).expect(200);
    expect(other.body).toMatchObject({ verdict: 'trim', accepted: false });

    await roles.admin.agent.patch(`/api/guilds/${roles.guildId}`).send({ verdictsVisibleTo: 'officers' }).expect(200);
    expect(rowOf(await rosterOf(roles.member.agent), makers[1]!.id)).not.toHaveProperty('verdicts');
  });

  it('leaves the verdicts out of the blocks another maker sewed for a member, until the guild shows them to all', async () => {
    const returned = await sewingSwap(app, roles, { pledges: [1, 1] });
    const id = returned.swap.id;
    await move(roles.coordinator.agent, id, 'collecting');
    for (const maker of returned.makers) {
      const [block] = await myBlocks(maker.agent, id);
      await receiveAndMeasure(roles.coordinator.agent, block!.id, { width: 9.5, height: 9.5 });
    }
    await move(roles.coordinator.agent, id, 'sorting');
    const plan = await roles.coordinator.agent.post(`/api/swaps/${id}/distribution/plan`).expect(200);
    const transfers = (plan.body.transfers as { from: number; to: number | null; count: number }[]).map(
      ({ from, to, count }) => ({
        from,
        to,
        count,
      }),
    );
    await roles.coordinator.agent.post(`/api/swaps/${id}/distribution/confirm`).send({ transfers }).expect(200);
    const receiver = returned.makers[0]!;
    const incoming = async () =>
      (await receiver.agent.get(`/api/swaps/${id}/blocks?recipient=me`).expect(200)).body as Record<string, unknown>[];

    const hidden = await incoming();
    expect(hidden).toHaveLength(1);
    expect(hidden[0]).toMatchObject({ maker: { id: returned.makers[1]!.id }, state: 'returned' });
    expect(hidden[0]).not.toHaveProperty('verdict');

    await roles.admin.agent.patch(`/api/guilds/${roles.guildId}`).send({ verdictsVisibleTo: 'guild' }).expect(200);
    expect((await incoming())[0]).toMatchObject({ verdict: 'true' });
    await roles.admin.agent.patch(`/api/guilds/${roles.guildId}`).send({ verdictsVisibleTo: 'officers' }).expect(200);
    expect((await incoming())[0]).not.toHaveProperty('verdict');
  });
});
