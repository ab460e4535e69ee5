/** The guilds feature's hand-written SQL; every value arrives as a bind parameter. */

/** How many payments guild $guildId has taken. */
export const PAYMENT_COUNT = 'SELECT count(*)::int AS n FROM payments WHERE guild_id = $guildId';

/**
 * Holds, until the transaction ends, the locks that keep one invitation at a time per guild
 * ($guildKey) and per inviter ($inviterKey).
 */
export const LOCK_INVITATIONS = 'SELECT pg_advisory_xact_lock(hashtext($guildKey)), pg_advisory_xact_lock(hashtext($inviterKey))';
