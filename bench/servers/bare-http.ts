/**
 * The leanest reference: node:http and one pg pool, the same single queries as the bare Express one,
 * no framework at all. Run as its own process: DATABASE_URL and PORT from the environment.
 */
import { createServer, type ServerResponse } from 'node:http';
import pg from 'pg';
import { BARE_MEASURE_SQL, BARE_ROSTER_SQL } from './bare-queries';

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 10 });

function send(res: ServerResponse, status: number, value: unknown) {
  const body = JSON.stringify(value);
  res.writeHead(status, { 'content-type': 'application/json; charset=utf-8', 'content-length': Buffer.byteLength(body) });
  res.end(body);
}

const server = createServer((req, res) => {
  const [, head, id] = (req.url ?? '').split('/');
  if (req.method === 'GET' && head === 'health') return send(res, 200, { ok: true });
  if (req.method === 'GET' && head === 'roster') {
    pool.query(BARE_ROSTER_SQL, [Number(id)]).then(
      ({ rows }) => send(res, 200, rows),
      () => send(res, 500, { error: 'query failed' }),
    );
    return;
  }
  if (req.method === 'POST' && head === 'measure') {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      const body = JSON.parse(Buffer.concat(chunks).toString('utf8')) as { width: number; height: number };
      pool.query(BARE_MEASURE_SQL, [Number(id), body.width, body.height]).then(
        ({ rows }) => send(res, 201, rows[0]),
        () => send(res, 500, { error: 'query failed' }),
      );
    });
    return;
  }
  send(res, 404, { error: 'not found' });
});
server.listen(Number(process.env.PORT), '127.0.0.1');
process.once('SIGTERM', () => {
  server.close();
  server.closeAllConnections();
  void pool.end().then(() => process.exit(0));
});
