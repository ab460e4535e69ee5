/** The guilds feature's hand-written SQL; every value arrives as a bind parameter. */
import { Guild } from '../db/models';
import { modelColumns, sqlOnce } from '../db/model-columns';

/** How many payments guild $guildId has taken. */
export const PAYMENT_COUNT = 'SELECT count(*)::int AS n FROM payments WHERE guild_id = $guildId';

/**
 * Holds, until the transaction ends, the locks that keep one invitation at a time per guild
 * ($guildKey) and per inviter ($inviterKey).
 */
export const LOCK_INVITATIONS = 'SELECT pg_advisory_xact_lock(hashtext($guildKey)), pg_advisory_xact_lock(hashtext($inviterKey))';

/**
 * The role of a person (the bind parameter `person`, $userId unless named) in the guild whose id is the
 * SQL expression `guildId`, as a subquery read with another row (a swap, a photo, a sew day, a chat room):
 * memberships hold one row per guild and person, and it gives null without an active one.
 */
export const roleIn = (guildId: string, person = '$userId') =>
  `(SELECT m.role FROM memberships m WHERE m.guild_id = ${guildId} AND m.user_id = ${person} AND m.status = 'active')`;

/** The role of $userId in guild $guildId; no row without an active membership. */
export const GUILD_ROLE = `SELECT role FROM memberships WHERE guild_id = $guildId AND user_id = $userId AND status = 'active'`;

/** How many active members the guild aliased g has, as a column. */
const MEMBER_COUNT = `(SELECT count(*) FROM memberships c WHERE c.guild_id = g.id AND c.status = 'active')::int AS "memberCount"`;

/** Guild $guildId with every column (as its attributes) and its active members counted. */
export const guildDetail = sqlOnce(
  () => `SELECT ${modelColumns(Guild, 'g')}, ${MEMBER_COUNT} FROM guilds g WHERE g.id = $guildId`,
);

/** The guilds $userId is an active member of, by name, each with its role there and its members counted. */
export const myGuilds = sqlOnce(
  () => `SELECT ${modelColumns(Guild, 'g')}, m.role AS "myRole", ${MEMBER_COUNT}
    FROM memberships m JOIN guilds g ON g.id = m.guild_id
   WHERE m.user_id = $userId AND m.status = 'active'
   ORDER BY g.name, g.id`,
);

/** Guild $guildId's active members by name, with the date each joined. */
export const MEMBER_LIST = `SELECT u.id AS "userId", u.display_name AS "displayName", u.email, m.role, m.created_at AS "joinedAt"
    FROM memberships m JOIN users u ON u.id = m.user_id
   WHERE m.guild_id = $guildId AND m.status = 'active'
   ORDER BY u.display_name, u.id`;
