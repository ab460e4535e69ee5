/**
 * Who may do what with payments (deny by default): every member pays their own dues and fees and
 * sees their own payments; officers see who has paid a swap's fees; only admins, as the guild's
 * treasurer, see every payment, export them and refund.
 */
import type { Role } from '@shared/schemas/guilds';
import { authorizeGuild, can } from '../guilds/guilds.policy';
import { canReadSwap } from '../swaps/swaps.policy';
import type { AppDeps } from '../deps';

export async function canPayGuild(
  deps: Pick<AppDeps, 'pool'>,
  userId: number,
  guildId: number,
): Promise<{ role: Role; isTreasurer: boolean }> {
  const { role } = await authorizeGuild(deps, userId, guildId, 'payments:pay');
  return { role, isTreasurer: can(role, 'payments:manage') };
}

export async function canTreasure(deps: Pick<AppDeps, 'pool'>, userId: number, guildId: number): Promise<void> {
  await authorizeGuild(deps, userId, guildId, 'payments:manage');
}

/** Members of the swap's guild pay its fees; officers also see everyone's standing. */
export async function canPaySwap(deps: Pick<AppDeps, 'pool'>, userId: number, swapId: number): Promise<{ canManage: boolean }> {
  const access = await canReadSwap(deps, userId, swapId);
  if (!can(access.role, 'payments:pay')) return { canManage: false };
  return { canManage: access.canManage };
}
