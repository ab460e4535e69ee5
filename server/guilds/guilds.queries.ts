/** The guilds feature's hand-written SQL; every value arrives as a bind parameter. */

/** How many payments guild $guildId has taken. */
export const PAYMENT_COUNT = 'SELECT count(*)::int AS n FROM payments WHERE guild_id = $guildId';

/**
 * Holds, until the transaction ends, the locks that keep one invitation at a time per guild
 * ($guildKey) and per inviter ($inviterKey).
 */
export const LOCK_INVITATIONS = 'SELECT pg_advisory_xact_lock(hashtext($guildKey)), pg_advisory_xact_lock(hashtext($inviterKey))';

/**
 * The role of $userId in the guild whose id is the SQL expression `guildId`, as a subquery read with
 * another row (a photo, a sew day, a chat room): null without an active membership.
 */
export const roleIn = (guildId: string) =>
  `(SELECT m.role FROM memberships m WHERE m.guild_id = ${guildId} AND m.user_id = $userId AND m.status = 'active')`;

/** The role of $userId in guild $guildId; no row without an active membership. */
export const GUILD_ROLE = `SELECT role FROM memberships WHERE guild_id = $guildId AND user_id = $userId AND status = 'active'`;
