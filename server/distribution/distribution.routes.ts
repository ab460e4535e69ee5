/** Planning and confirming the return of blocks (coordinators and admins). */
import { Router, type Request } from 'express';
import { confirmDistributionSchema, distributionQuerySchema, swapParamsSchema } from '@shared/schemas/swaps';
import { route } from '../http/route';
import { currentUser, requireUser } from '../auth/require-user';
import { canManageSwap } from '../swaps/swaps.policy';
import type { AppDeps } from '../deps';
import { confirmReturn, distributionListing, planReturn } from './distribution.service';

export function distributionRouter(deps: AppDeps) {
  const router = Router();
  const manageSwap = (req: Request, { params }: { params: { swapId: number } }) =>
    canManageSwap(deps, currentUser(req).id, params.swapId);

  router.post(
    '/swaps/:swapId/distribution/plan',
    requireUser,
    route({ params: swapParamsSchema, authorize: manageSwap }, async ({ access }, _req, res) => {
      res.json(await planReturn(access.swap));
    }),
  );

  router.post(
    '/swaps/:swapId/distribution/confirm',
    requireUser,
    route(
      { params: swapParamsSchema, body: confirmDistributionSchema, authorize: manageSwap },
      async ({ params, body }, req, res) => {
        res.json(await confirmReturn(deps, params.swapId, currentUser(req).id, body));
      },
    ),
  );

  router.get(
    '/swaps/:swapId/distribution',
    requireUser,
    route(
      { params: swapParamsSchema, query: distributionQuerySchema, authorize: manageSwap },
      async ({ query, access }, _req, res) => {
        res.json(await distributionListing(deps.config, access.swap, query.by));
      },
    ),
  );

  return router;
}
