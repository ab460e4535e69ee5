/** Intake routes: label sheets, the offline pack of a swap, and resolving a scanned or typed label. */
import { Router } from 'express';
import { swapParamsSchema } from '@shared/schemas/swaps';
import { labelsQuerySchema, resolveBodySchema } from '@shared/schemas/intake';
import { route } from '../http/route';
import { currentUser, requireUser } from '../auth/require-user';
import type { AppDeps } from '../deps';
import { canPrintLabels, canRunIntake } from './intake.policy';
import { intakePack, labelSheet, resolveBlock } from './intake.service';

export function intakeRouter(deps: AppDeps) {
  const router = Router();

  router.get(
    '/swaps/:swapId/labels',
    requireUser,
    route(
      {
        params: swapParamsSchema,
        query: labelsQuerySchema,
        authorize: (req, { params, query }) => canPrintLabels(deps, currentUser(req).id, params.swapId, query.maker),
      },
      async ({ access: { swap, makerId } }, _req, res) => {
        res.set('Cache-Control', 'no-store').json(await labelSheet(deps, swap, makerId));
      },
    ),
  );

  router.get(
    '/swaps/:swapId/intake',
    requireUser,
    route(
      { params: swapParamsSchema, authorize: (req, { params }) => canRunIntake(deps, currentUser(req).id, params.swapId) },
      async ({ access: swap }, _req, res) => {
        res.set('Cache-Control', 'no-store').json(await intakePack(deps, swap));
      },
    ),
  );

  // The swap to check is named in the body, so the body is read first here.
  router.post(
    '/intake/resolve',
    requireUser,
    route({ body: resolveBodySchema }, async ({ body }, req, res) => {
      const swap = await canRunIntake(deps, currentUser(req).id, body.swapId);
      res.json(await resolveBlock(deps, swap, body));
    }),
  );

  return router;
}
