/** A block and its swap, read in one query for the hot paths (policy checks, locked changes). */
import type { FindAttributeOptions, LOCK, Transaction } from 'sequelize';
import { Block, Swap } from '../db/models';

const SWAP_PREFIX = 'swap.';

/**
 * Reads the joined row flat (`raw`) and builds the two instances from its halves: Sequelize's
 * grouping of joined rows into nested instances costs more CPU than the query itself here. Extra
 * swap attributes (such as a subquery) stay on the swap's dataValues for the caller to take.
 */
export async function findBlockWithSwap(
  blockId: number,
  options: { swapAttributes?: FindAttributeOptions; transaction?: Transaction; lock?: { level: LOCK; of: typeof Block } } = {},
): Promise<{ block: Block; swap: Swap } | null> {
  const row = (await Block.findByPk(blockId, {
    include: [{ model: Swap, as: 'swap', required: true, ...(options.swapAttributes ? { attributes: options.swapAttributes } : {}) }],
    raw: true,
    transaction: options.transaction,
    lock: options.lock,
  })) as unknown as Record<string, unknown> | null;
  if (!row) return null;
  const blockValues: Record<string, unknown> = {};
  const swapValues: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(row)) {
    if (key.startsWith(SWAP_PREFIX)) swapValues[key.slice(SWAP_PREFIX.length)] = value;
    else blockValues[key] = value;
  }
  const swap = Swap.build(swapValues as never, { isNewRecord: false, raw: true });
  const block = Block.build(blockValues as never, { isNewRecord: false, raw: true });
  block.swap = swap;
  return { block, swap };
}
