import type { Role } from '@shared/schemas/guilds';
import { ChatRoom } from '../db/models';
import { NotFoundError } from '../http/errors';
import { assertGuildRole, can } from '../guilds/guilds.policy';
import { buildFromRow } from '../db/model-columns';
import { preparedPoolQuery } from '../db/prepared';
import type { AppDeps } from '../deps';
import { roomWithAccess } from './chat.queries';

export interface RoomAccess {
  room: ChatRoom;
  role: Role;
  /** the sew day's or swap's title, as the room is headed */
  title: string;
  canPost: boolean;
  canModerate: boolean;
}

/** A row of `roomWithAccess`: the room's columns, then what deciding access needs. */
type RoomRow = Record<string, unknown> & {
  viewerRole: Role | null;
  sewDayTitle: string | null;
  swapTitle: string | null;
  swapState: string | null;
};

/** What a room is headed: its sew day's or swap's title. */
export function roomTitle(kind: ChatRoom['kind'], title: string | null): string {
  if (kind === 'sewday') return title ?? 'Sew day';
  if (kind === 'swap') return title ?? 'Swap';
  return 'Chat';
}

/** What a role may do in a room. */
export const roomRights = (role: Role) => ({ canPost: can(role, 'chat:post'), canModerate: can(role, 'chat:moderate') });

/**
 * Any active member of the room's guild may read and post; admins also moderate. A swap's room
 * follows the swap's own visibility (a draft is for its officers only), and a hidden swap behind a room
 * reads as a missing room (or message), never as a swap. One statement (`roomWithAccess`).
 */
export async function authorizeRoom(
  deps: Pick<AppDeps, 'pool'>,
  userId: number,
  roomId: number,
  missing = 'That chat room does not exist.',
): Promise<RoomAccess> {
  const [row] = await preparedPoolQuery<RoomRow>(deps.pool, roomWithAccess(), { roomId, userId });
  if (!row) throw new NotFoundError('That chat room does not exist.');
  const { viewerRole, sewDayTitle, swapTitle, swapState, ...values } = row;
  const room = buildFromRow(ChatRoom, values);
  const role = assertGuildRole(viewerRole, 'guild:read', missing);
  if (room.kind === 'swap' && (swapState === null || (swapState === 'draft' && !can(role, 'swaps:manage')))) {
    throw new NotFoundError(missing);
  }
  const title = roomTitle(room.kind, room.kind === 'swap' ? swapTitle : sewDayTitle);
  return { room, role, title, ...roomRights(role) };
}
