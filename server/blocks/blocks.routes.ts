/** Block routes: a swap's block list, the maker's steps, the coordinator's intake and measuring. */
import { Router, type Request, type Response } from 'express';
import { acceptBlockSchema, blockParamsSchema, handInManySchema, handInSchema, measurementBodySchema, receiveSchema } from '@shared/schemas/blocks';
import { blocksQuerySchema, swapParamsSchema, type BlocksQuery } from '@shared/schemas/swaps';
import { validate } from '../http/validate';
import { currentUser, requireUser } from '../auth/require-user';
import { canReadSwap } from '../swaps/swaps.policy';
import { canActAsMaker, canManageBlock, canReadBlock } from './blocks.policy';
import type { AppDeps } from '../deps';
import * as blocks from './blocks.service';
import { listMeasurements, recordMeasurement } from './measurements.service';
import type { Answer } from './idempotency';
import { route } from '../http/route';
import { acceptByDecision, undoLastStep } from './block-steps';
import { handInMany } from './hand-in-many';

const blockId = (req: Request) => (req.params as unknown as { blockId: number }).blockId;
const params = validate({ params: blockParamsSchema });

function reply<T>(res: Response, answer: Answer<T>) {
  if (answer.replayed) res.set('Idempotent-Replay', 'true');
  res.status(answer.status).json(answer.body);
}

export function blocksRouter(deps: AppDeps) {
  const router = Router();

  router.get('/swaps/:swapId/blocks', requireUser, validate({ params: swapParamsSchema, query: blocksQuerySchema }), async (req, res) => {
    const userId = currentUser(req).id;
    const { swap, canManage } = await canReadSwap(userId, (req.params as unknown as { swapId: number }).swapId);
    res.json(await blocks.listBlocks(swap, { userId, canManage }, req.query as unknown as BlocksQuery));
  });

  router.get('/blocks/:blockId', requireUser, params, async (req, res) => {
    const userId = currentUser(req).id;
    const { block, canManage } = await canReadBlock(userId, blockId(req));
    res.json(await blocks.getBlock(block, { userId, canManage }));
  });

  router.get('/blocks/:blockId/measurements', requireUser, params, async (req, res) => {
    const { block } = await canReadBlock(currentUser(req).id, blockId(req));
    res.json(await listMeasurements(block));
  });

  router.post('/blocks/:blockId/sewn', requireUser, params, async (req, res) => {
    const userId = currentUser(req).id;
    await canActAsMaker(userId, blockId(req));
    res.json(await blocks.markSewn(deps, blockId(req), userId));
  });

  router.post('/blocks/:blockId/handed-in', requireUser, validate({ params: blockParamsSchema, body: handInSchema }), async (req, res) => {
    const userId = currentUser(req).id;
    await canActAsMaker(userId, blockId(req));
    res.json(await blocks.handIn(deps, blockId(req), userId, req.body));
  });

  router.post('/blocks/:blockId/received', requireUser, validate({ params: blockParamsSchema, body: receiveSchema }), async (req, res) => {
    const userId = currentUser(req).id;
    await canManageBlock(userId, blockId(req));
    reply(res, await blocks.receive(deps, blockId(req), userId, req.body.clientId));
  });

  router.post('/blocks/:blockId/trimmed', requireUser, params, async (req, res) => {
    const userId = currentUser(req).id;
    await canManageBlock(userId, blockId(req));
    res.json(await blocks.markTrimmed(deps, blockId(req), userId));
  });

  router.post('/blocks/:blockId/measurements', requireUser, validate({ params: blockParamsSchema, body: measurementBodySchema }), async (req, res) => {
    const { id: userId, displayName } = currentUser(req);
    const { canManage, isMaker } = await canReadBlock(userId, blockId(req));
    reply(res, await recordMeasurement(deps, blockId(req), { userId, displayName, canManage, isMaker }, req.body));
  });

  router.post(
    '/swaps/:swapId/handed-in',
    requireUser,
    route({ params: swapParamsSchema, body: handInManySchema, authorize: (req, { params }) => canReadSwap(currentUser(req).id, params.swapId) }, async ({ body, access }, req, res) => {
      res.json(await handInMany(deps, access.swap, currentUser(req).id, body));
    }),
  );

  router.post(
    '/blocks/:blockId/undo',
    requireUser,
    route({ params: blockParamsSchema, authorize: (req, { params }) => canReadBlock(currentUser(req).id, params.blockId) }, async ({ params, access }, req, res) => {
      res.json(await undoLastStep(deps, params.blockId, { userId: currentUser(req).id, canManage: access.canManage }));
    }),
  );

  router.post(
    '/blocks/:blockId/accept',
    requireUser,
    route({ params: blockParamsSchema, body: acceptBlockSchema, authorize: (req, { params }) => canManageBlock(currentUser(req).id, params.blockId) }, async ({ params, body }, req, res) => {
      res.json(await acceptByDecision(deps, params.blockId, currentUser(req).id, body));
    }),
  );

  return router;
}
