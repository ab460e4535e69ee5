/** Swap routes: set-up, states and sign-ups. */
import { Router, type Request } from 'express';
import { guildParamsSchema } from '@shared/schemas/guilds';
import { createSwapSchema, signupSchema, swapParamsSchema, transitionSchema, updateSwapSchema } from '@shared/schemas/swaps';
import { validate } from '../http/validate';
import { currentUser, requireUser } from '../auth/require-user';
import { authorizeGuild, can } from '../guilds/guilds.policy';
import type { AppDeps } from '../deps';
import { canJoinSwap, canManageSwap, canReadSwap } from './swaps.policy';
import * as swaps from './swaps.service';
import * as signups from './signups.service';

const swapId = (req: Request) => (req.params as unknown as { swapId: number }).swapId;
const params = validate({ params: swapParamsSchema });

export function swapsRouter(deps: AppDeps) {
  const router = Router();

  router.get('/guilds/:guildId/swaps', requireUser, validate({ params: guildParamsSchema }), async (req, res) => {
    const { guildId } = req.params as unknown as { guildId: number };
    const userId = currentUser(req).id;
    const membership = await authorizeGuild(userId, guildId, 'swaps:read');
    res.json(await swaps.listSwaps(guildId, { userId, role: membership.role, canManage: can(membership.role, 'swaps:manage') }));
  });

  router.post('/guilds/:guildId/swaps', requireUser, validate({ params: guildParamsSchema, body: createSwapSchema }), async (req, res) => {
    const { guildId } = req.params as unknown as { guildId: number };
    const userId = currentUser(req).id;
    const membership = await authorizeGuild(userId, guildId, 'swaps:manage');
    res.status(201).json(await swaps.createSwap(deps, guildId, { userId, role: membership.role, canManage: true }, req.body));
  });

  router.get('/swaps/:swapId', requireUser, params, async (req, res) => {
    const userId = currentUser(req).id;
    const { swap, role, canManage } = await canReadSwap(userId, swapId(req));
    res.json(await swaps.getSwap(swap, { userId, role, canManage }));
  });

  router.patch('/swaps/:swapId', requireUser, validate({ params: swapParamsSchema, body: updateSwapSchema }), async (req, res) => {
    const userId = currentUser(req).id;
    const { role } = await canManageSwap(userId, swapId(req));
    res.json(await swaps.updateSwap(deps, swapId(req), { userId, role, canManage: true }, req.body));
  });

  router.get('/swaps/:swapId/transitions', requireUser, params, async (req, res) => {
    await canReadSwap(currentUser(req).id, swapId(req));
    res.json(await swaps.listTransitions(swapId(req)));
  });

  router.post('/swaps/:swapId/transitions', requireUser, validate({ params: swapParamsSchema, body: transitionSchema }), async (req, res) => {
    const userId = currentUser(req).id;
    const { role } = await canManageSwap(userId, swapId(req));
    res.json(await swaps.transitionSwap(deps, swapId(req), { userId, role, canManage: true }, req.body.to, req.body.reason));
  });

  router.post('/swaps/:swapId/signups', requireUser, validate({ params: swapParamsSchema, body: signupSchema }), async (req, res) => {
    const userId = currentUser(req).id;
    await canJoinSwap(userId, swapId(req));
    res.json(await signups.pledge(deps, swapId(req), userId, req.body.blocks));
  });

  router.get('/swaps/:swapId/signups/me', requireUser, params, async (req, res) => {
    const userId = currentUser(req).id;
    await canReadSwap(userId, swapId(req));
    res.json(await signups.mySignup(swapId(req), userId));
  });

  router.delete('/swaps/:swapId/signups/me', requireUser, params, async (req, res) => {
    const userId = currentUser(req).id;
    await canJoinSwap(userId, swapId(req));
    await signups.withdraw(deps, swapId(req), userId);
    res.status(204).end();
  });

  return router;
}
