import { SewDay } from '../db/models';
import { NotFoundError } from '../http/errors';
import { authorizeGuild, can } from '../guilds/guilds.policy';
import type { Membership } from '../db/models';

export type SewDayAction = 'sewdays:read' | 'sewdays:manage';

/** Loads the sew day and checks the caller's role in its guild for `action`; 404 or 403 otherwise. */
export async function authorizeSewDay(
  userId: number,
  sewDayId: number,
  action: SewDayAction,
): Promise<{ sewDay: SewDay; membership: Membership }> {
  const sewDay = await SewDay.findByPk(sewDayId);
  if (!sewDay) throw new NotFoundError('That sew day does not exist.');
  const membership = await authorizeGuild(userId, sewDay.guildId, action, 'That sew day does not exist.');
  return { sewDay, membership };
}

export const canManageSewDays = (membership: Membership) => can(membership.role, 'sewdays:manage');
