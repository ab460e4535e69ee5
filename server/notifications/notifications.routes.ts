import { Router } from 'express';
import { z } from 'zod';
import { idParam } from '@shared/schemas/guilds';
import {
  mailLogParamsSchema,
  mailLogQuerySchema,
  unsubscribeQuerySchema,
  updateMailPreferencesSchema,
} from '@shared/schemas/notifications';
import { route } from '../http/route';
import { currentUser, requireUser } from '../auth/require-user';
import type { AppDeps } from '../deps';
import { authorizeMailLog } from './notifications.policy';
import * as notifications from './notifications.service';

const messageParamsSchema = z.object({ guildId: idParam, messageId: idParam });

/** Mail choices, one-click unsubscribe (RFC 8058) and the guild's message history. */
export function notificationsRouter(deps: AppDeps) {
  const router = Router();
  const secret = deps.config.SESSION_SECRET;

  router.get('/me/mail-preferences', requireUser, async (req, res) => {
    res.json(await notifications.getPreferences(deps, currentUser(req).id));
  });

  router.patch(
    '/me/mail-preferences',
    requireUser,
    route({ body: updateMailPreferencesSchema }, async ({ body }, req, res) => {
      res.json(await notifications.updatePreferences(deps, currentUser(req).id, body));
    }),
  );

  // The List-Unsubscribe address opened in a browser: show the confirmation page, change nothing
  // (link scanners and previews fetch with GET).
  router.get(
    '/unsubscribe',
    route({ query: unsubscribeQuerySchema }, ({ query }, _req, res) => {
      res.redirect(303, `/unsubscribe?token=${encodeURIComponent(query.token)}`);
    }),
  );

  router.get(
    '/unsubscribe/info',
    route({ query: unsubscribeQuerySchema }, async ({ query }, _req, res) => {
      res.json(await notifications.unsubscribeInfo(deps, secret, query.token));
    }),
  );

  // One-click: mail programs POST `List-Unsubscribe=One-Click` here with no cookie and no CSRF
  // header (this one route is exempt in http/csrf.ts); the signed token decides who and what.
  router.post(
    '/unsubscribe',
    route({ query: unsubscribeQuerySchema }, async ({ query }, _req, res) => {
      res.json(await notifications.applyUnsubscribe(deps, secret, query.token, false));
    }),
  );

  router.post(
    '/unsubscribe/undo',
    route({ query: unsubscribeQuerySchema }, async ({ query }, _req, res) => {
      res.json(await notifications.applyUnsubscribe(deps, secret, query.token, true));
    }),
  );

  router.get(
    '/guilds/:guildId/mail-messages',
    requireUser,
    route(
      {
        params: mailLogParamsSchema,
        query: mailLogQuerySchema,
        authorize: (req, { params }) => authorizeMailLog(deps, currentUser(req).id, params.guildId),
      },
      async ({ params, query }, _req, res) => {
        res.json(await notifications.mailLog(params.guildId, query));
      },
    ),
  );

  router.get(
    '/guilds/:guildId/mail-messages/:messageId',
    requireUser,
    route(
      {
        params: messageParamsSchema,
        authorize: (req, { params }) => authorizeMailLog(deps, currentUser(req).id, params.guildId),
      },
      async ({ params }, _req, res) => {
        res.json(await notifications.mailMessage(params.guildId, params.messageId));
      },
    ),
  );

  return router;
}
