/** Turns swap rows into the API's answers. */
import { QueryTypes } from 'sequelize';
import type { Role } from '@shared/schemas/guilds';
import type { SwapDto, SwapSummaryDto, SwapTransitionDto } from '@shared/swap-types';
import { Guild, type Swap, type SwapTransition, User } from '../db/models';
import type { AppDeps } from '../deps';
import { SIGNUP_STATS } from './swaps.queries';

interface SignupStats {
  signups: number;
  pledged: number;
  myPledge: number;
}

/** Active sign-ups, blocks pledged and the caller's own pledge, per swap, in one query. */
export async function signupStats(
  deps: Pick<AppDeps, 'sequelize'>,
  swapIds: number[],
  userId: number,
): Promise<Map<number, SignupStats>> {
  const stats = new Map<number, SignupStats>();
  if (swapIds.length === 0) return stats;
  const rows = await deps.sequelize.query<{ swap_id: number; signups: string; pledged: string; mine: string }>(SIGNUP_STATS, {
    bind: { ids: swapIds, userId },
    type: QueryTypes.SELECT,
  });
  for (const r of rows)
    stats.set(r.swap_id, { signups: Number(r.signups), pledged: Number(r.pledged), myPledge: Number(r.mine) });
  return stats;
}

/** True while members may sign up, change their pledge or withdraw. */
export function signupIsOpen(swap: Swap, now = new Date()): boolean {
  return swap.state === 'signup' && swap.signupClosesAt.getTime() > now.getTime();
}

export function summaryDto(swap: Swap, stats: SignupStats | undefined): SwapSummaryDto {
  return {
    id: swap.id,
    guildId: swap.guildId,
    title: swap.title,
    state: swap.state,
    mode: swap.mode,
    unfinished: { width: swap.unfinishedWidth, height: swap.unfinishedHeight },
    signupClosesAt: swap.signupClosesAt.toISOString(),
    dueAt: swap.dueAt.toISOString(),
    quota: { min: swap.quotaMin, max: swap.quotaMax },
    signups: stats?.signups ?? 0,
    pledged: stats?.pledged ?? 0,
    myPledge: stats?.myPledge ?? 0,
  };
}

/** The full swap as one member sees it. */
export async function swapDto(
  deps: Pick<AppDeps, 'sequelize'>,
  swap: Swap,
  viewer: { userId: number; role: Role; canManage: boolean },
): Promise<SwapDto> {
  const [guild, creator, stats, recipient] = await Promise.all([
    Guild.findByPk(swap.guildId),
    swap.createdById ? User.findByPk(swap.createdById, { attributes: ['id', 'displayName'] }) : null,
    signupStats(deps, [swap.id], viewer.userId),
    swap.giftRecipientId ? User.findByPk(swap.giftRecipientId, { attributes: ['id', 'displayName'] }) : null,
  ]);
  const giftRecipient =
    swap.mode !== 'gift'
      ? null
      : swap.giftRecipientId
        ? { userId: swap.giftRecipientId, name: recipient?.displayName ?? 'A former member' }
        : { userId: null, name: swap.giftRecipientName ?? '' };
  return {
    ...summaryDto(swap, stats.get(swap.id)),
    description: swap.description,
    block: swap.blockSpec,
    seam: swap.seam,
    finished: { width: swap.finishedWidth, height: swap.finishedHeight },
    tolerance: swap.tolerance,
    squareness: swap.squareness,
    colourRules: swap.colourRules,
    signupReminderDays: swap.signupReminderDays,
    dueReminderDays: swap.dueReminderDays,
    giftRecipient,
    createdBy: creator ? { id: creator.id, displayName: creator.displayName } : null,
    createdAt: swap.createdAt.toISOString(),
    updatedAt: swap.updatedAt.toISOString(),
    distributionConfirmedAt: swap.distributionConfirmedAt?.toISOString() ?? null,
    fees: { entry: swap.entryFee, postage: swap.postageFee },
    signupOpen: signupIsOpen(swap),
    guild: { id: guild!.id, name: guild!.name, timeZone: guild!.timeZone },
    myRole: viewer.role,
    canManage: viewer.canManage,
  };
}

export function transitionDto(t: SwapTransition): SwapTransitionDto {
  return {
    id: t.id,
    from: t.fromState,
    to: t.toState,
    by: t.by ? { id: t.by.id, displayName: t.by.displayName } : null,
    at: t.at.toISOString(),
    reason: t.reason ?? null,
  };
}
