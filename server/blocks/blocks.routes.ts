/** Block routes: a swap's block list, the maker's steps, the coordinator's intake and measuring. */
import { Router, type Request, type Response } from 'express';
import {
  acceptBlockSchema,
  blockParamsSchema,
  handInManySchema,
  handInSchema,
  measurementBodySchema,
  receiveSchema,
} from '@shared/schemas/blocks';
import { blocksQuerySchema, swapParamsSchema } from '@shared/schemas/swaps';
import { route } from '../http/route';
import { currentUser, requireUser } from '../auth/require-user';
import { canReadSwap } from '../swaps/swaps.policy';
import { canActAsMaker, canManageBlock, canReadBlock, measuringAs } from './blocks.policy';
import type { AppDeps } from '../deps';
import * as blocks from './blocks.service';
import { listMeasurements, recordMeasurement } from './measurements.service';
import type { Answer } from './idempotency';
import { acceptByDecision, undoLastStep } from './block-steps';
import { handInMany } from './hand-in-many';

type BlockInput = { params: { blockId: number } };
const readBlock = (req: Request, { params }: BlockInput) => canReadBlock(currentUser(req).id, params.blockId);
const maker = (req: Request, { params }: BlockInput) => canActAsMaker(currentUser(req).id, params.blockId);
const officer = (req: Request, { params }: BlockInput) => canManageBlock(currentUser(req).id, params.blockId);

function reply<T>(res: Response, answer: Answer<T>) {
  if (answer.replayed) res.set('Idempotent-Replay', 'true');
  res.status(answer.status).json(answer.body);
}

export function blocksRouter(deps: AppDeps) {
  const router = Router();

  router.get(
    '/swaps/:swapId/blocks',
    requireUser,
    route(
      {
        params: swapParamsSchema,
        query: blocksQuerySchema,
        authorize: (req, { params }) => canReadSwap(currentUser(req).id, params.swapId),
      },
      async ({ query, access: { swap, canManage } }, req, res) => {
        res.json(await blocks.listBlocks(swap, { userId: currentUser(req).id, canManage }, query));
      },
    ),
  );

  router.get(
    '/blocks/:blockId',
    requireUser,
    route({ params: blockParamsSchema, authorize: readBlock }, async ({ access: { block, canManage } }, req, res) => {
      res.json(await blocks.getBlock(block, { userId: currentUser(req).id, canManage }));
    }),
  );

  router.get(
    '/blocks/:blockId/measurements',
    requireUser,
    route({ params: blockParamsSchema, authorize: readBlock }, async ({ access: { block } }, _req, res) => {
      res.json(await listMeasurements(block));
    }),
  );

  router.post(
    '/blocks/:blockId/sewn',
    requireUser,
    route({ params: blockParamsSchema, authorize: maker }, async ({ params }, req, res) => {
      res.json(await blocks.markSewn(deps, params.blockId, currentUser(req).id));
    }),
  );

  router.post(
    '/blocks/:blockId/handed-in',
    requireUser,
    route({ params: blockParamsSchema, body: handInSchema, authorize: maker }, async ({ params, body }, req, res) => {
      res.json(await blocks.handIn(deps, params.blockId, currentUser(req).id, body));
    }),
  );

  router.post(
    '/blocks/:blockId/received',
    requireUser,
    route({ params: blockParamsSchema, body: receiveSchema, authorize: officer }, async ({ params, body }, req, res) => {
      reply(res, await blocks.receive(deps, params.blockId, currentUser(req).id, body.clientId));
    }),
  );

  router.post(
    '/blocks/:blockId/trimmed',
    requireUser,
    route({ params: blockParamsSchema, authorize: officer }, async ({ params }, req, res) => {
      res.json(await blocks.markTrimmed(deps, params.blockId, currentUser(req).id));
    }),
  );

  router.post(
    '/blocks/:blockId/measurements',
    requireUser,
    route(
      { params: blockParamsSchema, body: measurementBodySchema, authorize: readBlock },
      async ({ params, body, access }, req, res) => {
        const { id: userId, displayName } = currentUser(req);
        reply(
          res,
          await recordMeasurement(deps, params.blockId, { userId, displayName, source: measuringAs(access, body.source) }, body),
        );
      },
    ),
  );

  router.post(
    '/swaps/:swapId/handed-in',
    requireUser,
    route(
      {
        params: swapParamsSchema,
        body: handInManySchema,
        authorize: (req, { params }) => canReadSwap(currentUser(req).id, params.swapId),
      },
      async ({ body, access }, req, res) => {
        res.json(await handInMany(deps, access.swap, currentUser(req).id, body));
      },
    ),
  );

  router.post(
    '/blocks/:blockId/undo',
    requireUser,
    route({ params: blockParamsSchema, authorize: readBlock }, async ({ params, access }, req, res) => {
      res.json(await undoLastStep(deps, params.blockId, { userId: currentUser(req).id, canManage: access.canManage }));
    }),
  );

  router.post(
    '/blocks/:blockId/accept',
    requireUser,
    route({ params: blockParamsSchema, body: acceptBlockSchema, authorize: officer }, async ({ params, body }, req, res) => {
      res.json(await acceptByDecision(deps, params.blockId, currentUser(req).id, body));
    }),
  );

  return router;
}
