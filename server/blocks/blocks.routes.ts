/** Block routes: a swap's block list, the maker's steps, the coordinator's intake and measuring. */
import { Router, type Request } from 'express';
import type { Transaction } from 'sequelize';
import type { ZodType } from 'zod';
import {
  acceptBlockSchema,
  blockParamsSchema,
  handInManySchema,
  handInSchema,
  measurementBodySchema,
  receiveSchema,
} from '@shared/schemas/blocks';
import { blocksQuerySchema, swapParamsSchema } from '@shared/schemas/swaps';
import { route, sendReply, transactionRoute } from '../http/route';
import { currentUser, requireUser } from '../auth/require-user';
import { canReadSwap } from '../swaps/swaps.policy';
import { canActAsMaker, canManageBlock, canReadBlock, type BlockAccess } from './blocks.policy';
import type { AppDeps } from '../deps';
import * as blocks from './blocks.service';
import { listMeasurements, readForMeasurement, recordMeasurement } from './measurements.service';
import { answerAsBefore } from './idempotency';
import { acceptByDecision, undoLastStep } from './block-steps';
import { handInMany } from './hand-in-many';

type BlockInput = { params: { blockId: number }; transaction?: Transaction };
type BlockPolicy = typeof canReadBlock;

export function blocksRouter(deps: AppDeps) {
  const router = Router();
  const db = deps.sequelize;
  // With the route's transaction the policy locks the block it reads; the service changes that instance.
  const as =
    (policy: BlockPolicy) =>
    (req: Request, { params, transaction }: BlockInput) =>
      policy({ pool: deps.pool, transaction }, currentUser(req).id, params.blockId);
  const locked = (access: BlockAccess, transaction: Transaction) => ({ block: access.block, swap: access.swap, transaction });
  /** A change to one block: the policy's read is the locked read, and the answer is sent after commit. */
  const change = <B extends ZodType | undefined>(body: B, policy: BlockPolicy) => ({
    params: blockParamsSchema,
    body,
    authorize: as(policy),
    recover: answerAsBefore,
  });

  router.get(
    '/swaps/:swapId/blocks',
    requireUser,
    route(
      {
        params: swapParamsSchema,
        query: blocksQuerySchema,
        authorize: (req, { params }) => canReadSwap(deps, currentUser(req).id, params.swapId),
      },
      async ({ query, access: { swap, canManage, verdictsVisibleTo } }, req, res) => {
        res.json(await blocks.listBlocks(deps, swap, { userId: currentUser(req).id, canManage, verdictsVisibleTo }, query));
      },
    ),
  );

  router.get(
    '/blocks/:blockId',
    requireUser,
    route({ params: blockParamsSchema, authorize: as(canReadBlock) }, async ({ access }, req, res) => {
      res.json(await blocks.getBlock(deps, access, { userId: currentUser(req).id, canManage: access.canManage }));
    }),
  );

  router.get(
    '/blocks/:blockId/measurements',
    requireUser,
    route({ params: blockParamsSchema, authorize: as(canReadBlock) }, async ({ access: { block } }, _req, res) => {
      res.json(await listMeasurements(deps, block));
    }),
  );

  router.post(
    '/blocks/:blockId/sewn',
    requireUser,
    transactionRoute(db, change(undefined, canActAsMaker), ({ access, transaction }, req) =>
      blocks.markSewn(deps, locked(access, transaction), currentUser(req).id),
    ),
  );

  router.post(
    '/blocks/:blockId/handed-in',
    requireUser,
    transactionRoute(db, change(handInSchema, canActAsMaker), ({ access, transaction, body }, req) =>
      blocks.handIn(deps, locked(access, transaction), currentUser(req).id, body),
    ),
  );

  router.post(
    '/blocks/:blockId/received',
    requireUser,
    transactionRoute(db, change(receiveSchema, canManageBlock), ({ access, transaction, body }, req) =>
      blocks.receive(deps, locked(access, transaction), currentUser(req).id, body.clientId),
    ),
  );

  router.post(
    '/blocks/:blockId/trimmed',
    requireUser,
    transactionRoute(db, change(undefined, canManageBlock), ({ access, transaction }, req) =>
      blocks.markTrimmed(deps, locked(access, transaction), currentUser(req).id),
    ),
  );

  router.post(
    '/blocks/:blockId/measurements',
    requireUser,
    // No transaction of its own: one read, then one statement that writes only if the block is as read.
    route(
      {
        params: blockParamsSchema,
        body: measurementBodySchema,
        authorize: (req, { params }) => readForMeasurement(deps, currentUser(req).id, params.blockId),
      },
      async ({ access, body }, req, res) => sendReply(res, await recordMeasurement(deps, currentUser(req), body, access)),
    ),
  );

  router.post(
    '/swaps/:swapId/handed-in',
    requireUser,
    route(
      {
        params: swapParamsSchema,
        body: handInManySchema,
        authorize: (req, { params }) => canReadSwap(deps, currentUser(req).id, params.swapId),
      },
      async ({ body, access }, req, res) => {
        res.json(await handInMany(deps, access.swap, currentUser(req).id, body));
      },
    ),
  );

  router.post(
    '/blocks/:blockId/undo',
    requireUser,
    transactionRoute(db, change(undefined, canReadBlock), ({ access, transaction }, req) =>
      undoLastStep(deps, locked(access, transaction), { userId: currentUser(req).id, canManage: access.canManage }),
    ),
  );

  router.post(
    '/blocks/:blockId/accept',
    requireUser,
    transactionRoute(db, change(acceptBlockSchema, canManageBlock), ({ access, transaction, body }, req) =>
      acceptByDecision(deps, locked(access, transaction), currentUser(req).id, body),
    ),
  );

  return router;
}
