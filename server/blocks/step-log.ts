/** The record of steps taken on a block, with the columns just before each, so a step can be undone. */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { Block } from '../db/models';
import { transactionQuery } from '../db/prepared';

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

type Step = { blockId: number; action: StepAction; byId: number; before: Snapshot; measurementId?: number | null };

const stepBind = (step: Step) => ({
  blockId: step.blockId,
  action: step.action,
  byId: step.byId,
  before: JSON.stringify(step.before),
  measurementId: step.measurementId ?? null,
});

/** Records a step taken on a block, inside the transaction that took it. */
export async function recordStep(db: Sequelize, transaction: Transaction, step: Step): Promise<void> {
  await db.query(
    `INSERT INTO block_steps (block_id, action, by_id, before, measurement_id) VALUES ($blockId, $action, $byId, $before::jsonb, $measurementId)`,
    { bind: stepBind(step), type: QueryTypes.INSERT, transaction },
  );
}

const stepTexts = new Map<string, string>();

/**
 * The UPDATE of a step's block columns and the INSERT of the step (with the columns as they were), as
 * two CTEs named `changed` and `step`, and their binds (all but `$measurementId`, the step's
 * measurement, which the caller binds); `guard` is more of the UPDATE's condition.
 */
export function stepCtes(
  block: Block,
  changes: Partial<Record<(typeof RESTORED)[number], unknown>>,
  step: Omit<Step, 'blockId' | 'before' | 'measurementId'>,
  guard = '',
): { sql: string; bind: Record<string, unknown> } {
  const before = snapshotOf(block);
  const names = Object.keys(changes) as (keyof typeof changes)[];
  const values = Object.fromEntries(names.map((name, i) => [`c${i}`, changes[name] ?? null]));
  const { measurementId: _unused, ...bind } = stepBind({ ...step, blockId: block.id, before });
  // The same text for the same columns: a named statement is looked up by its text.
  const kind = `${names.join(',')}|${guard}`;
  let sql = stepTexts.get(kind);
  if (!sql) {
    const attributes = Block.getAttributes();
    const assignments = names.map((name, i) => `"${attributes[name]!.field ?? name}" = $c${i}`);
    sql = `changed AS (UPDATE blocks SET ${assignments.join(', ')}, updated_at = now() WHERE id = $blockId${guard} RETURNING id),
     step AS (INSERT INTO block_steps (block_id, action, by_id, before, measurement_id)
              SELECT id, $action, $byId, $before::jsonb, $measurementId FROM changed)`;
    stepTexts.set(kind, sql);
  }
  return { sql, bind: { ...values, ...bind } };
}

/**
 * Takes a step: changes the block's columns and records the step with the columns as they were, in
 * one statement. The instance is changed to match, so the answer is built without reading it again.
 */
export async function applyStep(
  transaction: Transaction,
  block: Block,
  changes: Partial<Record<(typeof RESTORED)[number], unknown>>,
  step: Omit<Step, 'blockId' | 'before'>,
): Promise<void> {
  const { sql, bind } = stepCtes(block, changes, step);
  await transactionQuery(transaction, `WITH ${sql} SELECT 1`, { ...bind, measurementId: step.measurementId ?? null });
  block.set(changes as never, { raw: true });
}
