import { boardRefSchema } from '@shared/schemas/live';
import type { BoardJoined } from '@shared/live-events';
import { AppError } from '../http/errors';
import { canReadSwap } from '../swaps/swaps.policy';
import type { LivePart } from '../live/live.startup';
import { BoardFanout, boardVersion } from './board-fanout';
import type { SwapEvent } from './board-activity';
import { handle } from '../live/socket-handler';
import { assertSessionLive } from '../live/live-auth';
import { createPool } from '../db/pool';
import { boardOfficersRoom, boardRoom, boardViewerRoom } from '../live/rooms';

/** Live swap boards: committed swap events fan out to the swap's room; viewers join with their membership checked. */
export function boardLive(): LivePart {
  return {
    start({ io, deps }) {
      // Two connections of its own, with the plain pool's settings (see BoardFanout.publish).
      const db = createPool(deps.pool.options, deps.logger, 2);
      const board = new BoardFanout(io, deps, db);
      deps.events.onAny((name, payload) => {
        if (typeof (payload as { swapId?: unknown }).swapId !== 'number') return;
        board.push({ name, payload } as SwapEvent);
      });
      return async () => {
        await board.close();
        await db.end();
      };
    },

    onConnection({ deps, presence }, socket) {
      const { logger } = deps;
      const user = socket.data.user;
      /** each joined board's rooms: the board's own first, then the viewer's and (officers) the officers' */
      const joined = new Map<number, string[]>();

      handle(socket, logger, 'board:join', boardRefSchema, async ({ swapId }): Promise<BoardJoined> => {
        await assertSessionLive(socket);
        const access = await canReadSwap(deps, user.userId, swapId).catch((error: unknown) => {
          if (error instanceof AppError) logger.warn({ userId: user.userId, swapId, code: error.code }, 'socket join refused');
          throw error;
        });
        const name = boardRoom(access.swap.guildId, swapId);
        // Join first, then read the number: any later change reaches this socket with a higher one.
        const rooms = [
          name,
          boardViewerRoom(access.swap.guildId, swapId, user.userId),
          ...(access.canManage ? [boardOfficersRoom(access.swap.guildId, swapId)] : []),
        ];
        await socket.join(rooms);
        joined.set(swapId, rooms);
        presence.announce(name);
        const [version, viewers] = await Promise.all([boardVersion(deps.sequelize, swapId), presence.viewers(name)]);
        return { version, viewers };
      });

      handle(socket, logger, 'board:leave', boardRefSchema, async ({ swapId }) => {
        const rooms = joined.get(swapId);
        if (rooms) {
          for (const room of rooms) await socket.leave(room);
          joined.delete(swapId);
          presence.announce(rooms[0]!);
        }
        return true as const;
      });
    },
  };
}
