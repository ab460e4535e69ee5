/**
 * Who may do what with one block, on top of the swap's rules (deny by default): the maker marks it
 * sewn, hands it in and measures it; coordinators and admins of the guild take it in, measure it
 * with the ruler and trim it; both may read it.
 */
import type pg from 'pg';
import type { Transaction } from 'sequelize';
import type { Role } from '@shared/schemas/guilds';
import type { Block, Swap } from '../db/models';
import { assertGuildRole } from '../guilds/guilds.policy';
import { ForbiddenError, NotFoundError } from '../http/errors';
import { readAccess, takeViewerRole, type SwapAccess } from '../swaps/swaps.policy';
import { viewerRole } from '../swaps/swaps.queries';
import { findBlockWithSwap } from './blocks.queries';

export interface BlockAccess extends SwapAccess {
  block: Block;
  isMaker: boolean;
}

/**
 * Where a policy reads the block: with a transaction, the block is locked there for the change the
 * request is about to make, and the service works on the instance read here.
 */
export interface BlockRead {
  pool: pg.Pool;
  transaction?: Transaction;
}

/** The block with its swap and the caller's role in the swap's guild, in one query. */
async function loadBlock(
  { pool, transaction }: BlockRead,
  userId: number,
  blockId: number,
): Promise<{ block: Block; swap: Swap; role: Role | null }> {
  const found = await findBlockWithSwap(pool, blockId, {
    extraSwapColumns: `${viewerRole('s')} AS "swap.viewerRole"`,
    bind: { viewerId: userId },
    transaction,
    lockForChange: !!transaction,
  });
  if (!found) throw new NotFoundError('That block does not exist.');
  return { ...found, role: takeViewerRole(found.swap) };
}

/** The block's maker or an officer of its guild may read it. */
export async function canReadBlock(read: BlockRead, userId: number, blockId: number): Promise<BlockAccess> {
  const { block, swap, role } = await loadBlock(read, userId, blockId);
  return readBlockAccess(block, swap, role, userId);
}

/** canReadBlock's decision on a block, its swap and the caller's role read elsewhere. */
export function readBlockAccess(block: Block, swap: Swap, role: Role | null, userId: number): BlockAccess {
  return { ...readAccess(swap, role, 'That block does not exist.'), block, isMaker: block.makerId === userId };
}

/** Sewn, handed in and the maker's own measurement: only the maker. */
export async function canActAsMaker(read: BlockRead, userId: number, blockId: number): Promise<BlockAccess> {
  const access = await canReadBlock(read, userId, blockId);
  if (!access.isMaker) throw new ForbiddenError('This block belongs to another maker; only they can change it.');
  return access;
}

/** Received, ruler measurements and trimming: coordinators and admins. */
export async function canManageBlock(read: BlockRead, userId: number, blockId: number): Promise<BlockAccess> {
  const { block, swap, role } = await loadBlock(read, userId, blockId);
  return {
    swap,
    role: assertGuildRole(role, 'swaps:manage', 'That block does not exist.'),
    canManage: true,
    block,
    isMaker: block.makerId === userId,
  };
}

export type MeasuringAs = 'ruler' | 'maker';

/**
 * Which measurement the caller records: the ruler one (coordinators and admins) or the maker's own
 * (the block's maker). Without `asked`, officers record the ruler one and the maker their own.
 */
export function measuringAs(access: BlockAccess, asked?: MeasuringAs): MeasuringAs {
  const source = asked ?? (access.canManage ? 'ruler' : 'maker');
  if (source === 'ruler' && !access.canManage) {
    throw new ForbiddenError('Only a coordinator or admin records the ruler measurement; yours is saved as the maker’s own.');
  }
  if (source === 'maker' && !access.isMaker)
    throw new ForbiddenError('Only the block’s maker can record the maker’s own measurement.');
  return source;
}
