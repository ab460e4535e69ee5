/**
 * Who may use intake (deny by default): coordinators and admins of the swap's guild run the intake
 * view; a member prints labels for their own blocks, officers for anyone's.
 */
import type { LabelsQuery } from '@shared/schemas/intake';
import type { Swap } from '../db/models';
import { assertGuildRole, can } from '../guilds/guilds.policy';
import { ForbiddenError, NotFoundError } from '../http/errors';
import { loadSwap } from '../swaps/swaps.policy';
import type { AppDeps } from '../deps';

const MISSING_SWAP = 'That swap does not exist.';

/** Coordinators and admins of the swap's guild; drafts have no blocks to take in. */
export async function canRunIntake(deps: Pick<AppDeps, 'pool'>, userId: number, swapId: number): Promise<Swap> {
  const { swap, role } = await loadSwap(deps, userId, swapId);
  if (!can(assertGuildRole(role, 'swaps:read', MISSING_SWAP), 'intake:run'))
    throw new ForbiddenError('Only the swap’s coordinators and the guild’s admins take blocks in.');
  return swap;
}

/**
 * Labels: `maker=me` (or the caller's own id) for any member of the guild; another maker or `all`
 * only for officers. Returns the swap and the maker to list (null for everyone).
 */
export async function canPrintLabels(
  deps: Pick<AppDeps, 'pool'>,
  userId: number,
  swapId: number,
  maker: LabelsQuery['maker'],
): Promise<{ swap: Swap; makerId: number | null }> {
  const { swap, role } = await loadSwap(deps, userId, swapId);
  const officer = can(assertGuildRole(role, 'swaps:read', MISSING_SWAP), 'intake:run');
  if (swap.state === 'draft' && !officer) throw new NotFoundError(MISSING_SWAP);
  const makerId = maker === 'me' ? userId : maker === 'all' ? null : maker;
  if (makerId !== userId && !officer) throw new ForbiddenError('Members print labels for their own blocks only.');
  return { swap, makerId };
}
