/** Swap routes: set-up, states and sign-ups. */
import { Router, type Request } from 'express';
import { guildParamsSchema } from '@shared/schemas/guilds';
import {
  createSwapSchema,
  signupSchema,
  swapParamsSchema,
  transitionPreviewQuerySchema,
  transitionSchema,
  updateSwapSchema,
} from '@shared/schemas/swaps';
import { route } from '../http/route';
import { currentUser, requireUser } from '../auth/require-user';
import { authorizeGuild, can } from '../guilds/guilds.policy';
import type { AppDeps } from '../deps';
import { canJoinSwap, canManageSwap, canReadSwap, takeColumn } from './swaps.policy';
import { TRANSITIONS_WITH_SWAP } from './swaps.queries';
import * as swaps from './swaps.service';
import * as signups from './signups.service';

type SwapInput = { params: { swapId: number } };

export function swapsRouter(deps: AppDeps) {
  const router = Router();
  const readSwap = (req: Request, { params }: SwapInput) => canReadSwap(deps, currentUser(req).id, params.swapId);
  const manageSwap = (req: Request, { params }: SwapInput) => canManageSwap(deps, currentUser(req).id, params.swapId);
  const joinSwap = (req: Request, { params }: SwapInput) => canJoinSwap(deps, currentUser(req).id, params.swapId);

  router.get(
    '/guilds/:guildId/swaps',
    requireUser,
    route(
      {
        params: guildParamsSchema,
        authorize: (req, { params }) => authorizeGuild(deps, currentUser(req).id, params.guildId, 'swaps:read'),
      },
      async ({ params, access: { role } }, req, res) => {
        res.json(
          await swaps.listSwaps(deps, params.guildId, {
            userId: currentUser(req).id,
            role,
            canManage: can(role, 'swaps:manage'),
          }),
        );
      },
    ),
  );

  router.post(
    '/guilds/:guildId/swaps',
    requireUser,
    route(
      {
        params: guildParamsSchema,
        body: createSwapSchema,
        authorize: (req, { params }) => authorizeGuild(deps, currentUser(req).id, params.guildId, 'swaps:manage'),
      },
      async ({ params, body, access: { role } }, req, res) => {
        res
          .status(201)
          .json(await swaps.createSwap(deps, params.guildId, { userId: currentUser(req).id, role, canManage: true }, body));
      },
    ),
  );

  router.get(
    '/swaps/:swapId',
    requireUser,
    route({ params: swapParamsSchema, authorize: readSwap }, async ({ access: { swap, role, canManage } }, req, res) => {
      res.json(await swaps.getSwap(deps, swap, { userId: currentUser(req).id, role, canManage }));
    }),
  );

  router.patch(
    '/swaps/:swapId',
    requireUser,
    route(
      { params: swapParamsSchema, body: updateSwapSchema, authorize: manageSwap },
      async ({ params, body, access: { role } }, req, res) => {
        res.json(await swaps.updateSwap(deps, params.swapId, { userId: currentUser(req).id, role, canManage: true }, body));
      },
    ),
  );

  router.get(
    '/swaps/:swapId/transitions',
    requireUser,
    route(
      {
        params: swapParamsSchema,
        // Read beside the policy's query of the swap: one round trip for both.
        authorize: (req, { params }) => canReadSwap(deps, currentUser(req).id, params.swapId, TRANSITIONS_WITH_SWAP),
      },
      async ({ access: { swap } }, _req, res) => {
        res.json(swaps.listTransitions(takeColumn<swaps.TransitionRow[]>(swap, 'transition')!));
      },
    ),
  );

  router.get(
    '/swaps/:swapId/transitions/preview',
    requireUser,
    route(
      { params: swapParamsSchema, query: transitionPreviewQuerySchema, authorize: manageSwap },
      async ({ params, query }, _req, res) => {
        res.json(await swaps.previewTransition(deps, params.swapId, query.to));
      },
    ),
  );

  router.post(
    '/swaps/:swapId/transitions',
    requireUser,
    route(
      { params: swapParamsSchema, body: transitionSchema, authorize: manageSwap },
      async ({ params, body, access: { role } }, req, res) => {
        res.json(
          await swaps.transitionSwap(
            deps,
            params.swapId,
            { userId: currentUser(req).id, role, canManage: true },
            body.to,
            body.reason,
          ),
        );
      },
    ),
  );

  router.post(
    '/swaps/:swapId/signups',
    requireUser,
    route({ params: swapParamsSchema, body: signupSchema, authorize: joinSwap }, async ({ params, body }, req, res) => {
      res.json(await signups.pledge(deps, params.swapId, currentUser(req).id, body.blocks));
    }),
  );

  router.get(
    '/swaps/:swapId/signups/me',
    requireUser,
    route({ params: swapParamsSchema, authorize: readSwap }, async ({ params }, req, res) => {
      res.json(await signups.mySignup(params.swapId, currentUser(req).id));
    }),
  );

  router.delete(
    '/swaps/:swapId/signups/me',
    requireUser,
    route({ params: swapParamsSchema, authorize: joinSwap }, async ({ params }, req, res) => {
      await signups.withdraw(deps, params.swapId, currentUser(req).id);
      res.status(204).end();
    }),
  );

  return router;
}
