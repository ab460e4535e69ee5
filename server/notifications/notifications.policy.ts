/** Who may see what of the mail: a guild's message history (with addresses) is for its admins. */
import { authorizeGuild } from '../guilds/guilds.policy';
import type { AppDeps } from '../deps';

/** Throws 403 unless the caller may read the guild's mail history ('mail:read-log': admins). */
export function authorizeMailLog(deps: Pick<AppDeps, 'pool'>, userId: number, guildId: number) {
  return authorizeGuild(deps, userId, guildId, 'mail:read-log');
}
