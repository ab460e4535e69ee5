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
import { assertSwapIn, lockedBlock } from './blocks.service';
import { recordStep, snapshotOf, type Snapshot, type StepAction } from './step-log';

type Deps = Pick<AppDeps, 'events' | 'sequelize'>;

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
  blockId: number,
  actor: { userId: number; canManage: boolean },
): Promise<BlockDto & { undone: string }> {
  const { dto, after, undone } = await deps.sequelize.transaction(async (transaction) => {
    const { block, swap } = await lockedBlock(blockId, transaction);
    assertChangeable(swap, 'changed');
    const [step] = await deps.sequelize.query<StepRow>(
      `SELECT id, action, by_id, before, measurement_id FROM block_steps WHERE block_id = $blockId AND undone_at IS NULL ORDER BY id DESC LIMIT 1`,
      { bind: { blockId }, type: QueryTypes.SELECT, transaction },
    );
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
    const emit = () =>
      deps.events.emit('block.changed', {
        swapId: swap.id,
        guildId: swap.guildId,
        actorId: actor.userId,
        blockId,
        makerId: block.makerId,
        from,
        to: block.state,
      });
    return { dto: await blockDto(block, swap, transaction), after: emit, undone: undoWords[step.action] };
  });
  after();
  return { ...dto, undone };
}

/**
 * An officer accepts a measured block that is off size or out of square, with a reason; it then
 * takes part in the return like an accepted block. Undo takes the decision back.
 */
export async function acceptByDecision(deps: Deps, blockId: number, actorId: number, input: AcceptBlockInput): Promise<BlockDto> {
  const { dto, after } = await deps.sequelize.transaction(async (transaction) => {
    const { block, swap } = await lockedBlock(blockId, transaction);
    assertSwapIn(swap, ['collecting', 'sorting'], 'accepted');
    assertChangeable(swap, 'accepted');
    if (block.state !== 'measured') throw new ConflictError('Measure the block before deciding to accept it.', 'not_measured');
    if (isAccepted(block))
      throw new ConflictError('This block is accepted already; there is nothing to decide.', 'already_accepted');
    const before = snapshotOf(block);
    await block.update({ acceptedAt: new Date(), acceptedById: actorId, acceptedReason: input.reason }, { transaction });
    await recordStep(transaction, { blockId, action: 'accepted', byId: actorId, before });
    const emit = () =>
      deps.events.emit('block.changed', {
        swapId: swap.id,
        guildId: swap.guildId,
        actorId,
        blockId,
        makerId: block.makerId,
        from: 'measured',
        to: 'measured',
      });
    return { dto: await blockDto(block, swap, transaction), after: emit };
  });
  after();
  return dto;
}
