import { createHash } from 'node:crypto';
import type { RoomRef } from '@shared/live-events';

/** Rooms are prefixed by their guild, so every room of a guild can be left at once. */
export const guildPrefix = (guildId: number) => `g${guildId}:`;
export const boardRoom = (guildId: number, swapId: number) => `g${guildId}:board:${swapId}`;
/** A board's officers (they see every verdict), and one viewer of a board (they see their own); never shown. */
export const boardOfficersRoom = (guildId: number, swapId: number) => `g${guildId}:board-officers:${swapId}`;
export const boardViewerRoom = (guildId: number, swapId: number, userId: number) =>
  `g${guildId}:board-viewer:${swapId}:${userId}`;
export const chatRoom = (guildId: number, roomId: number) => `g${guildId}:chat:${roomId}`;
export const userRoom = (userId: number) => `user:${userId}`;
/**
 * Every socket opened with one sign-in session: ending the session ends them all, on every node.
 * The name carries a hash of the session id, never the id itself.
 */
export const sessionRoom = (sessionId: string) => `session:${createHash('sha256').update(sessionId).digest('hex').slice(0, 32)}`;

const pattern = /^g(\d+):(board|chat):(\d+)$/;

/** The guild and the public reference of a room name, or null for rooms that are not shown (user rooms). */
export function parseRoom(name: string): { guildId: number; ref: RoomRef } | null {
  const m = pattern.exec(name);
  if (!m) return null;
  const guildId = Number(m[1]);
  const id = Number(m[3]);
  return { guildId, ref: m[2] === 'board' ? { kind: 'board', swapId: id } : { kind: 'chat', roomId: id } };
}
