import type { Model, ModelStatic } from 'sequelize';
import type { Role } from '@shared/schemas/guilds';
import { ForbiddenError, NotFoundError } from '../http/errors';
import { preparedPoolQuery } from '../db/prepared';
import { buildFromRow, modelColumns } from '../db/model-columns';
import type { AppDeps } from '../deps';
import { GUILD_ROLE, roleIn } from './guilds.queries';

/** Everything a guild role may do. Anything not listed is denied. */
export const guildPermissions = {
  'guild:read': ['admin', 'coordinator', 'member'],
  'guild:update': ['admin'],
  'members:read': ['admin', 'coordinator', 'member'],
  'members:manage': ['admin'],
  'invitations:read': ['admin', 'coordinator'],
  'invitations:create': ['admin', 'coordinator'],
  'invitations:create-officer': ['admin'],
  'swaps:read': ['admin', 'coordinator', 'member'],
  'swaps:manage': ['admin', 'coordinator'],
  'swaps:join': ['admin', 'coordinator', 'member'],
  'sewdays:read': ['admin', 'coordinator', 'member'],
  'sewdays:manage': ['admin', 'coordinator'],
  'chat:post': ['admin', 'coordinator', 'member'],
  'chat:moderate': ['admin'],
  'mail:read-log': ['admin'],
  'photos:read': ['admin', 'coordinator', 'member'],
  'photos:manage': ['admin', 'coordinator'],
  'intake:run': ['admin', 'coordinator'],
  'payments:pay': ['admin', 'coordinator', 'member'],
  /** The treasurer's work: every payment, exports, refunds, dues and currency. */
  'payments:manage': ['admin'],
} as const satisfies Record<string, readonly Role[]>;

export type GuildAction = keyof typeof guildPermissions;

export function can(role: Role | null | undefined, action: GuildAction): boolean {
  if (!role) return false;
  return (guildPermissions[action] as readonly Role[]).includes(role);
}

/**
 * Checks an action against the caller's role in the guild. Someone outside the guild (no active
 * membership) gets the same 404 as for an id that does not exist, with the same `missing` message,
 * so ids cannot be probed for existence; a member whose role falls short gets 403.
 */
export function assertGuildRole(
  role: Role | null | undefined,
  action: GuildAction,
  missing = 'That guild does not exist.',
): Role {
  if (!role) throw new NotFoundError(missing);
  if (!can(role, action)) throw new ForbiddenError();
  return role;
}

/** The caller's standing in a guild, once the policy has checked it. */
export interface GuildAccess {
  role: Role;
}

/**
 * Reads the caller's role in the guild and checks the action (404 outside it, 403 short of the role).
 * A named statement on the plain pool: every guild page, chat room, photo and sew day asks it, and a
 * Sequelize findOne cost more CPU to build than the database spent answering it.
 */
export async function authorizeGuild(
  deps: Pick<AppDeps, 'pool'>,
  userId: number,
  guildId: number,
  action: GuildAction,
  missing?: string,
): Promise<GuildAccess> {
  const [row] = await preparedPoolQuery<{ role: Role }>(deps.pool, GUILD_ROLE, { guildId, userId });
  return { role: assertGuildRole(row?.role, action, missing) };
}

const withRoleSql = new Map<string, string>();

/**
 * A row of a guild's own table (a photo, a sew day: any model with a `guildId`) by id, and the caller's
 * role in its guild, in one named statement on the plain pool. Null where no such row exists; the role
 * is null without an active membership, for `assertGuildRole` to refuse.
 */
export async function findWithGuildRole<M extends Model>(
  deps: Pick<AppDeps, 'pool'>,
  model: ModelStatic<M>,
  id: number,
  userId: number,
): Promise<{ found: M; role: Role | null } | null> {
  let sql = withRoleSql.get(model.name);
  if (!sql) {
    const table = model.getTableName();
    sql = `SELECT ${modelColumns(model, 't')}, ${roleIn('t.guild_id')} AS "viewerRole"
             FROM ${typeof table === 'string' ? table : table.tableName} t WHERE t.id = $id`;
    withRoleSql.set(model.name, sql);
  }
  const [row] = await preparedPoolQuery<Record<string, unknown>>(deps.pool, sql, { id, userId });
  if (!row) return null;
  const { viewerRole, ...values } = row;
  return { found: buildFromRow(model, values), role: (viewerRole ?? null) as Role | null };
}
