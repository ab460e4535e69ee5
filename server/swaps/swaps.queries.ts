/** The swaps feature's hand-written SQL; every value arrives as a bind parameter. */

/**
 * The role of the person `$viewerId` in the guild of the swap aliased `swapAlias`, as a subquery read in
 * the same query as the swap: memberships hold one row per guild and user, and it gives null without
 * an active one.
 */
export const viewerRole = (swapAlias: 'Swap' | 's') =>
  `(SELECT m.role FROM memberships m WHERE m.guild_id = "${swapAlias}"."guild_id" AND m.user_id = $viewerId AND m.status = 'active')`;

/** Active sign-ups, blocks pledged and the pledge of `$userId`, for each swap in `$ids`. */
export const SIGNUP_STATS = `SELECT swap_id, count(*) AS signups, coalesce(sum(blocks), 0) AS pledged,
            coalesce(sum(blocks) FILTER (WHERE user_id = $userId), 0) AS mine
       FROM signups WHERE swap_id = ANY($ids::int[]) AND status = 'active' GROUP BY swap_id`;
