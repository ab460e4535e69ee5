/**
 * Who may use the design wall of a swap (deny by default): any active member of the swap's guild
 * has their own wall (drafts stay hidden). What they may place on it is settled by the service:
 * blocks returned to them and blocks they made; in a gift swap, coordinators and admins may place
 * every returned block.
 */
import type { AppDeps } from '../deps';
import { canReadSwap, type SwapAccess } from '../swaps/swaps.policy';

export interface DesignAccess extends SwapAccess {
  userId: number;
  /** an officer of a gift swap lays out the whole gift */
  allReturned: boolean;
}

export async function canUseDesignWall(deps: Pick<AppDeps, 'pool'>, userId: number, swapId: number): Promise<DesignAccess> {
  const access = await canReadSwap(deps, userId, swapId);
  return { ...access, userId, allReturned: access.swap.mode === 'gift' && access.canManage };
}
