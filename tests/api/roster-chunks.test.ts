/**
 * A whole roster is read in chunks of members (board.queries.ts ROSTER_CHUNKS, and beside the swap
 * policy's row for the roster GET): across the chunks' edges every member comes once, in name order,
 * and agrees with the roster read as one array (the board change's statement); a stranger's read
 * brings no member rows at all.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { Swap } from '../../server/db/models';
import { buildRoster, rosterPartFrom, type RosterPartRow } from '../../server/board/roster.service';
import { ROSTER_PART_POSITIONAL, ROSTER_WITH_SWAP } from '../../server/board/board.queries';
import { oneTripRead } from '../../server/db/one-trip';
import { sewingSwap, type Roles } from './swaps-support';
import type { RosterDto } from '@shared/swap-types';

let app: TestApp;
let roles: Roles;

beforeAll(async () => {
  app = await createTestApp();
  roles = await guildWithRoles(app);
});
afterAll(() => app.close());

// More than two chunks of fifty, names in no order and of mixed case, two of them alike.
const EXTRA_MAKERS = 128;

describe('the roster read in chunks', () => {
  it('brings every member once, in name order, as the one-array read does', async () => {
    const { swap } = await sewingSwap(app, roles, { pledges: [2, 3] });
    await app.deps.pool.query(
      `WITH makers AS (
         INSERT INTO users (email, display_name, password_hash, units, created_at, updated_at)
         SELECT 'chunk-' || g || '@example.test',
                CASE WHEN g % 3 = 0 THEN 'quilter ' ELSE 'Quilter ' END || ((g * 37) % 101)::text,
                'not-a-hash', 'in', now(), now()
           FROM generate_series(1, $2::int) g RETURNING id),
       joined AS (INSERT INTO memberships (user_id, guild_id, role, status, created_at, updated_at)
                  SELECT id, $3, 'member', 'active', now(), now() FROM makers),
       pledged AS (INSERT INTO signups (swap_id, user_id, blocks, status, created_at, updated_at)
                   SELECT $1, id, 2, 'active', now(), now() FROM makers)
       INSERT INTO blocks (swap_id, maker_id, sequence, state, trimmed, created_at, updated_at)
       SELECT $1, m.id, seq, 'pledged', false, now(), now() FROM makers m, generate_series(1, 2) seq`,
      [swap.id, EXTRA_MAKERS, roles.guildId],
    );

    const res = await roles.coordinator.agent.get(`/api/swaps/${swap.id}/roster`).expect(200);
    const roster = res.body as RosterDto;
    expect(roster.rows).toHaveLength(EXTRA_MAKERS + 2);
    expect(new Set(roster.rows.map((r) => r.userId)).size).toBe(EXTRA_MAKERS + 2);
    const { rows: users } = await app.deps.pool.query<{ id: number; display_name: string }>(
      `SELECT u.id, u.display_name FROM signups s JOIN users u ON u.id = s.user_id
        WHERE s.swap_id = $1 AND s.status = 'active' ORDER BY lower(u.display_name), u.id`,
      [swap.id],
    );
    expect(roster.rows.map((r) => r.userId)).toEqual(users.map((u) => u.id));
    expect(roster.totals.pledged).toBe(EXTRA_MAKERS * 2 + 5);

    // The board change's statement writes the same members as one array.
    const model = (await Swap.findByPk(swap.id))!;
    const whole = await buildRoster(app.deps, model, { withAddresses: false });
    const { rows } = await app.deps.pool.query({ text: ROSTER_PART_POSITIONAL, values: [swap.id, users.map((u) => u.id)] });
    const asOneArray = rosterPartFrom(model, rows[0] as RosterPartRow);
    expect(whole.rows).toEqual(asOneArray.rows);
    expect(whole.totals).toEqual(asOneArray.totals);
  });

  it('reads no member for someone without a role in the guild', async () => {
    const { swap } = await sewingSwap(app, roles, { pledges: [2, 2] });
    const [swapRows, members] = await oneTripRead(app.deps.pool, [
      { name: 'chunks_test_swap', text: 'SELECT id FROM swaps WHERE id = $1', values: [swap.id] },
      { name: ROSTER_WITH_SWAP.name, text: ROSTER_WITH_SWAP.rows, values: [swap.id, roles.stranger.id] },
    ]);
    expect(swapRows).toEqual([{ id: swap.id }]);
    expect(members).toEqual([]);
    const [, forOfficer] = await oneTripRead(app.deps.pool, [
      { name: 'chunks_test_swap', text: 'SELECT id FROM swaps WHERE id = $1', values: [swap.id] },
      { name: ROSTER_WITH_SWAP.name, text: ROSTER_WITH_SWAP.rows, values: [swap.id, roles.coordinator.id] },
    ]);
    expect(forOfficer).toHaveLength(1);
    await roles.stranger.agent.get(`/api/swaps/${swap.id}/roster`).expect(404);
  });
});
