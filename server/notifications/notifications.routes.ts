import { Router } from 'express';
import { z } from 'zod';
import { idParam } from '@shared/schemas/guilds';
import {
  mailLogParamsSchema, mailLogQuerySchema, unsubscribeQuerySchema, updateMailPreferencesSchema,
} from '@shared/schemas/notifications';
import { validate } from '../http/validate';
import { currentUser, requireUser } from '../auth/require-user';
import type { AppDeps } from '../deps';
import { authorizeMailLog } from './notifications.policy';
import * as notifications from './notifications.service';

const messageParamsSchema = z.object({ guildId: idParam, messageId: idParam });
type TokenQuery = z.infer<typeof unsubscribeQuerySchema>;

/** Mail choices, one-click unsubscribe (RFC 8058) and the guild's message history. */
export function notificationsRouter(deps: AppDeps) {
  const router = Router();
  const secret = deps.config.SESSION_SECRET;

  router.get('/me/mail-preferences', requireUser, async (req, res) => {
    res.json(await notifications.getPreferences(currentUser(req).id));
  });

  router.patch('/me/mail-preferences', requireUser, validate({ body: updateMailPreferencesSchema }), async (req, res) => {
    res.json(await notifications.updatePreferences(currentUser(req).id, req.body));
  });

  // The List-Unsubscribe address opened in a browser: show the confirmation page, change nothing
  // (link scanners and previews fetch with GET).
  router.get('/unsubscribe', validate({ query: unsubscribeQuerySchema }), (req, res) => {
    const { token } = req.query as unknown as TokenQuery;
    res.redirect(303, `/unsubscribe?token=${encodeURIComponent(token)}`);
  });

  router.get('/unsubscribe/info', validate({ query: unsubscribeQuerySchema }), async (req, res) => {
    const { token } = req.query as unknown as TokenQuery;
    res.json(await notifications.unsubscribeInfo(secret, token));
  });

  // One-click: mail programs POST `List-Unsubscribe=One-Click` here with no cookie and no CSRF
  // header (this one route is exempt in http/csrf.ts); the signed token decides who and what.
  router.post('/unsubscribe', validate({ query: unsubscribeQuerySchema }), async (req, res) => {
    const { token } = req.query as unknown as TokenQuery;
    res.json(await notifications.applyUnsubscribe(secret, token, false));
  });

  router.post('/unsubscribe/undo', validate({ query: unsubscribeQuerySchema }), async (req, res) => {
    const { token } = req.query as unknown as TokenQuery;
    res.json(await notifications.applyUnsubscribe(secret, token, true));
  });

  router.get('/guilds/:guildId/mail-messages', requireUser, validate({ params: mailLogParamsSchema, query: mailLogQuerySchema }), async (req, res) => {
    const { guildId } = req.params as unknown as z.infer<typeof mailLogParamsSchema>;
    await authorizeMailLog(currentUser(req).id, guildId);
    res.json(await notifications.mailLog(guildId, req.query as unknown as z.output<typeof mailLogQuerySchema>));
  });

  router.get('/guilds/:guildId/mail-messages/:messageId', requireUser, validate({ params: messageParamsSchema }), async (req, res) => {
    const { guildId, messageId } = req.params as unknown as z.infer<typeof messageParamsSchema>;
    await authorizeMailLog(currentUser(req).id, guildId);
    res.json(await notifications.mailMessage(guildId, messageId));
  });

  return router;
}
