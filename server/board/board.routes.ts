import { Router, type Request } from 'express';
import { activityQuerySchema, swapParamsSchema } from '@shared/schemas/live';
import { route } from '../http/route';
import { currentUser, requireUser } from '../auth/require-user';
import { canReadSwap, takeColumn } from '../swaps/swaps.policy';
import { listActivity } from './board-activity';
import { getRoster, membersFromChunks } from './roster.service';
import { ROSTER_WITH_SWAP } from './board.queries';
import { activitiesForMember, viewerSeesAllVerdicts } from '../blocks/verdict-visibility';
import type { AppDeps } from '../deps';

/** The board's roster (addresses only for coordinators and admins) and its recent-activity list. */
export function boardRouter(deps: AppDeps) {
  const router = Router();
  const readSwap = (req: Request, { params }: { params: { swapId: number } }) =>
    canReadSwap(deps, currentUser(req).id, params.swapId);

  router.get(
    '/swaps/:swapId/roster',
    requireUser,
    route(
      {
        params: swapParamsSchema,
        // The roster is read beside the policy's query of the swap: one round trip for both.
        authorize: (req, { params }) => canReadSwap(deps, currentUser(req).id, params.swapId, ROSTER_WITH_SWAP),
      },
      async ({ access: { swap, canManage, verdictsVisibleTo } }, req, res) => {
        const viewer = { userId: currentUser(req).id, canManage };
        const members = membersFromChunks(takeColumn<string[]>(swap, 'roster')!);
        res.json(await getRoster(deps, swap, { withAddresses: canManage, viewer, members, verdictsVisibleTo }));
      },
    ),
  );
  router.get(
    '/swaps/:swapId/activity',
    requireUser,
    route(
      { params: swapParamsSchema, query: activityQuerySchema, authorize: readSwap },
      async ({ params, query, access }, req, res) => {
        const lines = await listActivity(deps, params.swapId, query.limit, query.before);
        const viewer = { userId: currentUser(req).id, canManage: access.canManage };
        const seesAll = await viewerSeesAllVerdicts(viewer, access.swap.guildId, access.verdictsVisibleTo);
        res.json(seesAll ? lines : activitiesForMember(lines, viewer.userId));
      },
    ),
  );
  return router;
}
