/**
 * Who may do what with swaps, on top of the guild roles (deny by default): members read their
 * guilds' swaps and act on their own sign-up; coordinators and admins manage the swap, plan the
 * return and export. The rules for single blocks build on these in blocks/blocks.policy.ts.
 */
import type { Role } from '@shared/schemas/guilds';
import { Swap } from '../db/models';
import { assertGuildRole, can } from '../guilds/guilds.policy';
import { ForbiddenError, NotFoundError } from '../http/errors';
import type { AppDeps } from '../deps';
import { swapWithViewerRole } from './swaps.queries';

export interface SwapAccess {
  swap: Swap;
  role: Role;
  canManage: boolean;
}

/** Takes the role read by the viewerRole subquery off the swap, so the instance holds only its own columns. */
export function takeViewerRole(swap: Swap): Role | null {
  const values: Record<string, unknown> = swap.dataValues;
  const role = (values.viewerRole ?? null) as Role | null;
  delete values.viewerRole;
  return role;
}

/**
 * Columns read with the swap in the policy's query, under a statement name of their own: a route
 * that needs more of the swap than its row (the board's roster) reads it in the same round trip.
 * Their values arrive on the swap's dataValues for the route to take (`takeColumn`).
 */
export interface SwapReadExtra {
  name: string;
  columns: string;
}

/** Takes an extra column read with the swap off its instance. */
export function takeColumn<T>(swap: Swap, name: string): T | undefined {
  const values: Record<string, unknown> = swap.dataValues;
  const value = values[name] as T | undefined;
  delete values[name];
  return value;
}

const SWAP_WITH_ROLE: SwapReadExtra = { name: 'swap-with-role', columns: '' };

/**
 * The swap and the caller's role in one query, its SQL written out once: on every swap request
 * Sequelize spent more CPU building a findByPk with the role's subquery than the database spent
 * answering it. A named statement on the plain pool, so PostgreSQL keeps its plan; the instance is
 * built from the row as findByPk would build it (the pool parses these column types as Sequelize does).
 */
async function loadSwap(
  deps: Pick<AppDeps, 'pool'>,
  userId: number,
  swapId: number,
  extra: SwapReadExtra = SWAP_WITH_ROLE,
): Promise<{ swap: Swap; role: Role | null }> {
  const {
    rows: [row],
  } = await deps.pool.query<Record<string, unknown>>({
    name: extra.name,
    text: swapWithViewerRole(extra.columns || undefined),
    values: [swapId, userId],
  });
  if (!row) throw new NotFoundError('That swap does not exist.');
  const { viewerRole: role, ...values } = row;
  return { swap: Swap.build(values as never, { isNewRecord: false, raw: true }), role: (role ?? null) as Role | null };
}

/** Active members of the guild; drafts only for coordinators and admins. */
export function readAccess(swap: Swap, role: Role | null, missing = 'That swap does not exist.'): SwapAccess {
  const allowed = assertGuildRole(role, 'swaps:read', missing);
  const canManage = can(allowed, 'swaps:manage');
  if (swap.state === 'draft' && !canManage) throw new NotFoundError(missing);
  return { swap, role: allowed, canManage };
}

/** Any active member of the swap's guild; drafts are visible only to coordinators and admins. */
export async function canReadSwap(
  deps: Pick<AppDeps, 'pool'>,
  userId: number,
  swapId: number,
  extra?: SwapReadExtra,
): Promise<SwapAccess> {
  const { swap, role } = await loadSwap(deps, userId, swapId, extra);
  return readAccess(swap, role);
}

/** Coordinators and admins of the swap's guild. */
export async function canManageSwap(deps: Pick<AppDeps, 'pool'>, userId: number, swapId: number): Promise<SwapAccess> {
  const { swap, role } = await loadSwap(deps, userId, swapId);
  return { swap, role: assertGuildRole(role, 'swaps:manage', 'That swap does not exist.'), canManage: true };
}

/** Members of the guild may sign up for its swaps. */
export async function canJoinSwap(deps: Pick<AppDeps, 'pool'>, userId: number, swapId: number): Promise<SwapAccess> {
  const access = await canReadSwap(deps, userId, swapId);
  if (!can(access.role, 'swaps:join')) throw new ForbiddenError();
  return access;
}
