/**
 * The reference for the burst benchmark: plain Express 5, one pg pool and socket.io on one node, no
 * session, no checks, no logging. A measurement is the API reference's single INSERT; the board's
 * changes are coalesced by the app's rule (the first after a quiet spell at once, the rest together
 * once 50 ms have passed since the last went out), each read with one query of the touched blocks' rows
 * and numbered in memory. It is what the burst's latency would be with none of the app's work: what
 * this machine allows under the same load. Run as its own process: DATABASE_URL and PORT from the
 * environment.
 */
import { createServer } from 'node:http';
import express from 'express';
import pg from 'pg';
import { Server } from 'socket.io';
import { BARE_MEASURE_SQL } from './bare-queries';

const INTERVAL_MS = 50;
const CHANGED_BLOCKS_SQL = `SELECT id, maker_id, sequence, state, verdict, trimmed FROM blocks WHERE id = ANY($1::int[])`;

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
const sentAt = new Map<number, number>();
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

async function drain(swapId: number) {
  for (;;) {
    const wait = (sentAt.get(swapId) ?? -Infinity) + INTERVAL_MS - performance.now();
    await new Promise((r) => (wait > 0 ? setTimeout(r, wait) : setImmediate(r)));
    const batch = queues.get(swapId)!.splice(0);
    if (batch.length === 0) break;
    const at = new Date().toISOString();
    const { rows } = await pool.query(CHANGED_BLOCKS_SQL, [batch.map((l) => l.blockId)]);
    const version = (versions.get(swapId) ?? 0) + 1;
    versions.set(swapId, version);
    io.to(room(swapId)).emit('board:changed', {
      swapId,
      version,
      activities: batch.map((l) => ({ id: l.measurementId, swapId, kind: 'block.measured', blockId: l.blockId, at })),
      patch: { rows },
    });
    sentAt.set(swapId, performance.now());
  }
  queues.delete(swapId);
  sentAt.delete(swapId);
}

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
