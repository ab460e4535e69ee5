/** The record of steps taken on a block, with the columns just before each, so a step can be undone. */
import { QueryTypes, type Transaction } from 'sequelize';
import { Block } from '../db/models';

export type StepAction = 'sewn' | 'handed_in' | 'received' | 'measured' | 'trimmed' | 'accepted';

/** The block columns a step may change, which an undo puts back. */
const RESTORED = [
  'state',
  'handInHow',
  'handInNote',
  'trimmed',
  'trimmedAt',
  'verdict',
  'receivedById',
  'sewnAt',
  'handedInAt',
  'receivedAt',
  'measuredAt',
  'acceptedAt',
  'acceptedById',
  'acceptedReason',
] as const;
export type Snapshot = Partial<Record<(typeof RESTORED)[number], unknown>>;

/** What the block looks like now, to keep with the step about to change it. */
export function snapshotOf(block: Block): Snapshot {
  return Object.fromEntries(RESTORED.map((k) => [k, block.get(k) ?? null]));
}

/** Records a step taken on a block, inside the transaction that took it. */
export async function recordStep(
  transaction: Transaction,
  step: { blockId: number; action: StepAction; byId: number; before: Snapshot; measurementId?: number | null },
): Promise<void> {
  await Block.sequelize!.query(
    `INSERT INTO block_steps (block_id, action, by_id, before, measurement_id) VALUES ($blockId, $action, $byId, $before::jsonb, $measurementId)`,
    {
      bind: {
        blockId: step.blockId,
        action: step.action,
        byId: step.byId,
        before: JSON.stringify(step.before),
        measurementId: step.measurementId ?? null,
      },
      type: QueryTypes.INSERT,
      transaction,
    },
  );
}
