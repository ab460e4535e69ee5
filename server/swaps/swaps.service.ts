/** Setting up swaps and moving them through their states. */
import { Op, QueryTypes, type Transaction } from 'sequelize';
import { QuiltInputError } from '@shared/quilt';
import { blockSizes, type BlockSpec } from '@shared/schemas/blocks';
import {
  isStepBack,
  scheduleFields,
  swapMoves,
  swapRuleProblems,
  type CreateSwap,
  type SwapState,
  type UpdateSwap,
} from '@shared/schemas/swaps';
import type { Role } from '@shared/schemas/guilds';
import type { SwapDto, SwapSummaryDto, SwapTransitionDto, TransitionPreviewDto } from '@shared/swap-types';
import { Block, Guild, Membership, Signup, Swap, SwapTransition } from '../db/models';
import { daysUntil, inDays, mailDate } from '../mail/format';
import { ConflictError, NotFoundError, ValidationError } from '../http/errors';
import type { AppDeps } from '../deps';
import { statsFrom, summaryDto, swapDto, type SignupStatsRow } from './swap-dto';
import { ANNOUNCEMENT_AUDIENCE, BLOCK_STATE_COUNTS, swapList } from './swaps.queries';
import { preparedPoolQuery } from '../db/prepared';
import { buildFromRow } from '../db/model-columns';

type Deps = Pick<AppDeps, 'events' | 'sequelize' | 'pool'>;
type Viewer = { userId: number; role: Role; canManage: boolean };

/** Sizes from the engine; an engine objection becomes a 400 on the block's field. */
function sizesOf(block: BlockSpec) {
  try {
    return blockSizes(block);
  } catch (error) {
    if (error instanceof QuiltInputError) throw new ValidationError(error.message, { [`block.${error.field}`]: error.message });
    throw error;
  }
}

function specColumns(block: BlockSpec) {
  const sizes = sizesOf(block);
  return {
    blockSpec: block,
    seam: sizes.seam,
    unfinishedWidth: sizes.unfinished.width,
    unfinishedHeight: sizes.unfinished.height,
    finishedWidth: sizes.finished.width,
    finishedHeight: sizes.finished.height,
  };
}

async function assertGiftRecipient(guildId: number, userId: number | null | undefined, transaction?: Transaction) {
  if (!userId) return;
  const member = await Membership.findOne({ where: { guildId, userId, status: 'active' }, transaction });
  if (!member)
    throw new ValidationError('The gift recipient must be a member of this guild.', {
      giftRecipientId: 'Choose a member of this guild.',
    });
}

/** Creates a swap as a draft and records its creation in the history. */
export async function createSwap(deps: Deps, guildId: number, viewer: Viewer, input: CreateSwap): Promise<SwapDto> {
  await assertGiftRecipient(guildId, input.giftRecipientId);
  const swap = await deps.sequelize.transaction(async (transaction) => {
    const created = await Swap.create(
      {
        guildId,
        title: input.title,
        description: input.description,
        ...specColumns(input.block),
        tolerance: input.tolerance,
        squareness: input.squareness,
        colourRules: input.colourRules.map((r) => ({ role: r.role, note: r.note })),
        quotaMin: input.quota.min,
        quotaMax: input.quota.max,
        signupClosesAt: input.signupClosesAt,
        dueAt: input.dueAt,
        signupReminderDays: input.signupReminderDays,
        dueReminderDays: input.dueReminderDays,
        mode: input.mode,
        giftRecipientId: input.mode === 'gift' ? (input.giftRecipientId ?? null) : null,
        giftRecipientName: input.mode === 'gift' && !input.giftRecipientId ? (input.giftRecipientName?.trim() ?? null) : null,
        entryFee: input.fees?.entry ?? 0,
        postageFee: input.fees?.postage ?? 0,
        createdById: viewer.userId,
      },
      { transaction },
    );
    await SwapTransition.create({ swapId: created.id, fromState: null, toState: 'draft', byId: viewer.userId }, { transaction });
    return created;
  });
  deps.events.emit('swap.created', { swapId: swap.id, guildId, actorId: viewer.userId });
  return swapDto(deps, await swap.reload(), viewer);
}

/** The guild's swaps, newest first; drafts only for officers. */
/** The guild's swaps with their sign-up tallies, newest first (drafts for officers only), in one statement. */
export async function listSwaps(deps: Pick<AppDeps, 'pool'>, guildId: number, viewer: Viewer): Promise<SwapSummaryDto[]> {
  const rows = await preparedPoolQuery<Record<string, unknown> & SignupStatsRow>(deps.pool, swapList(), {
    guildId,
    userId: viewer.userId,
    withDrafts: viewer.canManage,
  });
  return rows.map(({ signups, pledged, mine, ...swap }) =>
    summaryDto(buildFromRow(Swap, swap), statsFrom({ signups, pledged, mine })),
  );
}

export const getSwap = (deps: Pick<AppDeps, 'pool'>, swap: Swap, viewer: Viewer) => swapDto(deps, swap, viewer);

/**
 * Applies a PATCH. The block, tolerance, quota and mode change only in draft or sign-up; the title,
 * description and dates until the swap is complete or cancelled. Rules across fields are checked on
 * the merged result.
 */
export async function updateSwap(deps: Deps, swapId: number, viewer: Viewer, patch: UpdateSwap): Promise<SwapDto> {
  const swap = await deps.sequelize.transaction(async (transaction) => {
    const current = await Swap.findByPk(swapId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!current) throw new NotFoundError('That swap does not exist.');
    if (current.state === 'complete' || current.state === 'cancelled') {
      throw new ConflictError(`This swap is ${current.state}; it cannot be changed any more.`, 'swap_closed');
    }
    const specKeys = Object.keys(patch).filter((k) => !(scheduleFields as readonly string[]).includes(k));
    if (specKeys.length && current.state !== 'draft' && current.state !== 'signup') {
      throw new ConflictError(
        `The block, tolerance, quota and return mode can only change while the swap is a draft or open for sign-up (it is ${current.state} now; changed: ${specKeys.join(', ')}).`,
        'spec_locked',
      );
    }
    const merged = {
      quota: patch.quota ?? { min: current.quotaMin, max: current.quotaMax },
      signupClosesAt: patch.signupClosesAt ?? current.signupClosesAt,
      dueAt: patch.dueAt ?? current.dueAt,
      mode: patch.mode ?? current.mode,
      giftRecipientId: patch.giftRecipientId !== undefined ? patch.giftRecipientId : current.giftRecipientId,
      giftRecipientName: patch.giftRecipientName !== undefined ? patch.giftRecipientName : current.giftRecipientName,
    };
    if (patch.giftRecipientId && patch.giftRecipientName === undefined) merged.giftRecipientName = null;
    if (patch.giftRecipientName?.trim() && patch.giftRecipientId === undefined) merged.giftRecipientId = null;
    const problems = swapRuleProblems(merged);
    if (Object.keys(problems).length) throw new ValidationError(Object.values(problems)[0]!, problems);
    await assertGiftRecipient(current.guildId, merged.giftRecipientId, transaction);
    if (patch.quota) await assertPledgesFit(current.id, patch.quota, transaction);

    await current.update(
      {
        ...(patch.title !== undefined ? { title: patch.title } : {}),
        ...(patch.description !== undefined ? { description: patch.description } : {}),
        ...(patch.block ? specColumns(patch.block) : {}),
        ...(patch.tolerance !== undefined ? { tolerance: patch.tolerance } : {}),
        ...(patch.squareness !== undefined ? { squareness: patch.squareness } : {}),
        ...(patch.colourRules ? { colourRules: patch.colourRules.map((r) => ({ role: r.role, note: r.note })) } : {}),
        ...(patch.signupReminderDays !== undefined ? { signupReminderDays: patch.signupReminderDays } : {}),
        ...(patch.dueReminderDays !== undefined ? { dueReminderDays: patch.dueReminderDays } : {}),
        ...(patch.fees?.entry !== undefined ? { entryFee: patch.fees.entry } : {}),
        ...(patch.fees?.postage !== undefined ? { postageFee: patch.fees.postage } : {}),
        quotaMin: merged.quota.min,
        quotaMax: merged.quota.max,
        signupClosesAt: merged.signupClosesAt,
        dueAt: merged.dueAt,
        mode: merged.mode,
        giftRecipientId: merged.mode === 'gift' ? (merged.giftRecipientId ?? null) : null,
        giftRecipientName: merged.mode === 'gift' && !merged.giftRecipientId ? merged.giftRecipientName?.trim() || null : null,
      },
      { transaction },
    );
    return current;
  });
  deps.events.emit('swap.updated', { swapId, guildId: swap.guildId, actorId: viewer.userId });
  return swapDto(deps, swap, viewer);
}

async function assertPledgesFit(swapId: number, quota: { min: number; max: number }, transaction: Transaction) {
  const outside = await Signup.count({
    where: { swapId, status: 'active', [Op.or]: [{ blocks: { [Op.lt]: quota.min } }, { blocks: { [Op.gt]: quota.max } }] },
    transaction,
  });
  if (outside > 0) {
    throw new ConflictError(
      `${outside} member${outside === 1 ? ' has' : 's have'} pledged outside ${quota.min}–${quota.max} blocks; ask them to change their pledge first.`,
      'quota_conflict',
    );
  }
}

/** Why a move is not allowed right now, or null when it is. */
async function moveProblem(swap: Swap, to: SwapState, transaction: Transaction): Promise<string | null> {
  const from: SwapState = swap.state;
  if (!swapMoves[from].includes(to)) {
    if (from === 'complete' || from === 'cancelled') return `This swap is ${from}; it cannot move any more.`;
    return `A swap in “${from}” cannot move to “${to}”. From here it can move to: ${swapMoves[from].join(', ')}.`;
  }
  const now = Date.now();
  const countBlocks = (state: string | string[]) => Block.count({ where: { swapId: swap.id, state }, transaction });
  if (to === 'signup' && swap.signupClosesAt.getTime() <= now) {
    return 'Sign-up would close at once: move the sign-up close date later first.';
  }
  if (from === 'signup' && to === 'sewing') {
    const pledged = await Signup.count({ where: { swapId: swap.id, status: 'active' }, transaction });
    if (pledged === 0) return 'Nobody has signed up yet, so there is nothing to sew. Wait for sign-ups or cancel the swap.';
  }
  if (from === 'collecting' && to === 'sorting') {
    const unmeasured = await countBlocks('received');
    if (unmeasured > 0) {
      return `${unmeasured} received block${unmeasured === 1 ? ' is' : 's are'} not measured yet; measure every block that has arrived before sorting.`;
    }
    const measured = await countBlocks('measured');
    if (measured === 0) return 'No block has been received and measured yet, so there is nothing to sort.';
  }
  if (from === 'signup' && to === 'draft') {
    const signedUp = await Signup.count({ where: { swapId: swap.id, status: 'active' }, transaction });
    if (signedUp > 0) {
      return `${signedUp} member${signedUp === 1 ? ' has' : 's have'} signed up already, so the swap cannot go back to draft; keep sign-up open or cancel the swap.`;
    }
  }
  if (from === 'collecting' && to === 'sewing') {
    const inHand = await countBlocks(['received', 'measured', 'returned']);
    if (inHand > 0)
      return `${inHand} block${inHand === 1 ? ' has' : 's have'} been taken in already, so the swap cannot go back to sewing.`;
  }
  if (from === 'sorting' && to === 'collecting' && swap.distributionConfirmedAt) {
    return 'The return of blocks is already confirmed; the swap cannot go back to collecting.';
  }
  if (to === 'complete' && !swap.distributionConfirmedAt) {
    return 'Confirm who receives which blocks (the distribution) before marking the swap complete.';
  }
  return null;
}

/** Moves the swap to another state after checking the move; records who asked and when. */
export async function transitionSwap(
  deps: Deps,
  swapId: number,
  viewer: Viewer,
  to: SwapState,
  reason?: string,
): Promise<SwapDto> {
  const { swap, from } = await deps.sequelize.transaction(async (transaction) => {
    const current = await Swap.findByPk(swapId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!current) throw new NotFoundError('That swap does not exist.');
    const problem = await moveProblem(current, to, transaction);
    if (problem) throw new ConflictError(problem, 'transition_refused');
    const previous = current.state;
    await current.update({ state: to }, { transaction });
    await SwapTransition.create(
      { swapId, fromState: previous, toState: to, byId: viewer.userId, reason: reason || null },
      { transaction },
    );
    return { swap: current, from: previous };
  });
  deps.events.emit('swap.transitioned', { swapId, guildId: swap.guildId, actorId: viewer.userId, from, to });
  return swapDto(deps, swap, viewer);
}

/** A state change as TRANSITIONS_WITH_SWAP reads it (its instant inside JSON, so a string). */
export interface TransitionRow {
  id: number;
  from: SwapState | null;
  to: SwapState;
  byId: number | null;
  byName: string | null;
  at: string;
  reason: string | null;
}

/** The swap's state changes, read with the policy's query (TRANSITIONS_WITH_SWAP). */
export function listTransitions(rows: TransitionRow[]): SwapTransitionDto[] {
  return rows.map((t) => ({
    id: t.id,
    from: t.from,
    to: t.to,
    by: t.byId === null ? null : { id: t.byId, displayName: t.byName! },
    at: new Date(t.at).toISOString(),
    reason: t.reason,
  }));
}

type Warning = TransitionPreviewDto['warnings'][number];

/** Members who would get the announcement: not announced to before, and not switched off. */
async function announcementAudience(deps: Pick<AppDeps, 'sequelize'>, swap: Swap, transaction: Transaction): Promise<number> {
  const [row] = await deps.sequelize.query<{ n: string }>(ANNOUNCEMENT_AUDIENCE, {
    bind: { guildId: swap.guildId, swapId: swap.id },
    type: QueryTypes.SELECT,
    transaction,
  });
  return Number(row?.n ?? 0);
}

const blocksText = (n: number) => `${n} block${n === 1 ? '' : 's'}`;

/**
 * What moving the swap to `to` would do, without doing it: how many people get an e-mail, how many
 * blocks are still owed, and what is unusual (a refused move comes back as the `move_refused` warning).
 */
export async function previewTransition(
  deps: Pick<AppDeps, 'sequelize'>,
  swapId: number,
  to: SwapState,
  now = new Date(),
): Promise<TransitionPreviewDto> {
  return deps.sequelize.transaction(async (transaction) => {
    const swap = await Swap.findByPk(swapId, { transaction });
    if (!swap) throw new NotFoundError('That swap does not exist.');
    const counts = await deps.sequelize.query<{ state: string; verdict: string | null; trimmed: boolean; n: string }>(
      BLOCK_STATE_COUNTS,
      { bind: { swapId }, type: QueryTypes.SELECT, transaction },
    );
    const count = (match: (r: (typeof counts)[number]) => boolean) =>
      counts.filter(match).reduce((sum, r) => sum + Number(r.n), 0);
    const owedBlocks = count((r) => r.state === 'pledged' || r.state === 'sewn');
    const warnings: Warning[] = [];
    const problem = await moveProblem(swap, to, transaction);
    if (problem) warnings.push({ code: 'move_refused', message: problem });
    const from = swap.state;
    const due = swap.dueAt.getTime() > now.getTime();
    const tz = (await Guild.findByPk(swap.guildId, { attributes: ['timeZone'], transaction }))?.timeZone ?? 'UTC';
    const dueText = `${mailDate(swap.dueAt, tz, false)} (${inDays(daysUntil(swap.dueAt, now, tz))})`;

    if (from === 'signup' && to === 'sewing' && swap.signupClosesAt.getTime() > now.getTime()) {
      warnings.push({
        code: 'before_signup_close',
        message: 'Sign-up was meant to stay open longer; nobody can sign up or change a pledge once sewing starts.',
      });
    }
    if (to === 'sorting') {
      if (owedBlocks > 0)
        warnings.push({
          code: 'blocks_owed',
          message: `${blocksText(owedBlocks)} ${owedBlocks === 1 ? 'is' : 'are'} still owed by makers and will not take part in the return.`,
        });
      const onTheWay = count((r) => r.state === 'handed_in');
      if (onTheWay > 0)
        warnings.push({
          code: 'blocks_not_received',
          message: `${blocksText(onTheWay)} ${onTheWay === 1 ? 'is' : 'are'} marked handed in but not taken in yet.`,
        });
      if (due)
        warnings.push({ code: 'before_due_date', message: `Blocks are not due until ${dueText}; makers may still be sewing.` });
    }
    if (to === 'sorting' || to === 'complete') {
      const unmeasured = count((r) => r.state === 'received');
      if (unmeasured > 0)
        warnings.push({
          code: 'unmeasured_blocks',
          message: `${blocksText(unmeasured)} taken in ${unmeasured === 1 ? 'is' : 'are'} not measured yet.`,
        });
    }
    if (to === 'complete') {
      const left = count((r) => r.state === 'measured');
      if (left > 0)
        warnings.push({
          code: 'blocks_left_out',
          message: `${blocksText(left)} did not take part in the return (runs short, out of square or not trimmed); decide with their makers what happens to them.`,
        });
    }
    if (to === 'collecting' && from === 'sewing' && owedBlocks > 0 && due) {
      warnings.push({
        code: 'before_due_date',
        message: `Blocks are not due until ${dueText}; makers can still hand them in while collecting.`,
      });
    }
    if (isStepBack(from, to)) {
      warnings.push({
        code: 'step_back',
        message: `This takes the swap back from ${from} to ${to}; the history keeps who did it and when.`,
      });
    }
    if (to === 'cancelled') warnings.push({ code: 'cannot_undo', message: 'A cancelled swap cannot be reopened.' });
    const emails = to === 'signup' && !problem ? await announcementAudience(deps, swap, transaction) : 0;
    return { to, emails, owedBlocks, warnings };
  });
}
