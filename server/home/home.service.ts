import type { NextForMeDto, OfficerSwap } from '@shared/schemas/home';
import type { AppDeps } from '../deps';
import { authorizeRoom } from '../chat/chat.policy';
import * as q from './home.queries';

const guild = (r: { guild_id: number; guild_name: string; time_zone: string }) => ({
  guildId: r.guild_id,
  guildName: r.guild_name,
  timeZone: r.time_zone,
});
const iso = (d: Date) => new Date(d).toISOString();
const officerSwap = (r: q.SwapCountRow): OfficerSwap => ({
  ...guild(r),
  swapId: r.swap_id,
  swapTitle: r.swap_title,
  count: Number(r.count),
  dueAt: iso(r.due_at),
});

/**
 * What is next for one person across all their guilds: blocks still owed (per swap, soonest due first),
 * swaps open for sign-up, each guild's next sew day with their answer, blocks coming back to them, chat
 * rooms with messages since they last looked, and for officers the blocks waiting to be received and the
 * swaps past their due date. Seven small reads, each bounded, in one round trip.
 */
export async function nextForMe(deps: Pick<AppDeps, 'pool'>, userId: number): Promise<NextForMeDto> {
  const { owed, open, days, back, rooms, toReceive, overdue } = await q.homeReads(deps.pool, userId);
  const bySwap = new Map<number, NextForMeDto['blocksOwed'][number]>();
  for (const r of owed) {
    const swap = bySwap.get(r.swap_id) ?? {
      ...guild(r),
      swapId: r.swap_id,
      swapTitle: r.swap_title,
      dueAt: iso(r.due_at),
      blocks: [],
    };
    swap.blocks.push({ id: r.block_id, sequence: r.sequence, state: r.state });
    bySwap.set(r.swap_id, swap);
  }
  return {
    blocksOwed: [...bySwap.values()],
    openSwaps: open.map((r) => ({
      ...guild(r),
      swapId: r.swap_id,
      swapTitle: r.swap_title,
      signupClosesAt: iso(r.signup_closes_at),
      pledged: r.pledged,
    })),
    sewDays: days.map((r) => ({
      ...guild(r),
      sewDayId: r.sew_day_id,
      title: r.title,
      startsAt: iso(r.starts_at),
      endsAt: iso(r.ends_at),
      answer: r.answer,
    })),
    comingBack: back.map((r) => ({ ...guild(r), swapId: r.swap_id, swapTitle: r.swap_title, count: Number(r.count) })),
    unreadRooms: rooms.map((r) => ({
      ...guild(r),
      roomId: r.room_id,
      kind: r.kind,
      ownerId: r.owner_id,
      title: r.title,
      unread: Number(r.unread),
    })),
    officer: { toReceive: toReceive.map(officerSwap), overdue: overdue.map(officerSwap) },
  };
}

/** Notes that the person has seen a chat room's messages up to now; only someone who may read the room can. */
export async function markRoomSeen(
  deps: Pick<AppDeps, 'sequelize' | 'pool'>,
  userId: number,
  roomId: number,
): Promise<{ roomId: number; seenAt: string }> {
  await authorizeRoom(deps, userId, roomId);
  return { roomId, seenAt: (await q.markRoomSeen(deps.sequelize, roomId, userId)).toISOString() };
}
