/**
 * A board change reads only the rows it touched and the swap's totals (ROSTER_PART_POSITIONAL, rosterPartFrom); what it
 * reads must be what the whole roster says about those members, for swaps in every state of the
 * demo guild, with a withdrawn sign-up and a member who never signed up among the ones asked for.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { Swap } from '../../server/db/models';
import { seedDemoIfEmpty } from '../../server/seed/demo';
import { buildRoster, rosterPartFrom, type RosterPartRow } from '../../server/board/roster.service';
import { ROSTER_PART_POSITIONAL } from '../../server/board/board.queries';

let app: TestApp;

beforeAll(async () => {
  app = await createTestApp();
  await seedDemoIfEmpty(app.deps.sequelize, { ...app.deps.config, NODE_ENV: 'development' });
}, 120_000);
afterAll(() => app.close());

describe('the rows and totals a board change reads', () => {
  it('agree with the whole roster for every demo swap', async () => {
    const swaps = await Swap.findAll({ order: [['id', 'ASC']] });
    expect(swaps.length).toBeGreaterThan(1);
    // One member of the first swap withdraws: their blocks leave the totals and their row the board.
    const { rows: withdrawn } = await app.deps.pool.query<{ user_id: number }>(
      `UPDATE signups SET status = 'withdrawn'
        WHERE id = (SELECT id FROM signups WHERE swap_id = $1 AND status = 'active' ORDER BY id LIMIT 1)
        RETURNING user_id`,
      [swaps[0]!.id],
    );
    expect(withdrawn).toHaveLength(1);
    const { rows: users } = await app.deps.pool.query<{ id: number }>('SELECT id FROM users ORDER BY id');
    let compared = 0;
    let measured = 0;
    for (const swap of swaps) {
      const whole = await buildRoster(app.deps, swap, { withAddresses: false });
      // Every other member of the roster, the withdrawn one, and every account (most never signed up).
      const asked = [...whole.rows.filter((_, i) => i % 2 === 0).map((r) => r.userId), withdrawn[0]!.user_id];
      // The rows and totals a board change reads for these members (server/board/board-fanout.ts).
      const partFor = async (userIds: number[]) => {
        const { rows } = await app.deps.pool.query({ text: ROSTER_PART_POSITIONAL, values: [swap.id, userIds] });
        return rosterPartFrom(swap, rows[0] as RosterPartRow);
      };
      const part = await partFor(asked);
      expect(part.totals).toEqual(whole.totals);
      expect(part.swap).toEqual(whole.swap);
      expect(part.rows).toEqual(whole.rows.filter((r) => asked.includes(r.userId)));
      const everyone = await partFor(users.map((u) => u.id));
      expect(everyone.rows).toEqual(whole.rows);
      expect(everyone.totals).toEqual(whole.totals);
      compared += whole.rows.length;
      measured += whole.totals.measured;
    }
    expect(compared).toBeGreaterThan(5);
    expect(measured, 'some demo blocks are measured, so verdicts are counted').toBeGreaterThan(0);
  });
});
