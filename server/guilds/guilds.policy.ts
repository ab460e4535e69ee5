import type { Role } from '@shared/schemas/guilds';
import { Membership } from '../db/models';
import { ForbiddenError, NotFoundError } from '../http/errors';

/** Everything a guild role may do. Anything not listed is denied. */
export const guildPermissions = {
  'guild:read': ['admin', 'coordinator', 'member'],
  'guild:update': ['admin'],
  'members:read': ['admin', 'coordinator', 'member'],
  'members:manage': ['admin'],
  'invitations:read': ['admin', 'coordinator'],
  'invitations:create': ['admin', 'coordinator'],
  'invitations:create-officer': ['admin'],
  'swaps:read': ['admin', 'coordinator', 'member'],
  'swaps:manage': ['admin', 'coordinator'],
  'swaps:join': ['admin', 'coordinator', 'member'],
  'sewdays:read': ['admin', 'coordinator', 'member'],
  'sewdays:manage': ['admin', 'coordinator'],
  'chat:post': ['admin', 'coordinator', 'member'],
  'chat:moderate': ['admin'],
  'mail:read-log': ['admin'],
  'photos:read': ['admin', 'coordinator', 'member'],
  'photos:manage': ['admin', 'coordinator'],
  'intake:run': ['admin', 'coordinator'],
  'payments:pay': ['admin', 'coordinator', 'member'],
  /** The treasurer's work: every payment, exports, refunds, dues and currency. */
  'payments:manage': ['admin'],
} as const satisfies Record<string, readonly Role[]>;

export type GuildAction = keyof typeof guildPermissions;

export function can(role: Role | null | undefined, action: GuildAction): boolean {
  if (!role) return false;
  return (guildPermissions[action] as readonly Role[]).includes(role);
}

/**
 * Checks an action against the caller's role in the guild. Someone outside the guild (no active
 * membership) gets the same 404 as for an id that does not exist, with the same `missing` message,
 * so ids cannot be probed for existence; a member whose role falls short gets 403.
 */
export function assertGuildRole(
  role: Role | null | undefined,
  action: GuildAction,
  missing = 'That guild does not exist.',
): Role {
  if (!role) throw new NotFoundError(missing);
  if (!can(role, action)) throw new ForbiddenError();
  return role;
}

/** Loads the caller's active membership and checks the action; throws 403 otherwise. */
export async function authorizeGuild(
  userId: number,
  guildId: number,
  action: GuildAction,
  missing?: string,
): Promise<Membership> {
  const membership = await Membership.findOne({ where: { userId, guildId, status: 'active' } });
  assertGuildRole(membership?.role, action, missing);
  return membership!;
}
