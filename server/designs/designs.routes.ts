/** The design wall of a swap (the caller's own layout), its colour-spreading proposal, and a photo's colour statistics. */
import { Router, type Request } from 'express';
import {
  arrangeBodySchema,
  designBodySchema,
  designParamsSchema,
  photoColourParamsSchema,
  type DesignBody,
} from '@shared/schemas/designs';
import { currentUser, requireUser } from '../auth/require-user';
import { route } from '../http/route';
import { NotFoundError } from '../http/errors';
import type { AppDeps } from '../deps';
import { canSeePhoto } from '../uploads/photos.policy';
import { photoColour } from '../uploads/photo-colour';
import { canUseDesignWall } from './designs.policy';
import { arrangeDesign, getDesign, saveDesign } from './designs.service';

export function designsRouter(deps: AppDeps) {
  const router = Router();
  const designer = (req: Request, { params }: { params: { swapId: number } }) =>
    canUseDesignWall(deps, currentUser(req).id, params.swapId);

  router.get(
    '/photos/:photoId/colour',
    requireUser,
    route(
      { params: photoColourParamsSchema, authorize: (req, { params }) => canSeePhoto(deps, currentUser(req).id, params.photoId) },
      async ({ access: photo }, _req, res) => {
        const stats = await photoColour(deps, photo);
        if (!stats) throw new NotFoundError('The file of this photo is missing on the server, so its colours cannot be read.');
        res.json(stats);
      },
    ),
  );

  router.get(
    '/swaps/:swapId/design',
    requireUser,
    route({ params: designParamsSchema, authorize: designer }, async ({ access }, _req, res) => {
      res.json(await getDesign(deps, access));
    }),
  );

  // Who may design is settled before the body is read, so a stranger learns nothing from a 400.
  router.put(
    '/swaps/:swapId/design',
    requireUser,
    route({ params: designParamsSchema, body: designBodySchema, authorize: designer }, async ({ body, access }, _req, res) => {
      res.json(await saveDesign(deps, access, body));
    }),
  );

  router.post(
    '/swaps/:swapId/design/arrange',
    requireUser,
    route({ params: designParamsSchema, body: arrangeBodySchema, authorize: designer }, async ({ body, access }, _req, res) => {
      res.json(await arrangeDesign(deps, access, 'cells' in body ? (body as DesignBody) : null));
    }),
  );

  return router;
}
