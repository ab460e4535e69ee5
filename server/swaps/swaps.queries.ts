/** The swaps feature's hand-written SQL; every value arrives as a bind parameter. */
import { Swap } from '../db/models';
import { modelColumns, sqlOnce } from '../db/model-columns';
import { roleIn } from '../guilds/guilds.queries';
import type { SwapReadExtra } from './swaps.policy';

/** The role of the person `$viewerId` in the guild of the swap aliased `swapAlias`, read in the same query as the swap. */
export const viewerRole = (swapAlias: 'Swap' | 's') => roleIn(`"${swapAlias}"."guild_id"`, '$viewerId');

/**
 * Every column of the swap aliased "Swap", named as its attributes, so a row builds the instance as
 * findByPk would.
 */
export const swapColumns = () => modelColumns(Swap, '"Swap"');

/**
 * Swap $1 with every column aliased to its attribute name (the row findByPk would read), the role of $2
 * in its guild as "viewerRole" and the guild's verdict setting as "guildVerdictsVisibleTo" (a member's
 * board and activity list depend on it), numbered for a named statement on the plain pool.
 */
export const swapWithViewerRole = sqlOnce(() =>
  `SELECT ${swapColumns()}, ${viewerRole('Swap')} AS "viewerRole",
                   (SELECT g.verdicts_visible_to FROM guilds g WHERE g.id = "Swap"."guild_id") AS "guildVerdictsVisibleTo"
            FROM swaps "Swap" WHERE "Swap"."id" = $swapId`
    .replaceAll('$swapId', '$1')
    .replaceAll('$viewerId', '$2'),
);

/**
 * Active sign-ups, blocks pledged and the pledge of `$userId` for the swap whose id is the SQL
 * expression `swapId`: one row, zeros where nobody has signed up. Read as a LATERAL beside the swap.
 */
export const signupTally = (swapId: string) => `SELECT count(*) AS signups, coalesce(sum(blocks), 0) AS pledged,
            coalesce(sum(blocks) FILTER (WHERE user_id = $userId), 0) AS mine
       FROM signups WHERE swap_id = ${swapId} AND status = 'active'`;

/**
 * Guild $guildId's swaps with every column (as swapColumns) and their sign-up tallies, newest first;
 * drafts only where $withDrafts. The guild's swap list, in one statement.
 */
export const swapList = sqlOnce(
  () => `SELECT ${swapColumns()}, t.signups, t.pledged, t.mine
    FROM swaps "Swap"
    CROSS JOIN LATERAL (${signupTally('"Swap".id')}) t
   WHERE "Swap".guild_id = $guildId AND ($withDrafts OR "Swap".state <> 'draft')
   ORDER BY "Swap".created_at DESC, "Swap".id DESC`,
);

/**
 * How many active members of guild $guildId would get swap $swapId's announcement: not announced to
 * before, and not switched off.
 */
export const ANNOUNCEMENT_AUDIENCE = `SELECT count(*) AS n FROM memberships m
      WHERE m.guild_id = $guildId AND m.status = 'active'
        AND NOT EXISTS (SELECT 1 FROM mail_messages mm WHERE mm.idempotency_key = 'swap:' || $swapId || ':announcement:user:' || m.user_id)
        AND NOT EXISTS (SELECT 1 FROM mail_preferences p WHERE p.user_id = m.user_id AND p.category = 'announcements' AND p.enabled = false)`;

/** Swap $swapId's blocks counted by state, verdict and whether trimmed. */
export const BLOCK_STATE_COUNTS = `SELECT state, verdict, trimmed, count(*) AS n FROM blocks WHERE swap_id = $swapId GROUP BY state, verdict, trimmed`;

/**
 * Swap $1's state changes, oldest first, each as one JSON value with the name of who made it, read
 * with the swap policy's query in the same message (`SwapReadExtra`): none unless $2 has a role in the
 * swap's guild. The policy still decides on the swap's row. Every swap page shows them.
 */
export const TRANSITIONS_WITH_SWAP: SwapReadExtra = {
  name: 'transitions_for_viewer',
  column: 'transition',
  rows: `SELECT json_build_object('id', t.id, 'from', t.from_state, 'to', t.to_state, 'byId', u.id, 'byName', u.display_name,
                           'at', t.at, 'reason', t.reason) AS transition
           FROM swap_transitions t LEFT JOIN users u ON u.id = t.by_id
          WHERE t.swap_id = $1 AND EXISTS (SELECT 1 FROM swaps "Swap" WHERE "Swap"."id" = $1 AND ${viewerRole('Swap')} IS NOT NULL)
          ORDER BY t.at, t.id`.replaceAll('$viewerId', '$2'),
};
