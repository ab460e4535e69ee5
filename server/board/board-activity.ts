import { QueryTypes, type Transaction } from 'sequelize';
import type { ActivityDto } from '@shared/live-events';
import type { DomainEventMap, DomainEventName } from '../events';
import { Activity } from '../db/models';

export type SwapEvent = { name: DomainEventName; payload: DomainEventMap[DomainEventName] & { swapId: number; guildId: number; actorId?: number } };

type Detail = Activity['detail'];

/** The person an event is about, and what to remember of it. Null for events not worth a line. */
function describe({ name, payload }: SwapEvent): { subjectId: number | null; blockId: number | null; detail: Detail } | null {
  const p = payload as Record<string, unknown>;
  const num = (k: string) => (typeof p[k] === 'number' ? (p[k] as number) : null);
  switch (name) {
    case 'swap.created':
    case 'swap.updated':
      return { subjectId: null, blockId: null, detail: {} };
    case 'swap.transitioned':
      return { subjectId: null, blockId: null, detail: { from: String(p.from), to: String(p.to) } };
    case 'signup.changed':
      return { subjectId: num('userId'), blockId: null, detail: { blocks: num('blocks') } };
    case 'signup.withdrawn':
      return { subjectId: num('userId'), blockId: null, detail: {} };
    case 'block.changed':
      // A redistribution returns every block at once; its own line says so.
      if (p.to === 'returned') return null;
      // Being measured is told by the measurement's own line, with its verdict.
      if (p.to === 'measured' && p.from !== 'measured') return null;
      return { subjectId: num('makerId'), blockId: num('blockId'), detail: { from: String(p.from), to: String(p.to) } };
    case 'block.measured':
      return { subjectId: num('makerId'), blockId: num('blockId'), detail: { verdict: String(p.verdict), source: String(p.source) } };
    case 'photo.added':
      return { subjectId: num('makerId'), blockId: num('blockId'), detail: { photoId: num('photoId') } };
    case 'distribution.confirmed':
      return { subjectId: null, blockId: null, detail: { transfers: num('transfers') } };
    default:
      return null;
  }
}

/** Keeps one activity row per event worth a line; returns their ids. */
export async function recordActivities(events: SwapEvent[], transaction: Transaction): Promise<number[]> {
  const rows = events.flatMap((e) => {
    const d = describe(e);
    if (!d) return [];
    return [{ guildId: e.payload.guildId, swapId: e.payload.swapId, kind: e.name, actorId: e.payload.actorId ?? null, ...d }];
  });
  if (rows.length === 0) return [];
  // The block's number within its maker's set reads better than its id.
  const blockIds = rows.map((r) => r.blockId).filter((id): id is number => id !== null);
  if (blockIds.length) {
    const seq = await Activity.sequelize!.query<{ id: number; sequence: number }>('SELECT id, sequence FROM blocks WHERE id = ANY($ids::int[])', {
      bind: { ids: blockIds }, type: QueryTypes.SELECT, transaction,
    });
    for (const r of rows) {
      const found = seq.find((s) => s.id === r.blockId);
      if (found) r.detail = { ...r.detail, sequence: found.sequence };
    }
  }
  const created = await Activity.bulkCreate(rows, { transaction, returning: true });
  return created.map((a) => a.id);
}

interface ActivityRow {
  id: number;
  swap_id: number;
  kind: string;
  actor_id: number | null;
  actor_name: string | null;
  subject_id: number | null;
  subject_name: string | null;
  block_id: number | null;
  detail: Detail;
  created_at: Date;
}

const select = `SELECT a.id, a.swap_id, a.kind, a.actor_id, au.display_name AS actor_name, a.subject_id, su.display_name AS subject_name,
                       a.block_id, a.detail, a.created_at
                  FROM swap_activities a
                  LEFT JOIN users au ON au.id = a.actor_id
                  LEFT JOIN users su ON su.id = a.subject_id`;

function toDto(r: ActivityRow): ActivityDto {
  return {
    id: r.id,
    swapId: r.swap_id,
    kind: r.kind,
    actor: r.actor_id && r.actor_name ? { userId: r.actor_id, displayName: r.actor_name } : null,
    subject: r.subject_id && r.subject_name ? { userId: r.subject_id, displayName: r.subject_name } : null,
    blockId: r.block_id,
    detail: r.detail,
    at: new Date(r.created_at).toISOString(),
  };
}

/** The latest activity of a swap, newest first. */
export async function listActivity(swapId: number, limit: number): Promise<ActivityDto[]> {
  const rows = await Activity.sequelize!.query<ActivityRow>(`${select} WHERE a.swap_id = $swapId ORDER BY a.id DESC LIMIT $limit`, {
    bind: { swapId, limit }, type: QueryTypes.SELECT,
  });
  return rows.map(toDto);
}

export async function activitiesById(ids: number[]): Promise<ActivityDto[]> {
  if (ids.length === 0) return [];
  const rows = await Activity.sequelize!.query<ActivityRow>(`${select} WHERE a.id = ANY($ids::int[]) ORDER BY a.id DESC`, {
    bind: { ids }, type: QueryTypes.SELECT,
  });
  return rows.map(toDto);
}
