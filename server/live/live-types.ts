import type { Server, Socket } from 'socket.io';
import type { ClientToServerEvents, ServerToClientEvents, SocketData } from '@shared/live-events';

export type LiveServer = Server<ClientToServerEvents, ServerToClientEvents, Record<string, never>, SocketData>;
export type LiveSocket = Socket<ClientToServerEvents, ServerToClientEvents, Record<string, never>, SocketData>;
