import { Router } from 'express';
import type { z } from 'zod';
import { activityQuerySchema, swapParamsSchema } from '@shared/schemas/live';
import { validate } from '../http/validate';
import { currentUser, requireUser } from '../auth/require-user';
import { canReadSwap } from '../swaps/swaps.policy';
import { listActivity } from './board-activity';

/** The board's recent-activity list (the roster itself is the swaps feature's). */
export function boardRouter() {
  const router = Router();
  router.get('/swaps/:swapId/activity', requireUser, validate({ params: swapParamsSchema, query: activityQuerySchema }), async (req, res) => {
    const { swapId } = req.params as unknown as z.infer<typeof swapParamsSchema>;
    await canReadSwap(currentUser(req).id, swapId);
    res.json(await listActivity(swapId, (req.query as unknown as z.infer<typeof activityQuerySchema>).limit));
  });
  return router;
}
