/**
 * Small steps on a block that can be taken back. Each step is kept with who took it and the block's
 * columns just before it; *Undo* puts the latest step's columns back, and an undone measurement stays
 * in the history marked withdrawn. An officer may also accept an off-size block with a reason.
 */
import { QueryTypes } from 'sequelize';
import type { AcceptBlockInput } from '@shared/schemas/blocks';
import type { BlockDto } from '@shared/swap-types';
import { Measurement, type Swap } from '../db/models';
import { ConflictError, ForbiddenError } from '../http/errors';
import type { AppDeps } from '../deps';
import { blockDto, isAccepted } from './block-dto';
import { assertSwapIn, blockChanged, type LockedBlock } from './blocks.service';
import { LAST_STEP } from './blocks.queries';
import { applyStep, type Snapshot, type StepAction } from './step-log';
import type { Reply } from '../http/route';

type Deps = Pick<AppDeps, 'events' | 'sequelize' | 'pool'>;

interface StepRow {
  id: number;
  action: StepAction;
  by_id: number | null;
  before: Snapshot;
  measurement_id: number | null;
}

const DATE_COLUMNS = new Set(['trimmedAt', 'sewnAt', 'handedInAt', 'receivedAt', 'measuredAt', 'acceptedAt']);

function restored(before: Snapshot): Record<string, unknown> {
  return Object.fromEntries(
    Object.entries(before).map(([k, v]) => [k, DATE_COLUMNS.has(k) && typeof v === 'string' ? new Date(v) : v]),
  );
}

const undoWords: Record<StepAction, string> = {
  sewn: 'Marked sewn',
  handed_in: 'Handed in',
  received: 'Taken in',
  measured: 'Measured',
  trimmed: 'Marked trimmed',
  accepted: 'Accepted by decision',
};

function assertChangeable(swap: Swap, doing: string) {
  if (swap.state === 'complete' || swap.state === 'cancelled') {
    throw new ConflictError(`This swap is ${swap.state}; its blocks cannot be ${doing} any more.`, 'swap_closed');
  }
  if (swap.distributionConfirmedAt)
    throw new ConflictError(
      `The return of blocks is already confirmed; blocks cannot be ${doing} any more.`,
      'distribution_confirmed',
    );
}

/**
 * Reverts the block's latest step. The one who took the step may undo it, and so may an officer;
 * never once the return is confirmed or the swap is complete. Answers the block as it is after.
 */
export async function undoLastStep(
  deps: Deps,
  locked: LockedBlock,
  actor: { userId: number; canManage: boolean },
): Promise<Reply<BlockDto & { undone: string }>> {
  const { block, swap, transaction } = locked;
  assertChangeable(swap, 'changed');
  const [step] = await deps.sequelize.query<StepRow>(LAST_STEP, {
    bind: { blockId: block.id },
    type: QueryTypes.SELECT,
    transaction,
  });
  if (!step) throw new ConflictError('There is no step on this block left to undo.', 'nothing_to_undo');
  if (step.by_id !== actor.userId && !actor.canManage) {
    throw new ForbiddenError('Someone else took the last step on this block; only they or a coordinator can undo it.');
  }
  const from = block.state;
  await block.update(restored(step.before), { transaction });
  if (step.measurement_id !== null) {
    await Measurement.update(
      { withdrawnAt: new Date(), withdrawnById: actor.userId },
      { where: { id: step.measurement_id }, transaction },
    );
  }
  await deps.sequelize.query(`UPDATE block_steps SET undone_at = now(), undone_by_id = $userId WHERE id = $id`, {
    bind: { id: step.id, userId: actor.userId },
    type: QueryTypes.UPDATE,
    transaction,
  });
  const dto = await blockDto(deps, block, swap, { transaction });
  return { body: { ...dto, undone: undoWords[step.action] }, after: blockChanged(deps, locked, actor.userId, from) };
}

/**
 * An officer accepts a measured block that is off size or out of square, with a reason; it then
 * takes part in the return like an accepted block. Undo takes the decision back.
 */
export async function acceptByDecision(
  deps: Deps,
  locked: LockedBlock,
  actorId: number,
  input: AcceptBlockInput,
): Promise<Reply<BlockDto>> {
  const { block, swap, transaction } = locked;
  assertSwapIn(swap, ['collecting', 'sorting'], 'accepted');
  assertChangeable(swap, 'accepted');
  if (block.state !== 'measured') throw new ConflictError('Measure the block before deciding to accept it.', 'not_measured');
  if (isAccepted(block))
    throw new ConflictError('This block is accepted already; there is nothing to decide.', 'already_accepted');
  await applyStep(
    transaction,
    block,
    { acceptedAt: new Date(), acceptedById: actorId, acceptedReason: input.reason },
    { action: 'accepted', byId: actorId },
  );
  return {
    body: await blockDto(deps, block, swap, { transaction }),
    after: blockChanged(deps, locked, actorId, 'measured'),
  };
}
