import type { Request, RequestHandler, Response } from 'express';
import type { Logger } from '../logger';

/** The level of a request's line: error for a 5xx, warn for a 4xx, info otherwise (a request closed early too). */
export function requestLogLevel(statusCode: number): 'error' | 'warn' | 'info' {
  return statusCode >= 500 ? 'error' : statusCode >= 400 ? 'warn' : 'info';
}

/**
 * One log line for each API request, when it ends: its id, method, URL (secrets redacted) and address, the status, and the
 * milliseconds it took; nothing for the client's pages and files. pino writes the line (the logger's
 * redaction applies as to any other), and nothing is built when the line's level is off.
 *
 * Not pino-http: it hangs a child logger, two lists of loggers and two symbols on every request and
 * response whatever the level, so every later middleware meets request objects of another shape, and a
 * measurement went 7–15 % faster without it (bench/compare.ts, docs/benchmarks.md, stop 30), far more
 * than the 2 % its own functions show in a profile.
 */
export function requestLog(logger: Logger): RequestHandler {
  let lastId = 0;
  return (req, res, next) => {
    if (!req.url.startsWith('/api')) return next();
    lastId = (lastId + 1) & 0x7fffffff;
    const id = lastId;
    const startedAt = performance.now();
    // 'close' comes once for every response: after it was sent, or when the connection went first.
    res.on('close', () => logRequest(logger, req, res, id, performance.now() - startedAt));
    next();
  };
}

// Links that carry their own secret: an invitation's token (its path) and a signed unsubscribe token
// (the query). Anyone reading the log could otherwise join the guild or change someone's mail.
const INVITATION_TOKEN = /^(\/api\/invitations\/)[^/?#]+/;
const TOKEN_PARAM = /([?&]token=)[^&#]*/g;
const REDACTED = '[redacted]';

/** The URL as the log keeps it: a request's secrets replaced by `[redacted]`, the rest as it came. */
export function loggedUrl(url: string): string {
  // Most requests carry neither; they pay two searches, not a rewrite.
  if (!url.includes('/invitations/') && !url.includes('token=')) return url;
  return url.replace(INVITATION_TOKEN, `$1${REDACTED}`).replace(TOKEN_PARAM, `$1${REDACTED}`);
}

function logRequest(logger: Logger, req: Request, res: Response, id: number, ms: number) {
  const level = requestLogLevel(res.statusCode);
  if (!logger.isLevelEnabled(level)) return;
  const answered = res.writableFinished;
  logger[level](
    {
      req: { id, method: req.method, url: loggedUrl(req.originalUrl), remoteAddress: req.ip },
      res: { statusCode: res.statusCode },
      responseTime: Math.round(ms),
    },
    answered ? 'request completed' : 'request closed before its answer was sent',
  );
}
