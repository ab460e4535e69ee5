import { Router } from 'express';
import { roomSeenBodySchema, roomSeenParamsSchema } from '@shared/schemas/home';
import { route } from '../http/route';
import { currentUser, requireUser } from '../auth/require-user';
import type { AppDeps } from '../deps';
import { getMe } from '../auth/auth.service';
import { markRoomSeen, nextForMe } from './home.service';

/**
 * The client's session probe (who is signed in, or 204 No Content: a visitor is not an error, so it is no 401),
 * the home screen's "what is next for me" across every guild, and the note that a chat room was read.
 */
export function homeRouter(deps: AppDeps) {
  const router = Router();

  router.get(
    '/session',
    route({}, async (_input, req, res) => {
      const me = req.user ? await getMe(deps, req.user.id) : null;
      if (me) res.json(me);
      else res.status(204).end();
    }),
  );

  router.get(
    '/me/next',
    requireUser,
    route({}, async (_input, req, res) => {
      res.json(await nextForMe(deps, currentUser(req).id));
    }),
  );
  router.put(
    '/me/rooms/:roomId/seen',
    requireUser,
    route({ params: roomSeenParamsSchema, body: roomSeenBodySchema }, async ({ params }, req, res) => {
      res.json(await markRoomSeen(deps, currentUser(req).id, params.roomId));
    }),
  );
  return router;
}
