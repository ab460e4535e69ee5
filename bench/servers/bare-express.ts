/**
 * The reference for the API benchmark: plain Express 5 and one pg pool, one query per request, no
 * session, no checks, no logging. Run as its own process: DATABASE_URL and PORT from the environment.
 */
import express from 'express';
import pg from 'pg';
import { BARE_MEASURE_SQL, BARE_ROSTER_SQL } from './bare-queries';

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 10 });
const app = express();
app.disable('x-powered-by');
app.use(express.json());
app.get('/health', (_req, res) => {
  res.json({ ok: true });
});
app.get('/roster/:swapId', async (req, res) => {
  const { rows } = await pool.query(BARE_ROSTER_SQL, [Number(req.params.swapId)]);
  res.json(rows);
});
app.post('/measure/:blockId', async (req, res) => {
  const body = req.body as { width: number; height: number };
  const { rows } = await pool.query(BARE_MEASURE_SQL, [Number(req.params.blockId), body.width, body.height]);
  res.status(201).json(rows[0]);
});
const server = app.listen(Number(process.env.PORT), '127.0.0.1');
process.once('SIGTERM', () => {
  server.close();
  server.closeAllConnections();
  void pool.end().then(() => process.exit(0));
});
