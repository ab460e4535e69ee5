/**
 * The board's recent activity is told from what is stored: a swap whose history was written without
 * activity lines (the demo guild's) still shows its blocks received and measured, newest first, in
 * pages; a swap run through the API shows each event once.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ActivityDto } from '../../shared/live-events';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { Block } from '../../server/db/models';
import { DEMO_SIGN_INS, seedDemoIfEmpty } from '../../server/seed/demo';
import { activityDtos, activityLinesJson } from '../../server/board/board-activity';
import { RECORD_ACTIVITY } from '../../server/board/board.queries';
import { oneTripTransaction } from '../../server/db/one-trip';
import { receiveAndMeasure, sewingSwap, move, myBlocks } from './swaps-support';

let app: TestApp;
let demoAgent: ReturnType<TestApp['agent']>;

beforeAll(async () => {
  app = await createTestApp();
  // The demo goes in first: it seeds only an empty database.
  await seedDemoIfEmpty(app.deps.sequelize, { ...app.deps.config, NODE_ENV: 'development' });
  demoAgent = app.agent();
  await demoAgent.post('/api/auth/login').send({ email: DEMO_SIGN_INS.emails[2], password: DEMO_SIGN_INS.password }).expect(200);
}, 120_000);
afterAll(() => app.close());

async function activity(agent: ReturnType<TestApp['agent']>, swapId: number, query: string) {
  const res = await agent.get(`/api/swaps/${swapId}/activity?${query}`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as ActivityDto[];
}

/** The demo swap with the most blocks received, which the seed wrote without activity lines. */
async function busiestDemoSwap() {
  const received = await Block.findAll({ where: {}, attributes: ['swapId', 'receivedAt'] });
  const counts = new Map<number, number>();
  for (const b of received) if (b.receivedAt) counts.set(b.swapId, (counts.get(b.swapId) ?? 0) + 1);
  const [swapId, count] = [...counts].sort((a, b) => b[1] - a[1])[0]!;
  return { swapId, count };
}

describe('recent activity from the stored history', () => {
  it('shows a seeded swap’s received and measured blocks, newest first', async () => {
    const { swapId, count } = await busiestDemoSwap();
    expect(count).toBeGreaterThan(0);
    const all = await activity(demoAgent, swapId, 'limit=100');
    const receivedLines = all.filter((a) => a.kind === 'block.changed' && a.detail.to === 'received');
    expect(receivedLines.length).toBe(Math.min(count, all.length));
    expect(all.some((a) => a.kind === 'block.measured' && typeof a.detail.verdict === 'string')).toBe(true);
    expect(all.some((a) => a.kind === 'swap.created')).toBe(true);
    for (const [i, a] of all.entries()) {
      expect(a.swapId).toBe(swapId);
      if (i === 0) continue;
      expect(a.id).toBeLessThan(all[i - 1]!.id);
      expect(Date.parse(a.at)).toBeLessThanOrEqual(Date.parse(all[i - 1]!.at));
    }
    // Block lines carry the block and its number; the received ones name who received it.
    expect(receivedLines.every((a) => a.blockId !== null && typeof a.detail.sequence === 'number' && a.actor)).toBe(true);
  });

  it('pages with before=, the pages together making the whole list', async () => {
    const { swapId } = await busiestDemoSwap();
    const all = await activity(demoAgent, swapId, 'limit=100');
    const paged: ActivityDto[] = [];
    let page = await activity(demoAgent, swapId, 'limit=7');
    while (page.length > 0) {
      expect(page.length).toBeLessThanOrEqual(7);
      paged.push(...page);
      page = await activity(demoAgent, swapId, `limit=7&before=${page.at(-1)!.id}`);
    }
    expect(paged.map((a) => a.id)).toEqual(all.map((a) => a.id));
    expect(await activity(demoAgent, swapId, `before=${all.at(-1)!.id}`)).toEqual([]);
  });

  it('refuses a cursor that is not a whole number, with a clear error', async () => {
    const { swapId } = await busiestDemoSwap();
    const res = await demoAgent.get(`/api/swaps/${swapId}/activity?before=soon`);
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('before');
  });

  it('tells each event of a swap run through the API once, and none twice once lines are kept', async () => {
    const roles = await guildWithRoles(app);
    const { swap } = await sewingSwap(app, roles, { pledges: [2, 1] });
    await move(roles.coordinator.agent, swap.id, 'collecting');
    const [block] = await myBlocks(roles.member.agent, swap.id);
    const measured = await receiveAndMeasure(roles.coordinator.agent, block!.id, { width: '9 1/2', height: '9 1/2' });

    // This app runs without the live board, so no lines were kept: all of it comes from the history.
    const all = await activity(roles.member.agent, swap.id, 'limit=100');
    const kinds = all.map((a) => (a.kind === 'block.changed' ? `${a.kind}:${a.detail.to}` : a.kind));
    expect(kinds).toEqual([
      'block.measured',
      'block.changed:received',
      'block.changed:sewn',
      'swap.transitioned',
      'swap.transitioned',
      'signup.changed',
      'signup.changed',
      'swap.transitioned',
      'swap.created',
    ]);
    expect(all[0]).toMatchObject({ blockId: block!.id, detail: { verdict: measured.verdict, source: 'ruler', sequence: 1 } });

    // The live board keeps a line for the measurement, written with it: that line alone tells it.
    const lines = activityLinesJson([
      {
        name: 'block.measured',
        payload: {
          swapId: swap.id,
          guildId: roles.guildId,
          actorId: roles.coordinator.id,
          blockId: block!.id,
          makerId: roles.member.id,
          measurementId: 0,
          verdict: 'true',
          source: 'ruler',
        },
      },
    ]);
    // As the board fan-out writes it (server/board/board-fanout.ts).
    const [written] = await oneTripTransaction(app.deps.pool, [
      { name: 'test_activity', text: RECORD_ACTIVITY, values: [lines, new Date()] },
    ]);
    const line = activityDtos(written!);
    const now = await activity(roles.member.agent, swap.id, 'limit=100');
    expect(now.map((a) => a.id)).toEqual([line[0]!.id]);
    expect(now[0]).toMatchObject({ kind: 'block.measured', actor: { userId: roles.coordinator.id } });
  });
});
