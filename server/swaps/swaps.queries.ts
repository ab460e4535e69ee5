/** The swaps feature's hand-written SQL; every value arrives as a bind parameter. */

/**
 * The role of the person `$viewerId` in the guild of the swap aliased `swapAlias`, as a subquery read in
 * the same query as the swap: memberships hold one row per guild and user, and it gives null without
 * an active one.
 */
export const viewerRole = (swapAlias: 'Swap' | 's') =>
  `(SELECT m.role FROM memberships m WHERE m.guild_id = "${swapAlias}"."guild_id" AND m.user_id = $viewerId AND m.status = 'active')`;
