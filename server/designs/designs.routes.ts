/** The design wall of a swap (the caller's own layout), its colour-spreading proposal, and a photo's colour statistics. */
import { Router } from 'express';
import { type z } from 'zod';
import {
  arrangeBodySchema,
  designBodySchema,
  designParamsSchema,
  photoColourParamsSchema,
  type DesignBody,
} from '@shared/schemas/designs';
import { currentUser, requireUser } from '../auth/require-user';
import { validate } from '../http/validate';
import { NotFoundError } from '../http/errors';
import type { AppDeps } from '../deps';
import { canSeePhoto } from '../uploads/photos.policy';
import { photoColour } from '../uploads/photo-colour';
import { canUseDesignWall } from './designs.policy';
import { arrangeDesign, getDesign, saveDesign } from './designs.service';

type Params = z.infer<typeof designParamsSchema>;
type PhotoParams = z.infer<typeof photoColourParamsSchema>;

export function designsRouter(deps: AppDeps) {
  const router = Router();

  router.get('/photos/:photoId/colour', requireUser, validate({ params: photoColourParamsSchema }), async (req, res) => {
    const { photoId } = req.params as unknown as PhotoParams;
    const photo = await canSeePhoto(currentUser(req).id, photoId);
    const stats = await photoColour(deps, photo);
    if (!stats) throw new NotFoundError('The file of this photo is missing on the server, so its colours cannot be read.');
    res.json(stats);
  });

  router.get('/swaps/:swapId/design', requireUser, validate({ params: designParamsSchema }), async (req, res) => {
    const { swapId } = req.params as unknown as Params;
    res.json(await getDesign(deps, await canUseDesignWall(currentUser(req).id, swapId)));
  });

  // Who may design is settled before the body is read, so a stranger learns nothing from a 400.
  router.put(
    '/swaps/:swapId/design',
    requireUser,
    validate({ params: designParamsSchema }),
    async (req, res, next) => {
      const { swapId } = req.params as unknown as Params;
      res.locals.designAccess = await canUseDesignWall(currentUser(req).id, swapId);
      next();
    },
    validate({ body: designBodySchema }),
    async (req, res) => {
      res.json(await saveDesign(deps, res.locals.designAccess, req.body as DesignBody));
    },
  );

  router.post(
    '/swaps/:swapId/design/arrange',
    requireUser,
    validate({ params: designParamsSchema }),
    async (req, res, next) => {
      const { swapId } = req.params as unknown as Params;
      res.locals.designAccess = await canUseDesignWall(currentUser(req).id, swapId);
      next();
    },
    validate({ body: arrangeBodySchema }),
    async (req, res) => {
      const body = req.body as DesignBody | Record<string, never>;
      res.json(await arrangeDesign(deps, res.locals.designAccess, 'cells' in body ? (body as DesignBody) : null));
    },
  );

  return router;
}
