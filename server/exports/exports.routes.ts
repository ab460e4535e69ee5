/** CSV downloads of a swap for its coordinators: the roster and the confirmed return. */
import { Router, type Request, type Response } from 'express';
import { swapParamsSchema } from '@shared/schemas/swaps';
import { validate } from '../http/validate';
import { currentUser, requireUser } from '../auth/require-user';
import { canManageSwap } from '../swaps/swaps.policy';
import { distributionCsv, rosterCsv } from './exports.service';

const swapId = (req: Request) => (req.params as unknown as { swapId: number }).swapId;
const params = validate({ params: swapParamsSchema });

export function exportsRouter() {
  const router = Router();

  router.get('/swaps/:swapId/export/roster.csv', requireUser, params, async (req, res) => {
    const { swap } = await canManageSwap(currentUser(req).id, swapId(req));
    sendCsv(res, await rosterCsv(swap));
  });

  router.get('/swaps/:swapId/export/distribution.csv', requireUser, params, async (req, res) => {
    const { swap } = await canManageSwap(currentUser(req).id, swapId(req));
    sendCsv(res, await distributionCsv(swap));
  });

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
