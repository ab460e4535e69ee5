import type { ErrorRequestHandler, RequestHandler } from 'express';
import { BaseError, ConnectionError, DatabaseError, ValidationError as SequelizeValidationError } from 'sequelize';
import type { Logger } from '../logger';
import { AppError, NotFoundError } from './errors';
import { loggedUrl } from './request-log';

export const apiNotFound: RequestHandler = (req) => {
  throw new NotFoundError(`There is no API route ${req.method} ${req.originalUrl.split('?')[0]}.`);
};

const connectionCodes = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', '57P01', '57P03', '08006', '08001', '08003']);

function isDatabaseDown(error: unknown): boolean {
  if (error instanceof ConnectionError) return true;
  const code = (error as { code?: string; parent?: { code?: string } })?.parent?.code ?? (error as { code?: string })?.code;
  return typeof code === 'string' && connectionCodes.has(code);
}

/** The one place errors become answers: JSON `{ error: { code, message, fields? } }`, never a stack. */
export function errorMiddleware(logger: Logger): ErrorRequestHandler {
  return (error: unknown, req, res, next) => {
    if (res.headersSent) return next(error);
    let status = 500;
    let body: { code: string; message: string; fields?: Record<string, string> } = {
      code: 'internal',
      message: 'Something went wrong on our side. Nothing you entered was lost; please try again.',
    };
    const httpError = error as { status?: number; statusCode?: number; type?: string; expose?: boolean; message?: string };
    if (error instanceof AppError) {
      status = error.status;
      body = { code: error.code, message: error.message, ...(error.fields ? { fields: error.fields } : {}) };
      // Errors that know when to come back (busy, rate limited) say so in the standard header too.
      const retryAfter = (error as { retryAfterSeconds?: unknown }).retryAfterSeconds;
      if (typeof retryAfter === 'number' && retryAfter > 0) res.set('Retry-After', String(Math.ceil(retryAfter)));
    } else if (isDatabaseDown(error)) {
      status = 503;
      body = { code: 'unavailable', message: 'The database is not reachable right now. Please try again in a moment.' };
    } else if (httpError?.type === 'entity.parse.failed') {
      status = 400;
      body = { code: 'bad_json', message: 'The request body is not valid JSON.' };
    } else if (httpError?.type === 'entity.too.large') {
      status = 413;
      body = { code: 'too_large', message: 'The request is too large.' };
    } else if (httpError?.expose && (httpError.status ?? httpError.statusCode ?? 500) < 500) {
      status = httpError.status ?? httpError.statusCode ?? 400;
      body = { code: 'bad_request', message: httpError.message ?? 'The request could not be read.' };
    } else if (error instanceof SequelizeValidationError || error instanceof DatabaseError || error instanceof BaseError) {
      status = 500;
    }
    // A deliberate "busy, come back in N seconds" is expected under load, not a failure of ours.
    if (res.get('Retry-After') && status === 503)
      logger.warn({ code: body.code, url: loggedUrl(req.originalUrl), method: req.method }, 'asked to retry later');
    else if (status >= 500) logger.error({ err: error, url: loggedUrl(req.originalUrl), method: req.method }, 'request failed');
    res.status(status).json({ error: body });
  };
}
