import { ChatRoom, type Membership } from '../db/models';
import { NotFoundError } from '../http/errors';
import { authorizeGuild, can } from '../guilds/guilds.policy';
import { canReadSwap } from '../swaps/swaps.policy';
import type { AppDeps } from '../deps';

export interface RoomAccess {
  room: ChatRoom;
  membership: Membership;
  canPost: boolean;
  canModerate: boolean;
}

/** A hidden swap behind a room reads as a missing room (or message), never as a swap. */
const hideMissingSwap = (missing: string) => (error: unknown) => {
  throw error instanceof NotFoundError ? new NotFoundError(missing) : error;
};

/**
 * Any active member of the room's guild may read and post; admins also moderate. A swap's room
 * follows the swap's own visibility (a draft is for its officers only).
 */
export async function authorizeRoom(
  deps: Pick<AppDeps, 'sequelize' | 'pool'>,
  userId: number,
  roomId: number,
  missing = 'That chat room does not exist.',
): Promise<RoomAccess> {
  const room = await ChatRoom.findByPk(roomId);
  if (!room) throw new NotFoundError('That chat room does not exist.');
  const membership = await authorizeGuild(userId, room.guildId, 'guild:read', missing);
  if (room.kind === 'swap' && room.swapId) await canReadSwap(deps, userId, room.swapId).catch(hideMissingSwap(missing));
  return { room, membership, canPost: can(membership.role, 'chat:post'), canModerate: can(membership.role, 'chat:moderate') };
}
