/** Photo estimates of a block: the history (with what the measuring view needs) and a new estimate. */
import { Router, type Request } from 'express';
import { estimateParamsSchema, photoEstimateBodySchema, type PhotoEstimateBody } from '@shared/schemas/photo-estimates';
import { currentUser, requireUser } from '../auth/require-user';
import { validate } from '../http/validate';
import type { AppDeps } from '../deps';
import { canEstimateBlock, canSeeEstimates } from './photo-estimates.policy';
import { listEstimates, recordEstimate } from './photo-estimates.service';

const blockId = (req: Request) => (req.params as unknown as { blockId: number }).blockId;

export function photoEstimatesRouter(deps: AppDeps) {
  const router = Router();

  router.get('/blocks/:blockId/photo-estimates', requireUser, validate({ params: estimateParamsSchema }), async (req, res) => {
    const access = await canSeeEstimates(currentUser(req).id, blockId(req));
    res.json(await listEstimates(access));
  });

  // Who may measure is settled before the body is read, so a stranger learns nothing from a 400.
  router.post(
    '/blocks/:blockId/photo-estimates',
    requireUser,
    validate({ params: estimateParamsSchema }),
    async (req, res, next) => {
      res.locals.blockAccess = await canEstimateBlock(currentUser(req).id, blockId(req));
      next();
    },
    validate({ body: photoEstimateBodySchema }),
    async (req, res) => {
      res.status(201).json(await recordEstimate(deps, res.locals.blockAccess, currentUser(req).id, req.body as PhotoEstimateBody));
    },
  );

  return router;
}
