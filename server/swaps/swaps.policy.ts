/**
 * Who may do what with swaps and blocks, on top of the guild roles (deny by default):
 * members read their guilds' swaps and act on their own sign-up and blocks; coordinators and
 * admins manage the swap, take blocks in, measure them, plan the return and export.
 */
import type { Role } from '@shared/schemas/guilds';
import { Block, Swap } from '../db/models';
import { authorizeGuild, can } from '../guilds/guilds.policy';
import { ForbiddenError, NotFoundError } from '../http/errors';

export interface SwapAccess {
  swap: Swap;
  role: Role;
  canManage: boolean;
}

export interface BlockAccess extends SwapAccess {
  block: Block;
  isMaker: boolean;
}

async function loadSwap(swapId: number): Promise<Swap> {
  const swap = await Swap.findByPk(swapId);
  if (!swap) throw new NotFoundError('That swap does not exist.');
  return swap;
}

/** Any active member of the swap's guild; drafts are visible only to coordinators and admins. */
export async function canReadSwap(userId: number, swapId: number): Promise<SwapAccess> {
  const swap = await loadSwap(swapId);
  const membership = await authorizeGuild(userId, swap.guildId, 'swaps:read');
  const canManage = can(membership.role, 'swaps:manage');
  if (swap.state === 'draft' && !canManage) throw new NotFoundError('That swap does not exist.');
  return { swap, role: membership.role, canManage };
}

/** Coordinators and admins of the swap's guild. */
export async function canManageSwap(userId: number, swapId: number): Promise<SwapAccess> {
  const swap = await loadSwap(swapId);
  const membership = await authorizeGuild(userId, swap.guildId, 'swaps:manage');
  return { swap, role: membership.role, canManage: true };
}

/** Members of the guild may sign up for its swaps. */
export async function canJoinSwap(userId: number, swapId: number): Promise<SwapAccess> {
  const access = await canReadSwap(userId, swapId);
  if (!can(access.role, 'swaps:join')) throw new ForbiddenError();
  return access;
}

async function loadBlock(blockId: number): Promise<Block> {
  const block = await Block.findByPk(blockId);
  if (!block) throw new NotFoundError('That block does not exist.');
  return block;
}

/** The block's maker or an officer of its guild may read it. */
export async function canReadBlock(userId: number, blockId: number): Promise<BlockAccess> {
  const block = await loadBlock(blockId);
  const access = await canReadSwap(userId, block.swapId);
  return { ...access, block, isMaker: block.makerId === userId };
}

/** Sewn, handed in and the maker's own measurement: only the maker. */
export async function canActAsMaker(userId: number, blockId: number): Promise<BlockAccess> {
  const access = await canReadBlock(userId, blockId);
  if (!access.isMaker) throw new ForbiddenError('This block belongs to another maker; only they can change it.');
  return access;
}

/** Received, ruler measurements and trimming: coordinators and admins. */
export async function canManageBlock(userId: number, blockId: number): Promise<BlockAccess> {
  const block = await loadBlock(blockId);
  const access = await canManageSwap(userId, block.swapId);
  return { ...access, block, isMaker: block.makerId === userId };
}
