import { QueryTypes } from 'sequelize';
import type { ActivityDto } from '@shared/live-events';
import type { DomainEventMap, DomainEventName } from '../events';
import type { Activity } from '../db/models';
import type { AppDeps } from '../deps';
import { ACTIVITY_PAGE } from './board.queries';

export type SwapEvent = {
  name: DomainEventName;
  payload: DomainEventMap[DomainEventName] & { swapId: number; guildId: number; actorId?: number };
};

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
      return {
        subjectId: num('makerId'),
        blockId: num('blockId'),
        detail: { verdict: String(p.verdict), source: String(p.source) },
      };
    case 'photo.added':
      return { subjectId: num('makerId'), blockId: num('blockId'), detail: { photoId: num('photoId') } };
    case 'distribution.confirmed':
      return { subjectId: null, blockId: null, detail: { transfers: num('transfers') } };
    default:
      return null;
  }
}

/**
 * The activity lines worth keeping for `events`, numbered in order, as RECORD_ACTIVITY's $1 (null for
 * none): the statement puts them in with their block's number read on the way, and answers them with
 * the names of who acted and whom it was about.
 */
export function activityLinesJson(events: SwapEvent[]): string | null {
  const lines = events.flatMap((e) => {
    const d = describe(e);
    if (!d) return [];
    return [
      {
        guild_id: e.payload.guildId,
        swap_id: e.payload.swapId,
        kind: e.name,
        actor_id: e.payload.actorId ?? null,
        subject_id: d.subjectId,
        block_id: d.blockId,
        detail: d.detail,
      },
    ];
  });
  return lines.length ? JSON.stringify(lines.map((line, n) => ({ n, ...line }))) : null;
}

/** The lines RECORD_ACTIVITY answered, as the board shows them. */
export function activityDtos(rows: unknown[]): ActivityDto[] {
  return (rows as ActivityRow[]).map(toDto);
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

/**
 * A swap's activity, newest first: its kept lines, then what its stored history tells of the time
 * before them. `before` is the id of the oldest line already shown, for the next page.
 */
export async function listActivity(
  deps: Pick<AppDeps, 'sequelize'>,
  swapId: number,
  limit: number,
  before = 2147483647,
): Promise<ActivityDto[]> {
  const rows = await deps.sequelize.query<ActivityRow>(ACTIVITY_PAGE, {
    bind: { swapId, limit, before },
    type: QueryTypes.SELECT,
  });
  return rows.map(toDto);
}
