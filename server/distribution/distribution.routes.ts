/** Planning and confirming the return of blocks (coordinators and admins). */
import { Router, type Request } from 'express';
import { confirmDistributionSchema, swapParamsSchema } from '@shared/schemas/swaps';
import { validate } from '../http/validate';
import { currentUser, requireUser } from '../auth/require-user';
import { canManageSwap } from '../swaps/swaps.policy';
import type { AppDeps } from '../deps';
import { confirmReturn, planReturn } from './distribution.service';

const swapId = (req: Request) => (req.params as unknown as { swapId: number }).swapId;

export function distributionRouter(deps: AppDeps) {
  const router = Router();

  router.post('/swaps/:swapId/distribution/plan', requireUser, validate({ params: swapParamsSchema }), async (req, res) => {
    const { swap } = await canManageSwap(currentUser(req).id, swapId(req));
    res.json(await planReturn(swap));
  });

  router.post(
    '/swaps/:swapId/distribution/confirm',
    requireUser,
    validate({ params: swapParamsSchema, body: confirmDistributionSchema }),
    async (req, res) => {
      const userId = currentUser(req).id;
      await canManageSwap(userId, swapId(req));
      res.json(await confirmReturn(deps, swapId(req), userId, req.body));
    },
  );

  return router;
}
