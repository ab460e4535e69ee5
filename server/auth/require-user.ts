import type { Request, RequestHandler } from 'express';
import { UnauthorizedError } from '../http/errors';

export const requireUser: RequestHandler = (req, _res, next) => {
  if (!req.user) throw new UnauthorizedError();
  next();
};

/** The signed-in user; call only behind requireUser. */
export function currentUser(req: Request): Express.User {
  if (!req.user) throw new UnauthorizedError();
  return req.user;
}
