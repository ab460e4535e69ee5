import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import express, { type Express, type RequestHandler } from 'express';
import helmet from 'helmet';
import { configurePassport } from './auth/passport';
import { createSessionMiddleware } from './auth/session';
import { SessionCache } from './auth/session-cache';
import { authRouter } from './auth/auth.routes';
import { guildsRouter, invitationsRouter } from './guilds/guilds.routes';
import { healthRouter } from './health.routes';
import { requireCsrfHeader } from './http/csrf';
import { refuseNul } from './http/refuse-nul';
import { requestLog } from './http/request-log';
import { apiNotFound, errorMiddleware } from './http/error-middleware';
import type { AppDeps } from './deps';
import { paymentsWebhookRouter } from './payments/payments.routes';
import { featureRouters } from './features';

export const clientDist = fileURLToPath(new URL('../dist', import.meta.url));

export interface BuiltApp {
  app: Express;
  /** Shared with socket.io so sockets authenticate with the HTTP session. */
  sessionMiddleware: RequestHandler;
  passportMiddleware: RequestHandler[];
  /** This node's short memory of the sessions it read; the live part tells other nodes what to forget. */
  sessionCache: SessionCache;
}

/** Builds the Express app without listening, so tests can drive it with supertest. */
export function createApp(deps: AppDeps): BuiltApp {
  const { config, logger } = deps;
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', config.TRUST_PROXY ? 1 : false);
  app.set('query parser', 'simple');

  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          baseUri: ["'self'"],
          objectSrc: ["'none'"],
          frameAncestors: ["'none'"],
          formAction: ["'self'"],
          scriptSrc: ["'self'"],
          styleSrc: ["'self'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'", 'data:'],
          connectSrc: ["'self'", 'ws:', 'wss:'],
          mediaSrc: ["'self'", 'blob:'],
          workerSrc: ["'self'"],
          manifestSrc: ["'self'"],
          ...(config.PUBLIC_URL.startsWith('https://') ? { upgradeInsecureRequests: [] } : {}),
        },
      },
      strictTransportSecurity: config.PUBLIC_URL.startsWith('https://'),
    }),
  );
  app.use(requestLog(logger));

  const sessionCache = new SessionCache();
  // Forgotten before the answer goes out: the sign-out's or reset's own node never serves it again.
  deps.events.on('session.ended', ({ sessionIds }) => sessionCache.forget(sessionIds));
  deps.events.on('account.changed', ({ userId }) => sessionCache.forgetUser(userId));
  const sessionMiddleware = createSessionMiddleware(config, deps.pool, sessionCache);
  const passport = configurePassport(deps);
  // The session strategy alone: passport's authenticate() gives the request login(), logout() and
  // isAuthenticated() itself (0.5.1 on), so initialize() would only add them to every request again.
  const passportMiddleware = [passport.session()];

  const api = express.Router();
  // Health first: it must answer even when the session store (PostgreSQL) cannot.
  api.use(healthRouter(deps));
  // Signed by the payment service over the raw body: before the JSON parser, the session and CSRF.
  api.use(paymentsWebhookRouter(deps));
  api.use(express.json({ limit: '200kb' }));
  api.use(refuseNul);
  api.use(sessionMiddleware, ...passportMiddleware);
  api.use(requireCsrfHeader);
  api.use(authRouter(deps));
  api.use(invitationsRouter(deps));
  api.use('/guilds', guildsRouter(deps));
  for (const featureRouter of featureRouters) api.use(featureRouter(deps));
  api.use(apiNotFound);
  app.use('/api', api);

  const clientDir = config.CLIENT_DIR ?? clientDist;
  if (config.SERVE_CLIENT && existsSync(clientDir)) {
    app.use(express.static(clientDir, { index: false, maxAge: '1h', setHeaders: cacheHashedAssets }));
    // Client-side routes: every other GET gets the app shell.
    app.get('/{*splat}', (req, res, next) => {
      if (req.path.startsWith('/socket.io')) return next();
      res.set('Cache-Control', 'no-cache').sendFile('index.html', { root: clientDir });
    });
  }

  app.use(errorMiddleware(logger));
  return { app, sessionMiddleware, passportMiddleware, sessionCache };
}

function cacheHashedAssets(res: express.Response, path: string) {
  if (path.includes('/assets/')) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
}
