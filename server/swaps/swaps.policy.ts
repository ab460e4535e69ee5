/**
 * Who may do what with swaps and blocks, on top of the guild roles (deny by default):
 * members read their guilds' swaps and act on their own sign-up and blocks; coordinators and
 * admins manage the swap, take blocks in, measure them, plan the return and export.
 */
import { literal } from 'sequelize';
import type { Role } from '@shared/schemas/guilds';
import { type Block, Swap } from '../db/models';
import { findBlockWithSwap } from '../blocks/block-with-swap';
import { assertGuildRole, can } from '../guilds/guilds.policy';
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

/**
 * The caller's role in the guild of the swap aliased `swapAlias`, read in the same query as the swap:
 * memberships hold one row per guild and user, and the subquery gives null without an active one.
 */
function viewerRoleSql(userId: number, swapAlias: string) {
  return `(SELECT m.role FROM memberships m WHERE m.guild_id = "${swapAlias}"."guild_id"
             AND m.user_id = ${Swap.sequelize!.escape(userId)} AND m.status = 'active')`;
}

/** Takes the role read by viewerRole off the swap, so the instance holds only its own columns. */
function takeViewerRole(swap: Swap): Role | null {
  const values = swap.dataValues as unknown as Record<string, unknown>;
  const role = (values.viewerRole ?? null) as Role | null;
  delete values.viewerRole;
  return role;
}

async function loadSwap(userId: number, swapId: number): Promise<{ swap: Swap; role: Role | null }> {
  const swap = await Swap.findByPk(swapId, { attributes: { include: [[literal(viewerRoleSql(userId, 'Swap')), 'viewerRole']] } });
  if (!swap) throw new NotFoundError('That swap does not exist.');
  return { swap, role: takeViewerRole(swap) };
}

/** Active members of the guild; drafts only for coordinators and admins. */
function readAccess(swap: Swap, role: Role | null): SwapAccess {
  const allowed = assertGuildRole(role, 'swaps:read');
  const canManage = can(allowed, 'swaps:manage');
  if (swap.state === 'draft' && !canManage) throw new NotFoundError('That swap does not exist.');
  return { swap, role: allowed, canManage };
}

/** Any active member of the swap's guild; drafts are visible only to coordinators and admins. */
export async function canReadSwap(userId: number, swapId: number): Promise<SwapAccess> {
  const { swap, role } = await loadSwap(userId, swapId);
  return readAccess(swap, role);
}

/** Coordinators and admins of the swap's guild. */
export async function canManageSwap(userId: number, swapId: number): Promise<SwapAccess> {
  const { swap, role } = await loadSwap(userId, swapId);
  return { swap, role: assertGuildRole(role, 'swaps:manage'), canManage: true };
}

/** Members of the guild may sign up for its swaps. */
export async function canJoinSwap(userId: number, swapId: number): Promise<SwapAccess> {
  const access = await canReadSwap(userId, swapId);
  if (!can(access.role, 'swaps:join')) throw new ForbiddenError();
  return access;
}

/** The block with its swap and the caller's role in the swap's guild, in one query. */
async function loadBlock(userId: number, blockId: number): Promise<{ block: Block; swap: Swap; role: Role | null }> {
  const found = await findBlockWithSwap(blockId, { extraSwapColumns: `${viewerRoleSql(userId, 's')} AS "swap.viewerRole"` });
  if (!found) throw new NotFoundError('That block does not exist.');
  return { ...found, role: takeViewerRole(found.swap) };
}

/** The block's maker or an officer of its guild may read it. */
export async function canReadBlock(userId: number, blockId: number): Promise<BlockAccess> {
  const { block, swap, role } = await loadBlock(userId, blockId);
  return { ...readAccess(swap, role), block, isMaker: block.makerId === userId };
}

/** Sewn, handed in and the maker's own measurement: only the maker. */
export async function canActAsMaker(userId: number, blockId: number): Promise<BlockAccess> {
  const access = await canReadBlock(userId, blockId);
  if (!access.isMaker) throw new ForbiddenError('This block belongs to another maker; only they can change it.');
  return access;
}

/** Received, ruler measurements and trimming: coordinators and admins. */
export async function canManageBlock(userId: number, blockId: number): Promise<BlockAccess> {
  const { block, swap, role } = await loadBlock(userId, blockId);
  return { swap, role: assertGuildRole(role, 'swaps:manage'), canManage: true, block, isMaker: block.makerId === userId };
}
