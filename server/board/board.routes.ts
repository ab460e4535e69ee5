import { Router } from 'express';
import type { z } from 'zod';
import { activityQuerySchema, swapParamsSchema } from '@shared/schemas/live';
import { validate } from '../http/validate';
import { currentUser, requireUser } from '../auth/require-user';
import { canReadSwap } from '../swaps/swaps.policy';
import { listActivity } from './board-activity';
import { getRoster } from './roster.service';

/** The board's roster (addresses only for coordinators and admins) and its recent-activity list. */
export function boardRouter() {
  const router = Router();
  router.get('/swaps/:swapId/roster', requireUser, validate({ params: swapParamsSchema }), async (req, res) => {
    const { swapId } = req.params as unknown as z.infer<typeof swapParamsSchema>;
    const { swap, canManage } = await canReadSwap(currentUser(req).id, swapId);
    res.json(await getRoster(swap, { withAddresses: canManage }));
  });
  router.get('/swaps/:swapId/activity', requireUser, validate({ params: swapParamsSchema, query: activityQuerySchema }), async (req, res) => {
    const { swapId } = req.params as unknown as z.infer<typeof swapParamsSchema>;
    await canReadSwap(currentUser(req).id, swapId);
    res.json(await listActivity(swapId, (req.query as unknown as z.infer<typeof activityQuerySchema>).limit));
  });
  return router;
}
