import { Router, type Request } from 'express';
import passport from 'passport';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import {
  changePasswordSchema,
  confirmEmailSchema,
  loginSchema,
  profileUpdateSchema,
  registerSchema,
  resetRequestSchema,
  resetSchema,
} from '@shared/schemas/auth';
import { route, runMiddleware } from '../http/route';
import { AppError, UnauthorizedError } from '../http/errors';
import { currentUser, requireUser } from './require-user';
import {
  changePassword,
  confirmSignup,
  endSessions,
  getMe,
  requestPasswordReset,
  requestSignup,
  resetPassword,
  updateProfile,
} from './auth.service';
import type { AppDeps } from '../deps';

function logIn(req: Request, user: Express.User) {
  // passport ≥ 0.6 regenerates the session here, so a planted session id is never promoted.
  return new Promise<void>((resolve, reject) => req.login(user, (err) => (err ? reject(err) : resolve())));
}

function tooMany(message: string) {
  return new AppError(429, 'rate_limited', message);
}

const clientKey = (req: Request) => ipKeyGenerator(req.ip ?? '');

export const SIGNUP_SENT_MESSAGE =
  'Check your inbox: we sent a message to that address. Open the link in it within 24 hours to finish signing up.';

export function authRouter(deps: AppDeps) {
  const router = Router();
  const limits = { standardHeaders: 'draft-8', legacyHeaders: false } as const;

  // Per address and client, so one person cannot lock out another from elsewhere. The address is the
  // validated one (NFKC, trimmed, lower case): spaces or capitals around it are the same address.
  const loginLimiter = rateLimit({
    ...limits,
    windowMs: 15 * 60_000,
    limit: deps.config.LOGIN_RATE_LIMIT,
    keyGenerator: (req) => `${clientKey(req)}|${String((req.body as { email?: unknown }).email)}`,
    handler: (_req, _res, next) => next(tooMany('Too many sign-in attempts. Wait 15 minutes, or reset your password.')),
  });
  // Failed sign-ins per client across every address: one password tried against many accounts.
  const sprayLimiter = rateLimit({
    ...limits,
    windowMs: 15 * 60_000,
    limit: deps.config.LOGIN_IP_RATE_LIMIT,
    skipSuccessfulRequests: true,
    keyGenerator: clientKey,
    handler: (_req, _res, next) => next(tooMany('Too many failed sign-ins from this network. Wait 15 minutes and try again.')),
  });
  const registerLimiter = rateLimit({
    ...limits,
    windowMs: 60 * 60_000,
    limit: deps.config.REGISTER_RATE_LIMIT,
    keyGenerator: clientKey,
    handler: (_req, _res, next) => next(tooMany('Too many new accounts from this network. Try again in an hour.')),
  });
  // Tokens are too long to guess; this only keeps one client from hammering the table.
  const confirmLimiter = rateLimit({
    ...limits,
    windowMs: 15 * 60_000,
    limit: 30,
    keyGenerator: clientKey,
    handler: (_req, _res, next) => next(tooMany('Too many tries with confirmation links. Wait 15 minutes and try again.')),
  });
  const mailLimiter = rateLimit({
    ...limits,
    windowMs: 15 * 60_000,
    limit: 5,
    handler: (_req, _res, next) => next(tooMany('Too many reset requests. Try again in 15 minutes.')),
  });

  router.post(
    '/auth/register',
    registerLimiter,
    route({ body: registerSchema }, async ({ body }, _req, res) => {
      await requestSignup(deps, body);
      // The same words whether or not the address has an account: the mail says which it is.
      res.status(202).json({ message: SIGNUP_SENT_MESSAGE });
    }),
  );

  router.post(
    '/auth/confirm-email',
    confirmLimiter,
    route({ body: confirmEmailSchema }, async ({ body }, req, res) => {
      const { user } = await confirmSignup(deps, body.token);
      await logIn(req, user);
      res.status(201).json(await getMe(deps, user.id));
    }),
  );

  // The limiters key on the validated address, so they run after the body is parsed.
  router.post(
    '/auth/login',
    route({ body: loginSchema }, async (_input, req, res) => {
      await runMiddleware(sprayLimiter, req, res);
      await runMiddleware(loginLimiter, req, res);
      const user = await new Promise<Express.User | false>((resolve, reject) => {
        passport.authenticate('local', (err: unknown, found: Express.User | false) => (err ? reject(err) : resolve(found)))(
          req,
          res,
          reject,
        );
      });
      if (!user) throw new UnauthorizedError('That e-mail and password do not match an account.');
      await logIn(req, user);
      res.json(await getMe(deps, user.id));
    }),
  );

  router.post('/auth/logout', async (req, res) => {
    const sessionId = req.sessionID;
    const userId = req.user?.id;
    await new Promise<void>((resolve, reject) => req.logout((err) => (err ? reject(err) : resolve())));
    await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
    // Sockets opened with this session close on every node, not only at their next action.
    if (userId !== undefined && sessionId) deps.events.emit('session.ended', { userId, sessionIds: [sessionId] });
    res.clearCookie('blockpost.sid');
    res.status(204).end();
  });

  router.post(
    '/auth/reset-request',
    mailLimiter,
    route({ body: resetRequestSchema }, ({ body }, _req, res) => {
      // The mail job looks the address up, so this answer takes the same time either way.
      requestPasswordReset(deps, body.email);
      res.status(202).json({ message: 'If that address has an account, a reset link is on its way.' });
    }),
  );

  router.post(
    '/auth/reset',
    mailLimiter,
    route({ body: resetSchema }, async ({ body }, _req, res) => {
      const userId = await resetPassword(deps, body.token, body.password);
      // Sign out every session of the account: whoever held the old password is out, sockets included.
      await endSessions(deps, userId);
      res.json({ message: 'Your password is changed. Sign in with the new one.' });
    }),
  );

  router.get('/me', requireUser, async (req, res) => {
    const me = await getMe(deps, currentUser(req).id);
    if (!me) throw new UnauthorizedError();
    res.json(me);
  });

  router.patch(
    '/me',
    requireUser,
    route({ body: profileUpdateSchema }, async ({ body }, req, res) => {
      await updateProfile(currentUser(req).id, body);
      deps.events.emit('account.changed', { userId: currentUser(req).id });
      res.json(await getMe(deps, currentUser(req).id));
    }),
  );

  router.post(
    '/me/password',
    requireUser,
    route({ body: changePasswordSchema }, async ({ body }, req, res) => {
      const user = currentUser(req);
      await changePassword(user.id, body.currentPassword, body.newPassword);
      // Every other device is signed out; this one stays.
      const ended = await endSessions(deps, user.id, req.sessionID);
      res.json({ message: 'Your password is changed.', signedOutElsewhere: ended });
    }),
  );

  return router;
}
