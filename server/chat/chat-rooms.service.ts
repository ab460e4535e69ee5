import type { ChatRoomDto } from '@shared/schemas/chat';
import { ChatRoom, SewDay, Swap } from '../db/models';
import { can } from '../guilds/guilds.policy';
import { canReadSwap } from '../swaps/swaps.policy';
import { authorizeGuild } from '../guilds/guilds.policy';
import type { RoomAccess } from './chat.policy';
import type { AppDeps } from '../deps';

async function roomTitle(room: ChatRoom): Promise<string> {
  if (room.kind === 'sewday' && room.sewDayId) return (await SewDay.findByPk(room.sewDayId))?.title ?? 'Sew day';
  if (room.kind === 'swap' && room.swapId) return (await Swap.findByPk(room.swapId))?.title ?? 'Swap';
  return 'Chat';
}

export async function roomDto(
  access: Pick<RoomAccess, 'room' | 'canPost' | 'canModerate'>,
  viewerId: number,
): Promise<ChatRoomDto> {
  const { room } = access;
  return {
    id: room.id,
    guildId: room.guildId,
    kind: room.kind,
    title: await roomTitle(room),
    sewDayId: room.sewDayId,
    swapId: room.swapId,
    canPost: access.canPost,
    canModerate: access.canModerate,
    viewerId,
  };
}

/** The swap's chat room, opened the first time anyone asks for it (two people asking at once get the same room). */
export async function swapRoom(deps: Pick<AppDeps, 'sequelize' | 'pool'>, userId: number, swapId: number): Promise<ChatRoomDto> {
  const { swap } = await canReadSwap(deps, userId, swapId);
  const membership = await authorizeGuild(userId, swap.guildId, 'guild:read');
  await deps.sequelize.query(
    `INSERT INTO chat_rooms (guild_id, kind, swap_id, created_at, updated_at) VALUES ($guildId, 'swap', $swapId, now(), now())
     ON CONFLICT (swap_id) DO NOTHING`,
    { bind: { guildId: swap.guildId, swapId } },
  );
  const room = await ChatRoom.findOne({ where: { swapId } });
  return roomDto(
    { room: room!, canPost: can(membership.role, 'chat:post'), canModerate: can(membership.role, 'chat:moderate') },
    userId,
  );
}
