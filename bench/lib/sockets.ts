/** socket.io clients for the live benchmarks: one signed-in websocket each, and acknowledged requests. */
import { io as connectClient, type Socket } from 'socket.io-client';
import type { Ack, ClientToServerEvents, ServerToClientEvents } from '../../shared/live-events';

export type LiveClient = Socket<ServerToClientEvents, ClientToServerEvents>;

/** A websocket to the app at `url` with the session `cookie`, no reconnection, resolved once connected. */
export function connect(url: string, cookie: string): Promise<LiveClient> {
  const socket: LiveClient = connectClient(url, {
    transports: ['websocket'],
    extraHeaders: { cookie },
    reconnection: false,
    forceNew: true,
  });
  return new Promise((resolve, reject) => {
    socket.once('connect', () => resolve(socket));
    socket.once('connect_error', reject);
  });
}

/** Sends `event` and resolves with the acknowledgement's data (rejects with its error). */
export function ask<T>(socket: LiveClient, event: keyof ClientToServerEvents, payload: unknown): Promise<T> {
  return new Promise((resolve, reject) => {
    (socket.emit as (e: string, p: unknown, cb: (a: Ack<T>) => void) => void)(event, payload, (answer) =>
      'error' in answer ? reject(new Error(answer.error.message)) : resolve(answer.data),
    );
  });
}
