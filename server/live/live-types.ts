import type { Server, Socket } from 'socket.io';
import type { BoardChange, ClientToServerEvents, ServerToClientEvents, SocketData } from '@shared/live-events';

/** Messages between app nodes (through the PostgreSQL adapter), never seen by a browser. */
export interface InterServerEvents {
  /** A board change, sent once to every other node, which splits it for its own sockets. */
  'board:fanout': (message: { guildId: number; verdictsVisibleTo: string; change: BoardChange }) => void;
  /** Sessions ended (or every session of an account that changed): each node stops trusting its copy. */
  'session:forget': (message: { sessionIds?: string[]; userId?: number }) => void;
}

export type LiveServer = Server<ClientToServerEvents, ServerToClientEvents, InterServerEvents, SocketData>;
export type LiveSocket = Socket<ClientToServerEvents, ServerToClientEvents, InterServerEvents, SocketData>;
