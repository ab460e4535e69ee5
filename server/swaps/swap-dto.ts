/** Turns swap rows into the API's answers. */
import type { Role } from '@shared/schemas/guilds';
import type { SwapDto, SwapSummaryDto } from '@shared/swap-types';
import type { Swap } from '../db/models';
import { preparedPoolQuery } from '../db/prepared';
import type { AppDeps } from '../deps';
import { signupTally } from './swaps.queries';

interface SignupStats {
  signups: number;
  pledged: number;
  myPledge: number;
}

/** A row of `signupTally` as it arrives (counts and sums are bigints, read as text). */
export interface SignupStatsRow {
  signups: string;
  pledged: string;
  mine: string;
}

export const statsFrom = (r: SignupStatsRow): SignupStats => ({
  signups: Number(r.signups),
  pledged: Number(r.pledged),
  myPledge: Number(r.mine),
});

/** True while members may sign up, change their pledge or withdraw. */
export function signupIsOpen(swap: Swap, now = new Date()): boolean {
  return swap.state === 'signup' && swap.signupClosesAt.getTime() > now.getTime();
}

export function summaryDto(swap: Swap, stats: SignupStats): SwapSummaryDto {
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
    signups: stats.signups,
    pledged: stats.pledged,
    myPledge: stats.myPledge,
  };
}

type SwapDetailRow = {
  guildName: string;
  guildTimeZone: string;
  creatorName: string | null;
  recipientName: string | null;
} & SignupStatsRow;

/**
 * What a swap's full answer shows besides its own row, in one named statement: its guild, the names of
 * its creator and gift recipient, and its sign-up tallies (`signupTally`). A member opens
 * the swap's page and its board often; this was four queries built by Sequelize.
 */
const SWAP_DETAIL = `SELECT g.name AS "guildName", g.time_zone AS "guildTimeZone",
         (SELECT u.display_name FROM users u WHERE u.id = $createdById) AS "creatorName",
         (SELECT u.display_name FROM users u WHERE u.id = $giftRecipientId) AS "recipientName",
         t.signups, t.pledged, t.mine
    FROM guilds g
    CROSS JOIN LATERAL (${signupTally('$swapId')}) t
   WHERE g.id = $guildId`;

/** The full swap as one member sees it. */
export async function swapDto(
  deps: Pick<AppDeps, 'pool'>,
  swap: Swap,
  viewer: { userId: number; role: Role; canManage: boolean },
): Promise<SwapDto> {
  const [detail] = await preparedPoolQuery<SwapDetailRow>(deps.pool, SWAP_DETAIL, {
    guildId: swap.guildId,
    swapId: swap.id,
    userId: viewer.userId,
    createdById: swap.createdById ?? null,
    giftRecipientId: swap.giftRecipientId ?? null,
  });
  const stats = statsFrom(detail!);
  const giftRecipient =
    swap.mode !== 'gift'
      ? null
      : swap.giftRecipientId
        ? { userId: swap.giftRecipientId, name: detail!.recipientName ?? 'A former member' }
        : { userId: null, name: swap.giftRecipientName ?? '' };
  const creatorName = detail!.creatorName;
  return {
    ...summaryDto(swap, stats),
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
    createdBy: swap.createdById && creatorName != null ? { id: swap.createdById, displayName: creatorName } : null,
    createdAt: swap.createdAt.toISOString(),
    updatedAt: swap.updatedAt.toISOString(),
    distributionConfirmedAt: swap.distributionConfirmedAt?.toISOString() ?? null,
    fees: { entry: swap.entryFee, postage: swap.postageFee },
    signupOpen: signupIsOpen(swap),
    guild: { id: swap.guildId, name: detail!.guildName, timeZone: detail!.guildTimeZone },
    myRole: viewer.role,
    canManage: viewer.canManage,
  };
}
