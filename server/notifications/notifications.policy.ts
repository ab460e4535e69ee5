/** Who may see what of the mail: a guild's message history (with addresses) is for its admins. */
import { authorizeGuild } from '../guilds/guilds.policy';

/** Throws 403 unless the caller may read the guild's mail history ('mail:read-log': admins). */
export function authorizeMailLog(userId: number, guildId: number) {
  return authorizeGuild(userId, guildId, 'mail:read-log');
}
