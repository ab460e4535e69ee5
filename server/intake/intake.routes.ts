/** Intake routes: label sheets, the offline pack of a swap, and resolving a scanned or typed label. */
import { Router, type Request } from 'express';
import { swapParamsSchema } from '@shared/schemas/swaps';
import { labelsQuerySchema, resolveBodySchema, type LabelsQuery, type ResolveBody } from '@shared/schemas/intake';
import { validate } from '../http/validate';
import { currentUser, requireUser } from '../auth/require-user';
import type { AppDeps } from '../deps';
import { canPrintLabels, canRunIntake } from './intake.policy';
import { intakePack, labelSheet, resolveBlock } from './intake.service';

const swapId = (req: Request) => (req.params as unknown as { swapId: number }).swapId;

export function intakeRouter(deps: AppDeps) {
  const router = Router();

  router.get('/swaps/:swapId/labels', requireUser, validate({ params: swapParamsSchema, query: labelsQuerySchema }), async (req, res) => {
    const { maker } = req.query as unknown as LabelsQuery;
    const { swap, makerId } = await canPrintLabels(currentUser(req).id, swapId(req), maker);
    res.set('Cache-Control', 'no-store').json(await labelSheet(deps, swap, makerId));
  });

  router.get('/swaps/:swapId/intake', requireUser, validate({ params: swapParamsSchema }), async (req, res) => {
    const swap = await canRunIntake(currentUser(req).id, swapId(req));
    res.set('Cache-Control', 'no-store').json(await intakePack(deps, swap));
  });

  router.post('/intake/resolve', requireUser, validate({ body: resolveBodySchema }), async (req, res) => {
    const body = req.body as ResolveBody;
    const swap = await canRunIntake(currentUser(req).id, body.swapId);
    res.json(await resolveBlock(deps, swap, body));
  });

  return router;
}
