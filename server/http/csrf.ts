import type { RequestHandler } from 'express';
import { ForbiddenError } from './errors';

export const CSRF_HEADER = 'x-requested-with';
export const CSRF_VALUE = 'blockpost';
const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * CSRF defence on top of SameSite=Lax cookies: a state-changing request must carry a custom header,
 * which a cross-site form cannot send and a cross-site fetch cannot send without a CORS preflight
 * (which this API never grants).
 */
export const requireCsrfHeader: RequestHandler = (req, _res, next) => {
  if (SAFE.has(req.method)) return next();
  // RFC 8058 one-click unsubscribe: mail programs POST here without our header. The signed token in
  // the URL is the only authority (no cookie is used), so a forged request can do no more than the
  // link's own holder could; exactly this route is exempt.
  if (req.method === 'POST' && req.path === '/unsubscribe') return next();
  if (req.get(CSRF_HEADER) !== CSRF_VALUE) {
    throw new ForbiddenError(
      `This request is missing the "X-Requested-With: ${CSRF_VALUE}" header that protects against forged requests.`,
    );
  }
  next();
};
