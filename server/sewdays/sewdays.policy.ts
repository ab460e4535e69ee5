import { SewDay } from '../db/models';
import { NotFoundError } from '../http/errors';
import { assertGuildRole, can, findWithGuildRole, type GuildAccess } from '../guilds/guilds.policy';
import type { AppDeps } from '../deps';

export type SewDayAction = 'sewdays:read' | 'sewdays:manage';

const MISSING_SEW_DAY = 'That sew day does not exist.';

/**
 * Loads the sew day with the caller's role in its guild (one statement) and checks `action`: 404 for
 * a sew day that does not exist or belongs to a guild the caller is not in, 403 short of the role.
 */
export async function authorizeSewDay(
  deps: Pick<AppDeps, 'pool'>,
  userId: number,
  sewDayId: number,
  action: SewDayAction,
): Promise<{ sewDay: SewDay; membership: GuildAccess }> {
  const read = await findWithGuildRole(deps, SewDay, sewDayId, userId);
  if (!read) throw new NotFoundError(MISSING_SEW_DAY);
  return { sewDay: read.found, membership: { role: assertGuildRole(read.role, action, MISSING_SEW_DAY) } };
}

export const canManageSewDays = (membership: GuildAccess) => can(membership.role, 'sewdays:manage');
