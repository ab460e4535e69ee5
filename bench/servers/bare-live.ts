/**
 * The reference for the burst benchmark: plain Express 5, one pg pool and socket.io on one node, no
 * session, no checks, no logging. A measurement is the API reference's single INSERT; the board's
 * changes are paced by the app's own code (server/board/change-pacing.ts: the first after a quiet spell
 * at once, the rest together, at most one each 50 ms), each read with one query of the touched blocks'
 * rows and numbered in memory. It is what the burst's latency would be with none of the app's work: what
 * this machine allows under the same load. Run as its own process: DATABASE_URL and PORT from the
 * environment. With BARE_MESSAGE=app each change carries what the app's message carries (every touched
 * maker's whole row with each block, the totals, named activity lines), still read with one query: the
 * burst with the app's messages but none of its other work.
 */
import { createServer } from 'node:http';
import express from 'express';
import pg from 'pg';
import { Server } from 'socket.io';
import type { BoardChange } from '../../shared/live-events';
import type { BlockState, SwapMode, SwapState } from '../../shared/schemas/swaps';
import { blockStateRank, blockStates } from '../../shared/vocabulary';
import { BARE_MEASURE_SQL } from './bare-queries';
import { paceChanges } from '../../server/board/change-pacing';

const INTERVAL_MS = 50;
const CHANGED_BLOCKS_SQL = `SELECT id, maker_id, sequence, state, verdict, trimmed FROM blocks WHERE id = ANY($1::int[])`;
// Blocks in `state` or past it, in the shared order of states (as the rows below count them).
const reached = (state: BlockState) =>
  `count(*) FILTER (WHERE state IN (${blockStates
    .slice(blockStateRank[state])
    .map((s) => `'${s}'`)
    .join(', ')}))::int AS ${state}`;
/** Every block of each touched maker, with the maker's name, the swap and its totals beside each row. */
const APP_SHAPED_SQL = `WITH totals AS (
  SELECT ${blockStates.map(reached).join(',\n         ')},
         count(*) FILTER (WHERE verdict = 'true')::int AS v_true, count(*) FILTER (WHERE verdict = 'trim')::int AS v_trim,
         count(*) FILTER (WHERE verdict = 'short')::int AS v_short, count(*) FILTER (WHERE verdict = 'skewed')::int AS v_skewed,
         count(DISTINCT maker_id)::int AS members
    FROM blocks WHERE swap_id = $2)
SELECT b.id, b.maker_id, u.display_name, b.sequence, b.state, s.state AS swap_state, s.title, s.mode,
       s.unfinished_width::float AS width, s.unfinished_height::float AS height, t.*
  FROM blocks b JOIN users u ON u.id = b.maker_id JOIN swaps s ON s.id = b.swap_id CROSS JOIN totals t
 WHERE b.swap_id = $2 AND b.maker_id IN (SELECT maker_id FROM blocks WHERE id = ANY($1::int[]))
 ORDER BY b.maker_id, b.sequence`;

interface Line {
  measurementId: number;
  blockId: number;
}

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 10 });
const app = express();
app.disable('x-powered-by');
app.use(express.json());
const server = createServer(app);
const io = new Server(server);

const versions = new Map<number, number>();
const queues = new Map<number, Line[]>();
const room = (swapId: number) => `board:${swapId}`;

io.on('connection', (socket) => {
  socket.on('board:join', (ref: { swapId: number }, ack: (answer: unknown) => void) => {
    void socket.join(room(ref.swapId));
    ack({ data: { version: versions.get(ref.swapId) ?? 0, viewers: [] } });
  });
});

function push(swapId: number, line: Line) {
  const queued = queues.get(swapId);
  if (queued) {
    queued.push(line);
    return;
  }
  queues.set(swapId, [line]);
  void drain(swapId);
}

function drain(swapId: number) {
  return paceChanges<Line[], object>(INTERVAL_MS, {
    take: () => {
      const batch = queues.get(swapId)!.splice(0);
      return batch.length > 0 ? batch : null;
    },
    read: (batch) => changeFor(swapId, batch, new Date().toISOString()),
    send: (change) => io.to(room(swapId)).emit('board:changed', change),
    stopped: () => queues.delete(swapId),
  });
}

function nextVersion(swapId: number) {
  const version = (versions.get(swapId) ?? 0) + 1;
  versions.set(swapId, version);
  return version;
}

/** The touched blocks' own rows and a bare line a measurement. */
async function plainChange(swapId: number, batch: Line[], at: string) {
  const { rows } = await pool.query(CHANGED_BLOCKS_SQL, [batch.map((l) => l.blockId)]);
  return {
    swapId,
    version: nextVersion(swapId),
    activities: batch.map((l) => ({ id: l.measurementId, swapId, kind: 'block.measured', blockId: l.blockId, at })),
    patch: { rows },
  };
}

interface ShapedRow {
  id: number;
  maker_id: number;
  display_name: string;
  sequence: number;
  state: BlockState;
  swap_state: SwapState;
  title: string;
  mode: SwapMode;
  width: number;
  height: number;
  pledged: number;
  sewn: number;
  handed_in: number;
  received: number;
  measured: number;
  returned: number;
  v_true: number;
  v_trim: number;
  v_short: number;
  v_skewed: number;
  members: number;
}

/** The app's message shape (shared/live-events.ts, as a member sees it), from one query. */
async function appShapedChange(swapId: number, batch: Line[], at: string): Promise<BoardChange> {
  const { rows } = await pool.query<ShapedRow>(APP_SHAPED_SQL, [batch.map((l) => l.blockId), swapId]);
  const first = rows[0]!;
  const makers = new Map<number, ShapedRow[]>();
  for (const row of rows) makers.set(row.maker_id, [...(makers.get(row.maker_id) ?? []), row]);
  const makerOf = new Map(rows.map((r) => [r.id, r]));
  const person = (r: ShapedRow) => ({ userId: r.maker_id, displayName: r.display_name });
  const atLeast = (blocks: ShapedRow[], state: BlockState) =>
    blocks.filter((b) => blockStateRank[b.state] >= blockStateRank[state]).length;
  return {
    swapId,
    version: nextVersion(swapId),
    activities: batch.map((l) => ({
      id: l.measurementId,
      swapId,
      kind: 'block.measured',
      // No session here: one name stands for the officer at every station, as in the app's bench.
      actor: { userId: 1, displayName: 'Burst Coordinator' },
      subject: person(makerOf.get(l.blockId)!),
      blockId: l.blockId,
      detail: { source: 'ruler', sequence: makerOf.get(l.blockId)!.sequence },
      at,
    })),
    patch: {
      swap: {
        id: swapId,
        state: first.swap_state,
        unfinished: { width: first.width, height: first.height },
        title: first.title,
        mode: first.mode,
      },
      totals: {
        pledged: first.pledged,
        sewn: first.sewn,
        handedIn: first.handed_in,
        received: first.received,
        measured: first.measured,
        returned: first.returned,
        verdicts: { true: first.v_true, trim: first.v_trim, short: first.v_short, skewed: first.v_skewed },
        accepted: first.v_true + first.v_trim,
        members: first.members,
      },
      rows: [...makers.values()].map((blocks) => ({
        ...person(blocks[0]!),
        pledged: blocks.length,
        sewn: atLeast(blocks, 'sewn'),
        handedIn: atLeast(blocks, 'handed_in'),
        received: atLeast(blocks, 'received'),
        measured: atLeast(blocks, 'measured'),
        returned: atLeast(blocks, 'returned'),
        owed: blocks.length - atLeast(blocks, 'handed_in'),
        blocks: blocks.map((b) => ({ id: b.id, sequence: b.sequence, state: b.state, handIn: null, photos: [] })),
      })),
      removedUserIds: [],
      complete: false,
    },
  };
}

const changeFor = process.env.BARE_MESSAGE === 'app' ? appShapedChange : plainChange;

app.get('/health', (_req, res) => {
  res.json({ ok: true });
});
app.post('/swaps/:swapId/blocks/:blockId/measure', async (req, res) => {
  const body = req.body as { width: number; height: number };
  const blockId = Number(req.params.blockId);
  // Recorded just before the statement, as the app records a measurement's time.
  const at = new Date();
  const { rows } = await pool.query<{ id: number }>(BARE_MEASURE_SQL, [blockId, body.width, body.height]);
  // Queued before the answer goes out, as the app's committed measurement is.
  push(Number(req.params.swapId), { measurementId: rows[0]!.id, blockId });
  res.status(201).json({ id: rows[0]!.id, at: at.toISOString() });
});

server.listen(Number(process.env.PORT), '127.0.0.1');
process.once('SIGTERM', () => {
  void io.close();
  server.closeAllConnections();
  void pool.end().then(() => process.exit(0));
});
