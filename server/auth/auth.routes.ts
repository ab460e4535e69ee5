import { Router, type Request } from 'express';
import passport from 'passport';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { loginSchema, profileUpdateSchema, registerSchema, resetRequestSchema, resetSchema } from '@shared/schemas/auth';
import { validate } from '../http/validate';
import { AppError, UnauthorizedError } from '../http/errors';
import { currentUser, requireUser } from './require-user';
import { getMe, register, requestPasswordReset, resetPassword, updateProfile } from './auth.service';
import type { AppDeps } from '../deps';

function logIn(req: Request, user: Express.User) {
  // passport ≥ 0.6 regenerates the session here, so a planted session id is never promoted.
  return new Promise<void>((resolve, reject) => req.login(user, (err) => (err ? reject(err) : resolve())));
}

function tooMany(message: string) {
  return new AppError(429, 'rate_limited', message);
}

export function authRouter(deps: AppDeps) {
  const router = Router();

  const loginLimiter = rateLimit({
    windowMs: 15 * 60_000,
    limit: deps.config.LOGIN_RATE_LIMIT,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    // Per address and per client, so one person cannot lock out another from elsewhere.
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${String((req.body as { email?: unknown } | undefined)?.email ?? '').toLowerCase()}`,
    handler: (_req, _res, next) => next(tooMany('Too many sign-in attempts. Wait 15 minutes, or reset your password.')),
  });
  const mailLimiter = rateLimit({
    windowMs: 15 * 60_000,
    limit: 5,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, _res, next) => next(tooMany('Too many reset requests. Try again in 15 minutes.')),
  });

  router.post('/auth/register', validate({ body: registerSchema }), async (req, res) => {
    const user = await register(req.body);
    await logIn(req, user);
    res.status(201).json(await getMe(user.id));
  });

  router.post('/auth/login', loginLimiter, validate({ body: loginSchema }), async (req, res, next) => {
    const user = await new Promise<Express.User | false>((resolve, reject) => {
      passport.authenticate('local', (err: unknown, found: Express.User | false) => (err ? reject(err) : resolve(found)))(req, res, next);
    });
    if (!user) throw new UnauthorizedError('That e-mail and password do not match an account.');
    await logIn(req, user);
    res.json(await getMe(user.id));
  });

  router.post('/auth/logout', async (req, res) => {
    await new Promise<void>((resolve, reject) => req.logout((err) => (err ? reject(err) : resolve())));
    await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
    res.clearCookie('blockpost.sid');
    res.status(204).end();
  });

  router.post('/auth/reset-request', mailLimiter, validate({ body: resetRequestSchema }), async (req, res) => {
    await requestPasswordReset(deps, req.body.email);
    res.status(202).json({ message: 'If that address has an account, a reset link is on its way.' });
  });

  router.post('/auth/reset', mailLimiter, validate({ body: resetSchema }), async (req, res) => {
    const userId = await resetPassword(req.body.token, req.body.password);
    // Sign out every other session of the account: whoever held the old password is out.
    await deps.pool.query(`DELETE FROM session WHERE (sess->'passport'->>'user')::int = $1`, [userId]);
    res.json({ message: 'Your password is changed. Sign in with the new one.' });
  });

  router.get('/me', requireUser, async (req, res) => {
    const me = await getMe(currentUser(req).id);
    if (!me) throw new UnauthorizedError();
    res.json(me);
  });

  router.patch('/me', requireUser, validate({ body: profileUpdateSchema }), async (req, res) => {
    await updateProfile(currentUser(req).id, req.body);
    res.json(await getMe(currentUser(req).id));
  });

  return router;
}
