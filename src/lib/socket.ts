/**
 * The app's one live connection (socket.io), shared by every live feature. It carries the session
 * cookie like any same-origin request; live features re-join their rooms on every (re)connect.
 */
import { useSyncExternalStore } from 'react';
import { io, type Socket } from 'socket.io-client';
import type { Ack, ClientToServerEvents, ServerToClientEvents } from '@shared/live-events';
import { ApiError } from './api-client';

export type AppSocket = Socket<ServerToClientEvents, ClientToServerEvents>;
export type LiveStatus = 'connecting' | 'connected' | 'offline' | 'signed-out';

let socket: AppSocket | null = null;
let status: LiveStatus = 'connecting';
const listeners = new Set<() => void>();

function setStatus(next: LiveStatus) {
  if (status === next) return;
  status = next;
  for (const listener of listeners) listener();
}

/** The shared connection, opened on first use. */
export function getSocket(): AppSocket {
  if (socket && status !== 'signed-out') return socket;
  // A refused connection may be retried after signing in: start afresh.
  socket?.removeAllListeners();
  // WebSocket first (needs no sticky sessions between several app nodes); long-polling if it is blocked.
  const created: AppSocket = io({
    path: '/socket.io',
    transports: ['websocket', 'polling'],
    tryAllTransports: true,
    withCredentials: true,
  });
  created.on('connect', () => setStatus('connected'));
  created.on('disconnect', (reason) => {
    setStatus('offline');
    // A node shutting down closes its sockets; come back (through the load balancer, to any node) shortly.
    if (reason === 'io server disconnect') setTimeout(() => created.connect(), 1000 + Math.random() * 2000);
  });
  created.on('connect_error', (error: Error & { data?: { code?: string } }) => {
    if (error.data?.code === 'unauthenticated') {
      setStatus('signed-out');
      created.disconnect();
    } else setStatus('offline');
  });
  created.io.on('reconnect_attempt', () => setStatus('connecting'));
  socket = created;
  return created;
}

/** Closes the connection (after signing out, so the next one carries the new session). */
export function closeSocket() {
  socket?.disconnect();
  socket = null;
  setStatus('connecting');
}

/** Emits a client event and resolves with its `data`, or rejects with an ApiError like a REST call would. */
export function emitWithAck<T>(event: keyof ClientToServerEvents, payload: unknown, timeoutMs = 8000): Promise<T> {
  const s = getSocket();
  return new Promise((resolve, reject) => {
    const withTimeout = s.timeout(timeoutMs) as unknown as {
      emit(e: string, p: unknown, cb: (err: Error | null, answer: Ack<T>) => void): void;
    };
    withTimeout.emit(event, payload, (err, answer) => {
      if (err)
        return reject(
          new ApiError(
            0,
            'network',
            'The live connection did not answer. Check your connection and try again; nothing you typed is lost.',
          ),
        );
      if ('error' in answer)
        return reject(
          new ApiError(
            answer.error.code === 'rate_limited' ? 429 : 400,
            answer.error.code,
            answer.error.message,
            answer.error.fields,
          ),
        );
      resolve(answer.data);
    });
  });
}

/** The live connection's state, for a small "live" indicator. */
export function useLiveStatus(): LiveStatus {
  return useSyncExternalStore(
    (listener) => {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    () => status,
    () => 'connecting',
  );
}
