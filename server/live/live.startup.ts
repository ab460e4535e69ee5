import { Server } from 'socket.io';
import type { FeatureStartup } from '../features';
import type { AppDeps } from '../deps';
import type { LiveServer, LiveSocket } from './live-types';
import { attachLiveAuth, endAtSessionExpiry, socketSessionId } from './live-auth';
import { Presence } from './presence';
import { guildPrefix, sessionRoom, userRoom } from './rooms';
import { liveAdapter } from './live-adapter';

export interface LiveContext {
  io: LiveServer;
  deps: AppDeps;
  presence: Presence;
}

/** A live part that adds its socket handlers and domain-event subscriptions. */
export interface LivePart {
  onConnection?(ctx: LiveContext, socket: LiveSocket): void;
  /** May return what to close when the app stops: after the sockets are gone, before the adapter is. */
  start?(ctx: LiveContext): void | (() => Promise<void>);
}

/**
 * The socket.io server: shares the HTTP session, keeps rooms in step across app nodes through the
 * PostgreSQL adapter (LISTEN/NOTIFY, large payloads in socket_io_attachments), and hosts the live parts.
 * The adapter is patched (patches/): a large message's notice names its namespace, so the node that sent
 * it does not read its own payload back.
 */
export function liveStartup(parts: LivePart[]): FeatureStartup {
  return async ({ server, deps, built }) => {
    const io: LiveServer = new Server(server, {
      serveClient: false,
      maxHttpBufferSize: 64 * 1024,
      adapter: liveAdapter(deps.pool, (err) => deps.logger.warn({ err }, 'socket.io adapter error')),
    });
    attachLiveAuth(io, deps, built);
    const presence = new Presence(io, deps.logger);
    const ctx: LiveContext = { io, deps, presence };

    // Someone removed from a guild leaves its rooms on every node at once.
    deps.events.on('member.removed', async ({ guildId, userId }) => {
      const sockets = await io.in(userRoom(userId)).fetchSockets();
      for (const socket of sockets) {
        for (const room of socket.rooms) if (room.startsWith(guildPrefix(guildId))) socket.leave(room);
      }
      io.to(userRoom(userId)).emit('guild:left', { guildId });
    });

    // A session ended on any node (sign-out, password reset or change): its sockets close on every node
    // at once, through the adapter, so nothing more reaches whoever held it.
    deps.events.on('session.ended', async ({ sessionIds }) => {
      for (const sid of sessionIds) io.in(sessionRoom(sid)).disconnectSockets(true);
      // This node forgot the sessions already (createApp); the others forget them on this message.
      io.serverSideEmit('session:forget', { sessionIds });
    });
    deps.events.on('account.changed', ({ userId }) => {
      io.serverSideEmit('session:forget', { userId });
    });
    io.on('session:forget', ({ sessionIds, userId }) => {
      if (sessionIds) built.sessionCache.forget(sessionIds);
      if (userId !== undefined) built.sessionCache.forgetUser(userId);
    });

    const stops = parts.flatMap((part) => part.start?.(ctx) ?? []);
    io.on('connection', (socket) => {
      void socket.join(userRoom(socket.data.user.userId));
      const sid = socketSessionId(socket);
      if (sid) void socket.join(sessionRoom(sid));
      const cancelExpiry = endAtSessionExpiry(socket);
      socket.on('disconnect', cancelExpiry);
      for (const part of parts) part.onConnection?.(ctx, socket);
      socket.on('disconnecting', () => {
        for (const room of socket.rooms) presence.announce(room);
      });
    });

    // Open sockets would hold the HTTP server's close() until they time out: end them first.
    const closeHttp = server.close.bind(server);
    server.close = ((callback?: (err?: Error) => void) => {
      io.local.disconnectSockets(true);
      return closeHttp(callback);
    }) as typeof server.close;

    return {
      name: 'live',
      async close() {
        presence.close();
        io.local.disconnectSockets(true);
        // The parts first: the board still sends the changes it holds to the other nodes.
        for (const stop of stops) await stop();
        await new Promise<void>((resolve) => io.close(() => resolve()));
      },
    };
  };
}
