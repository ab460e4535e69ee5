import type { IncomingMessage, ServerResponse } from 'node:http';
import type { RequestHandler } from 'express';
import type { BuiltApp } from '../app';
import type { AppDeps } from '../deps';
import { UnauthorizedError } from '../http/errors';
import type { LiveServer, LiveSocket } from './live-types';

type EngineRequest = IncomingMessage & { _query?: Record<string, string>; user?: Express.User };
type EngineMiddleware = (req: EngineRequest, res: ServerResponse, next: (err?: unknown) => void) => void;

// Only the handshake carries the session; later polling requests of the same connection have a sid.
function onlyForHandshake(middleware: RequestHandler): EngineMiddleware {
  return (req, res, next) => {
    if (req._query?.sid === undefined) (middleware as unknown as EngineMiddleware)(req, res, next);
    else next();
  };
}

/** The origins a browser may open a socket from: the public URL, or the host the request was sent to. */
function originAllowed(origin: string | undefined, host: string | undefined, publicUrl: string): boolean {
  if (!origin) return true; // not a browser (tests, tools): the session cookie still decides
  try {
    const url = new URL(origin);
    return url.origin === new URL(publicUrl).origin || url.host === host;
  } catch {
    return false;
  }
}

/**
 * Sockets authenticate with the HTTP session: the express-session and passport middleware run on the
 * handshake, and a socket without a signed-in user is refused (and logged). A cross-site page cannot
 * open a socket with the visitor's cookie: its Origin is checked.
 */
export function attachLiveAuth(io: LiveServer, deps: AppDeps, built: BuiltApp) {
  const { logger, config } = deps;
  io.engine.use(onlyForHandshake(built.sessionMiddleware));
  for (const middleware of built.passportMiddleware) io.engine.use(onlyForHandshake(middleware));

  io.use((socket, next) => {
    const req = socket.request as EngineRequest;
    const ip = socket.handshake.address;
    if (!originAllowed(req.headers.origin, req.headers.host, config.PUBLIC_URL)) {
      logger.warn({ ip, origin: req.headers.origin }, 'socket refused: foreign origin');
      return next(Object.assign(new Error('This page may not open a live connection.'), { data: { code: 'forbidden_origin' } }));
    }
    const user = req.user;
    if (!user) {
      logger.warn({ ip }, 'socket refused: not signed in');
      return next(Object.assign(new Error('Please sign in first.'), { data: { code: 'unauthenticated' } }));
    }
    socket.data.user = { userId: user.id, displayName: user.displayName };
    next();
  });
}

type SessionRequest = EngineRequest & {
  sessionID?: string;
  session?: { cookie?: { expires?: Date | string | null } };
  sessionStore?: { get(sid: string, cb: (err: unknown, session?: { passport?: { user?: unknown } } | null) => void): void };
};

/** The id of the sign-in session a socket was opened with (undefined without one). */
export function socketSessionId(socket: LiveSocket): string | undefined {
  return (socket.request as SessionRequest).sessionID;
}

// setTimeout fires at once for delays past 2^31 - 1 ms (24.8 days); longer waits are taken in steps.
const MAX_TIMER_MS = 2_147_483_647;

/**
 * Closes the socket when its session expires (a session lasts a fixed time from sign-in). Returns a
 * function that cancels the timer, for when the socket goes first.
 */
export function endAtSessionExpiry(socket: LiveSocket): () => void {
  const expires = (socket.request as SessionRequest).session?.cookie?.expires;
  const at = expires ? new Date(expires).getTime() : NaN;
  if (!Number.isFinite(at)) return () => undefined;
  let timer: NodeJS.Timeout;
  const arm = () => {
    const wait = at - Date.now();
    if (wait <= 0) {
      socket.disconnect(true);
      return;
    }
    timer = setTimeout(arm, Math.min(wait, MAX_TIMER_MS));
    timer.unref();
  };
  arm();
  return () => clearTimeout(timer);
}

/**
 * Checks that the session the socket was opened with still belongs to its user (not signed out,
 * not expired). Run before anything that acts as the user; a socket that fails is closed, and the
 * browser reconnects with whatever session it has now.
 */
export async function assertSessionLive(socket: LiveSocket): Promise<void> {
  const req = socket.request as SessionRequest;
  const { sessionID, sessionStore } = req;
  const session =
    sessionID && sessionStore
      ? await new Promise<{ passport?: { user?: unknown } } | null>((resolve, reject) =>
          sessionStore.get(sessionID, (err, s) => (err ? reject(err) : resolve(s ?? null))),
        )
      : null;
  if (session?.passport?.user === socket.data.user.userId) return;
  setTimeout(() => socket.disconnect(true), 50); // after the acknowledgement has gone out
  throw new UnauthorizedError('Your session has ended. Please sign in again.');
}
