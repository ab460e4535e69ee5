import { QueryTypes, type Transaction } from 'sequelize';
import type { ActivityDto } from '@shared/live-events';
import type { DomainEventMap, DomainEventName } from '../events';
import { Activity } from '../db/models';

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
 * Keeps one activity line per event worth one and answers them as the board shows them, newest
 * first, in a single statement: the lines go in with their block's number read on the way, and come
 * back with the names of who acted and whom it was about.
 */
export async function recordActivityLines(events: SwapEvent[], transaction: Transaction): Promise<ActivityDto[]> {
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
  if (lines.length === 0) return [];
  const numbered = lines.map((line, n) => ({ n, ...line }));
  const rows = await Activity.sequelize!.query<ActivityRow>(
    `WITH input AS (
       SELECT * FROM jsonb_to_recordset($lines::jsonb)
                AS l(n int, guild_id int, swap_id int, kind text, actor_id int, subject_id int, block_id int, detail jsonb)),
     inserted AS (
       INSERT INTO swap_activities (guild_id, swap_id, kind, actor_id, subject_id, block_id, detail, created_at)
       SELECT l.guild_id, l.swap_id, l.kind, l.actor_id, l.subject_id, l.block_id,
              CASE WHEN b.id IS NULL THEN l.detail ELSE l.detail || jsonb_build_object('sequence', b.sequence) END, $at
         FROM input l LEFT JOIN blocks b ON b.id = l.block_id
        ORDER BY l.n
       RETURNING *)
     SELECT a.id, a.swap_id, a.kind, a.actor_id, au.display_name AS actor_name, a.subject_id, su.display_name AS subject_name,
            a.block_id, a.detail, a.created_at
       FROM inserted a LEFT JOIN users au ON au.id = a.actor_id LEFT JOIN users su ON su.id = a.subject_id
      ORDER BY a.id DESC`,
    { bind: { lines: JSON.stringify(numbered), at: new Date() }, type: QueryTypes.SELECT, transaction },
  );
  return rows.map(toDto);
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
 * What a swap's stored history says happened before its first activity line: moves between states,
 * pledges, blocks sewn, handed in, received and trimmed, and measurements that stand. A swap made
 * before lines were kept (the demo guild's, for one) is told from these; the minute of grace keeps
 * out the facts written in the same transaction as the first line, which that line already tells.
 * Each gets a negative id, the newest -1, so ids still fall from newest to oldest.
 */
const fromHistory = `
  WITH cut AS (
    SELECT COALESCE(MIN(created_at) - interval '1 minute', 'infinity'::timestamptz) AS at
      FROM swap_activities WHERE swap_id = $swapId),
  history AS (
    SELECT t.at, 1 AS src, t.id AS src_id,
           CASE WHEN t.from_state IS NULL THEN 'swap.created' ELSE 'swap.transitioned' END AS kind,
           t.by_id AS actor_id, NULL::int AS subject_id, NULL::int AS block_id,
           CASE WHEN t.from_state IS NULL THEN '{}'::jsonb ELSE jsonb_build_object('from', t.from_state, 'to', t.to_state) END AS detail
      FROM swap_transitions t WHERE t.swap_id = $swapId
    UNION ALL
    SELECT s.created_at, 2, s.id, 'signup.changed', s.user_id, s.user_id, NULL, jsonb_build_object('blocks', s.blocks)
      FROM signups s WHERE s.swap_id = $swapId
    UNION ALL
    SELECT b.sewn_at, 3, b.id, 'block.changed', b.maker_id, b.maker_id, b.id,
           jsonb_build_object('from', 'pledged', 'to', 'sewn', 'sequence', b.sequence)
      FROM blocks b WHERE b.swap_id = $swapId AND b.sewn_at IS NOT NULL
    UNION ALL
    SELECT b.handed_in_at, 4, b.id, 'block.changed', b.maker_id, b.maker_id, b.id,
           jsonb_build_object('from', 'sewn', 'to', 'handed_in', 'sequence', b.sequence)
      FROM blocks b WHERE b.swap_id = $swapId AND b.handed_in_at IS NOT NULL
    UNION ALL
    SELECT b.received_at, 5, b.id, 'block.changed', b.received_by_id, b.maker_id, b.id,
           jsonb_build_object('from', 'handed_in', 'to', 'received', 'sequence', b.sequence)
      FROM blocks b WHERE b.swap_id = $swapId AND b.received_at IS NOT NULL
    UNION ALL
    SELECT m.created_at, 6, m.id, 'block.measured', m.measured_by_id, b.maker_id, b.id,
           jsonb_build_object('verdict', m.verdict, 'source', m.source, 'sequence', b.sequence)
      FROM measurements m JOIN blocks b ON b.id = m.block_id
     WHERE b.swap_id = $swapId AND m.withdrawn_at IS NULL
    UNION ALL
    SELECT b.trimmed_at, 7, b.id, 'block.changed',
           (SELECT st.by_id FROM block_steps st
             WHERE st.block_id = b.id AND st.action = 'trimmed' AND st.undone_at IS NULL ORDER BY st.id DESC LIMIT 1),
           b.maker_id, b.id, jsonb_build_object('from', 'measured', 'to', 'measured', 'sequence', b.sequence)
      FROM blocks b WHERE b.swap_id = $swapId AND b.trimmed_at IS NOT NULL),
  derived AS (
    SELECT (-ROW_NUMBER() OVER (ORDER BY h.at DESC, h.src DESC, h.src_id DESC))::int AS id, h.*
      FROM history h, cut WHERE h.at < cut.at)`;

/**
 * A swap's activity, newest first: its kept lines, then what its stored history tells of the time
 * before them. `before` is the id of the oldest line already shown, for the next page.
 */
export async function listActivity(swapId: number, limit: number, before = 2147483647): Promise<ActivityDto[]> {
  const rows = await Activity.sequelize!.query<ActivityRow>(
    `${fromHistory},
     lines AS (
       SELECT a.id, a.kind, a.actor_id, a.subject_id, a.block_id, a.detail, a.created_at
         FROM swap_activities a WHERE a.swap_id = $swapId AND a.id < $before
       UNION ALL
       SELECT d.id, d.kind, d.actor_id, d.subject_id, d.block_id, d.detail, d.at
         FROM derived d WHERE d.id < $before
       ORDER BY id DESC LIMIT $limit)
     SELECT l.id, $swapId::int AS swap_id, l.kind, l.actor_id, au.display_name AS actor_name,
            l.subject_id, su.display_name AS subject_name, l.block_id, l.detail, l.created_at
       FROM lines l LEFT JOIN users au ON au.id = l.actor_id LEFT JOIN users su ON su.id = l.subject_id
      ORDER BY l.id DESC`,
    { bind: { swapId, limit, before }, type: QueryTypes.SELECT },
  );
  return rows.map(toDto);
}
