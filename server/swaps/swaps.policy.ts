/**
 * Who may do what with swaps, on top of the guild roles (deny by default): members read their
 * guilds' swaps and act on their own sign-up; coordinators and admins manage the swap, plan the
 * return and export. The rules for single blocks build on these in blocks/blocks.policy.ts.
 */
import type { Role, VerdictsVisibleTo } from '@shared/schemas/guilds';
import { Swap } from '../db/models';
import { assertGuildRole, can } from '../guilds/guilds.policy';
import { ForbiddenError, NotFoundError } from '../http/errors';
import type { AppDeps } from '../deps';
import { swapWithViewerRole } from './swaps.queries';
import { oneTripRead } from '../db/one-trip';
import { buildFromRow } from '../db/model-columns';

export interface SwapAccess {
  swap: Swap;
  role: Role;
  canManage: boolean;
  /** the guild's verdict setting, where the policy's read gave it (canReadSwap, canManageSwap) */
  verdictsVisibleTo?: VerdictsVisibleTo;
}

/** Takes the role read by the viewerRole subquery off the swap, so the instance holds only its own columns. */
export function takeViewerRole(swap: Swap): Role | null {
  const values: Record<string, unknown> = swap.dataValues;
  const role = (values.viewerRole ?? null) as Role | null;
  delete values.viewerRole;
  return role;
}

/**
 * Rows read beside the swap in the policy's round trip, under a statement name of their own: a route
 * that needs more than the swap's row (the board's roster) reads it in the same message (`oneTripRead`).
 * `rows` takes the swap as $1 and the viewer as $2; the rows' `column`, in order, arrives as an array
 * of the same name on the swap's dataValues for the route to take (`takeColumn`).
 */
export interface SwapReadExtra {
  /** a plain SQL identifier: the statement is PREPAREd on the connection */
  name: string;
  rows: string;
  column: string;
}

/** Takes an extra column read with the swap off its instance. */
export function takeColumn<T>(swap: Swap, name: string): T | undefined {
  const values: Record<string, unknown> = swap.dataValues;
  const value = values[name] as T | undefined;
  delete values[name];
  return value;
}

/**
 * The swap and the caller's role in one query, its SQL written out once: on every swap request
 * Sequelize spent more CPU building a findByPk with the role's subquery than the database spent
 * answering it. A named statement on the plain pool, so PostgreSQL keeps its plan; the instance is
 * built from the row as findByPk would build it (the pool parses these column types as Sequelize does).
 * With `extra`, its rows are read in the same round trip.
 */
export async function loadSwap(
  deps: Pick<AppDeps, 'pool'>,
  userId: number,
  swapId: number,
  extra?: SwapReadExtra,
): Promise<{ swap: Swap; role: Role | null; verdictsVisibleTo: VerdictsVisibleTo }> {
  const row = extra
    ? await withExtraRows(deps, userId, swapId, extra)
    : (
        await deps.pool.query<Record<string, unknown>>({
          name: 'swap-with-role',
          text: swapWithViewerRole(),
          values: [swapId, userId],
        })
      ).rows[0];
  if (!row) throw new NotFoundError('That swap does not exist.');
  const { viewerRole: role, guildVerdictsVisibleTo, ...values } = row;
  return {
    swap: buildFromRow(Swap, values),
    role: (role ?? null) as Role | null,
    verdictsVisibleTo: guildVerdictsVisibleTo as VerdictsVisibleTo,
  };
}

async function withExtraRows(deps: Pick<AppDeps, 'pool'>, userId: number, swapId: number, extra: SwapReadExtra) {
  const [[row], rows] = (await oneTripRead(deps.pool, [
    { name: 'swap_with_role', text: swapWithViewerRole(), values: [swapId, userId] },
    { name: extra.name, text: extra.rows, values: [swapId, userId] },
  ])) as [Record<string, unknown>[], Record<string, unknown>[]];
  if (row) row[extra.column] = rows.map((r) => r[extra.column]);
  return row;
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
  const { swap, role, verdictsVisibleTo } = await loadSwap(deps, userId, swapId, extra);
  return { ...readAccess(swap, role), verdictsVisibleTo };
}

/** Coordinators and admins of the swap's guild. */
export async function canManageSwap(deps: Pick<AppDeps, 'pool'>, userId: number, swapId: number): Promise<SwapAccess> {
  const { swap, role, verdictsVisibleTo } = await loadSwap(deps, userId, swapId);
  return { swap, role: assertGuildRole(role, 'swaps:manage', 'That swap does not exist.'), canManage: true, verdictsVisibleTo };
}

/** Members of the guild may sign up for its swaps. */
export async function canJoinSwap(deps: Pick<AppDeps, 'pool'>, userId: number, swapId: number): Promise<SwapAccess> {
  const access = await canReadSwap(deps, userId, swapId);
  if (!can(access.role, 'swaps:join')) throw new ForbiddenError();
  return access;
}
