/**
 * Who may use intake (deny by default): coordinators and admins of the swap's guild run the intake
 * view; a member prints labels for their own blocks, officers for anyone's.
 */
import type { LabelsQuery } from '@shared/schemas/intake';
import { Swap } from '../db/models';
import { authorizeGuild, can } from '../guilds/guilds.policy';
import { ForbiddenError, NotFoundError } from '../http/errors';

async function loadSwap(swapId: number): Promise<Swap> {
  const swap = await Swap.findByPk(swapId);
  if (!swap) throw new NotFoundError('That swap does not exist.');
  return swap;
}

/** Coordinators and admins of the swap's guild; drafts have no blocks to take in. */
export async function canRunIntake(userId: number, swapId: number): Promise<Swap> {
  const swap = await loadSwap(swapId);
  const membership = await authorizeGuild(userId, swap.guildId, 'swaps:read', 'That swap does not exist.');
  if (!can(membership.role, 'intake:run'))
    throw new ForbiddenError('Only the swap’s coordinators and the guild’s admins take blocks in.');
  return swap;
}

/**
 * Labels: `maker=me` (or the caller's own id) for any member of the guild; another maker or `all`
 * only for officers. Returns the swap and the maker to list (null for everyone).
 */
export async function canPrintLabels(
  userId: number,
  swapId: number,
  maker: LabelsQuery['maker'],
): Promise<{ swap: Swap; makerId: number | null }> {
  const swap = await loadSwap(swapId);
  const membership = await authorizeGuild(userId, swap.guildId, 'swaps:read', 'That swap does not exist.');
  const officer = can(membership.role, 'intake:run');
  if (swap.state === 'draft' && !officer) throw new NotFoundError('That swap does not exist.');
  const makerId = maker === 'me' ? userId : maker === 'all' ? null : maker;
  if (makerId !== userId && !officer) throw new ForbiddenError('Members print labels for their own blocks only.');
  return { swap, makerId };
}
