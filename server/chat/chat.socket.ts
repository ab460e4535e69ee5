import { chatRoomRefSchema, type ChatRoomRef } from '@shared/schemas/live';
import { sendMessageSchema } from '@shared/schemas/chat';
import type { ChatJoined } from '@shared/live-events';
import { AppError } from '../http/errors';
import { chatRoom } from '../live/rooms';
import { handle } from '../live/socket-handler';
import { assertSessionLive } from '../live/live-auth';
import type { LiveContext, LivePart } from '../live/live.startup';
import type { LiveSocket } from '../live/live-types';
import { authorizeRoom } from './chat.policy';
import { postMessage } from './chat.service';

const TYPING_EVERY_MS = 2000;

/** Chat over sockets: join a room (membership checked every time), send, typing; and the broadcasts. */
export const chatLive: LivePart = {
  start({ io, deps }) {
    deps.events.on('chat.posted', ({ guildId, roomId, message }) => {
      io.to(chatRoom(guildId, roomId)).emit('message:created', message);
    });
    deps.events.on('chat.changed', ({ guildId, roomId, message }) => {
      io.to(chatRoom(guildId, roomId)).emit('message:updated', message);
    });
  },

  onConnection(ctx: LiveContext, socket: LiveSocket) {
    const { deps, presence } = ctx;
    const { logger } = deps;
    const user = socket.data.user;
    // Rooms this socket joined, by chat room id, so typing needs no database look-up.
    const joined = new Map<number, string>();
    const lastTyping = new Map<number, number>();

    const access = async ({ roomId }: ChatRoomRef) => {
      await assertSessionLive(socket);
      try {
        return await authorizeRoom(deps, user.userId, roomId);
      } catch (error) {
        if (error instanceof AppError) logger.warn({ userId: user.userId, roomId, code: error.code }, 'socket join refused');
        throw error;
      }
    };

    handle(socket, logger, 'chat:join', chatRoomRefSchema, async (ref): Promise<ChatJoined> => {
      const { room } = await access(ref);
      const name = chatRoom(room.guildId, room.id);
      await socket.join(name);
      joined.set(room.id, name);
      presence.announce(name);
      return { viewers: await presence.viewers(name) };
    });

    handle(socket, logger, 'chat:leave', chatRoomRefSchema, async ({ roomId }) => {
      const name = joined.get(roomId);
      if (name) {
        await socket.leave(name);
        joined.delete(roomId);
        presence.announce(name);
      }
      return true as const;
    });

    handle(socket, logger, 'message:send', sendMessageSchema, async ({ roomId, body }) => {
      const roomAccess = await access({ roomId });
      return postMessage(deps, roomAccess, { id: user.userId, displayName: user.displayName }, { body });
    });

    handle(socket, logger, 'typing:start', chatRoomRefSchema, async ({ roomId }) => {
      const name = joined.get(roomId);
      // Typing is only shown in a room this socket joined (and so was allowed into).
      if (!name || !socket.rooms.has(name)) return false;
      const now = Date.now();
      if (now - (lastTyping.get(roomId) ?? 0) < TYPING_EVERY_MS) return false;
      lastTyping.set(roomId, now);
      socket.to(name).emit('typing:started', { roomId, user });
      return true;
    });
  },
};
