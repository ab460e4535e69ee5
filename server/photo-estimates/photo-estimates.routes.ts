/** Photo estimates of a block: the history (with what the measuring view needs) and a new estimate. */
import { Router } from 'express';
import { estimateParamsSchema, photoEstimateBodySchema } from '@shared/schemas/photo-estimates';
import { currentUser, requireUser } from '../auth/require-user';
import { route } from '../http/route';
import type { AppDeps } from '../deps';
import { canEstimateBlock, canSeeEstimates } from './photo-estimates.policy';
import { listEstimates, recordEstimate } from './photo-estimates.service';

export function photoEstimatesRouter(deps: AppDeps) {
  const router = Router();

  router.get(
    '/blocks/:blockId/photo-estimates',
    requireUser,
    route(
      {
        params: estimateParamsSchema,
        authorize: (req, { params }) => canSeeEstimates(deps, currentUser(req).id, params.blockId),
      },
      async ({ access }, _req, res) => {
        res.json(await listEstimates(access));
      },
    ),
  );

  // Who may measure is settled before the body is read, so a stranger learns nothing from a 400.
  router.post(
    '/blocks/:blockId/photo-estimates',
    requireUser,
    route(
      {
        params: estimateParamsSchema,
        body: photoEstimateBodySchema,
        authorize: (req, { params }) => canEstimateBlock(deps, currentUser(req).id, params.blockId),
      },
      async ({ body, access }, req, res) => {
        res.status(201).json(await recordEstimate(deps, access, currentUser(req).id, body));
      },
    ),
  );

  return router;
}
