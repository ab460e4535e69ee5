import type { ChatRoomDto } from '@shared/schemas/chat';
import { ChatRoom } from '../db/models';
import { canReadSwap } from '../swaps/swaps.policy';
import { buildFromRow } from '../db/model-columns';
import { preparedPoolQuery } from '../db/prepared';
import { roomRights, roomTitle, type RoomAccess } from './chat.policy';
import { swapRoomOpened } from './chat.queries';
import type { AppDeps } from '../deps';

export function roomDto(access: Pick<RoomAccess, 'room' | 'title' | 'canPost' | 'canModerate'>, viewerId: number): ChatRoomDto {
  const { room } = access;
  return {
    id: room.id,
    guildId: room.guildId,
    kind: room.kind,
    title: access.title,
    sewDayId: room.sewDayId,
    swapId: room.swapId,
    canPost: access.canPost,
    canModerate: access.canModerate,
    viewerId,
  };
}

/** The swap's chat room, opened the first time anyone asks for it (two people asking at once get the same room). */
export async function swapRoom(deps: Pick<AppDeps, 'pool'>, userId: number, swapId: number): Promise<ChatRoomDto> {
  const { swap, role } = await canReadSwap(deps, userId, swapId);
  const bind = { guildId: swap.guildId, swapId };
  let [row] = await preparedPoolQuery<Record<string, unknown>>(deps.pool, swapRoomOpened(), bind);
  // Lost a race to open it: the other request's room is committed by now.
  row ??= (await preparedPoolQuery<Record<string, unknown>>(deps.pool, swapRoomOpened(), bind))[0];
  const room = buildFromRow(ChatRoom, row!);
  return roomDto({ room, title: roomTitle('swap', swap.title), ...roomRights(role) }, userId);
}
