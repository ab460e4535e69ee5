/** CSV downloads of a swap for its coordinators: the roster and the confirmed return. */
import { Router, type Request, type Response } from 'express';
import { swapParamsSchema } from '@shared/schemas/swaps';
import { route } from '../http/route';
import { currentUser, requireUser } from '../auth/require-user';
import { canManageSwap } from '../swaps/swaps.policy';
import { distributionCsv, rosterCsv } from './exports.service';
import type { AppDeps } from '../deps';

export function exportsRouter(deps: AppDeps) {
  const router = Router();
  const manageSwap = (req: Request, { params }: { params: { swapId: number } }) =>
    canManageSwap(deps, currentUser(req).id, params.swapId);
  const coordinators = { params: swapParamsSchema, authorize: manageSwap };

  router.get(
    '/swaps/:swapId/export/roster.csv',
    requireUser,
    route(coordinators, async ({ access }, _req, res) => sendCsv(res, await rosterCsv(deps, access.swap))),
  );

  router.get(
    '/swaps/:swapId/export/distribution.csv',
    requireUser,
    route(coordinators, async ({ access }, _req, res) => sendCsv(res, await distributionCsv(access.swap))),
  );

  return router;
}

function sendCsv(res: Response, file: { fileName: string; body: string }) {
  res
    .status(200)
    .set('Content-Type', 'text/csv; charset=utf-8')
    .set('Content-Disposition', `attachment; filename="${file.fileName}"`)
    .set('Cache-Control', 'no-store')
    .send(file.body);
}
