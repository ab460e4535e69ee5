import type { RoomRef } from '@shared/live-events';

/** Rooms are prefixed by their guild, so every room of a guild can be left at once. */
export const guildPrefix = (guildId: number) => `g${guildId}:`;
export const boardRoom = (guildId: number, swapId: number) => `g${guildId}:board:${swapId}`;
export const chatRoom = (guildId: number, roomId: number) => `g${guildId}:chat:${roomId}`;
export const userRoom = (userId: number) => `user:${userId}`;

const pattern = /^g(\d+):(board|chat):(\d+)$/;

/** The guild and the public reference of a room name, or null for rooms that are not shown (user rooms). */
export function parseRoom(name: string): { guildId: number; ref: RoomRef } | null {
  const m = pattern.exec(name);
  if (!m) return null;
  const guildId = Number(m[1]);
  const id = Number(m[3]);
  return { guildId, ref: m[2] === 'board' ? { kind: 'board', swapId: id } : { kind: 'chat', roomId: id } };
}
