/**
 * API throughput and latency, side by side with a bare reference on the same machine and database:
 * GET of a swap roster (60 members × 4 blocks) and a measurement POST, through the whole app (session,
 * CSRF check, role check, validation, the verdict recomputed) versus plain Express + pg doing one
 * equivalent query with none of that. autocannon drives both over loopback.
 */
import type { Server } from 'node:http';
import express from 'express';
import pg from 'pg';
import autocannon from 'autocannon';
import supertest from 'supertest';
import { loadConfig } from '../server/config';
import { startServer } from '../server/index';
import { Membership } from '../server/db/models';
import { startThrowawayCluster } from '../scripts/lib/throwaway-cluster';
import { freePort } from '../scripts/lib/ports';

export interface ApiRow {
  name: string;
  connections: number;
  rate?: number;
  rps: number;
  p50_ms: number;
  p95_ms: number;
  p99_ms: number;
  errors: number;
  ratio?: string;
}

const MEMBERS = 60;
const BLOCKS = 4;
const DAY = 86_400_000;

async function seedSwap(url: string) {
  const agent = () => supertest.agent(url).set('X-Requested-With', 'blockpost');
  const coordinator = agent();
  await coordinator.post('/api/auth/register').send({ email: 'bench-coordinator@example.test', password: 'bench-password-1', displayName: 'Bench Coordinator' }).expect(201);
  const guild = await coordinator.post('/api/guilds').send({ name: 'Benchmark Bee' }).expect(201);
  const guildId = guild.body.id as number;
  const swap = await coordinator
    .post(`/api/guilds/${guildId}/swaps`)
    .send({
      title: 'Bench Nine-Patch',
      block: { kind: 'grid', columns: [3.5, 3.5, 3.5], rows: [3.5, 3.5, 3.5], seam: 0.25 },
      tolerance: '1/8',
      squareness: '1/4',
      colourRules: [{ role: 'light', note: 'any cream' }],
      quota: { min: 1, max: 6 },
      signupClosesAt: new Date(Date.now() + 10 * DAY).toISOString(),
      dueAt: new Date(Date.now() + 40 * DAY).toISOString(),
      mode: 'return',
    })
    .expect(201);
  const swapId = swap.body.id as number;
  await coordinator.post(`/api/swaps/${swapId}/transitions`).send({ to: 'signup' }).expect(200);
  for (let i = 0; i < MEMBERS; i++) {
    const member = agent();
    const res = await member
      .post('/api/auth/register')
      .send({ email: `bench-member-${i}@example.test`, password: 'bench-password-1', displayName: `Bench Maker ${String(i).padStart(2, '0')}` })
      .expect(201);
    await Membership.create({ guildId, userId: res.body.user.id, role: 'member' });
    await member.post(`/api/swaps/${swapId}/signups`).send({ blocks: BLOCKS }).expect(200);
  }
  await coordinator.post(`/api/swaps/${swapId}/transitions`).send({ to: 'sewing' }).expect(200);
  await coordinator.post(`/api/swaps/${swapId}/transitions`).send({ to: 'collecting' }).expect(200);
  const roster = await coordinator.get(`/api/swaps/${swapId}/roster`).expect(200);
  const blockIds: number[] = roster.body.rows.flatMap((r: { blocks: { id: number }[] }) => r.blocks.map((b) => b.id));
  // Half the blocks received and measured, so the roster carries verdicts.
  for (const id of blockIds.slice(0, blockIds.length / 2)) {
    await coordinator.post(`/api/blocks/${id}/received`).send({}).expect(200);
    await coordinator.post(`/api/blocks/${id}/measurements`).send({ width: '9 1/2', height: '9 7/16' }).expect(201);
  }
  const login = await supertest(url).post('/api/auth/login').set('X-Requested-With', 'blockpost')
    .send({ email: 'bench-coordinator@example.test', password: 'bench-password-1' }).expect(200);
  const cookie = (login.headers['set-cookie'] as unknown as string[]).map((c) => c.split(';')[0]).join('; ');
  return { swapId, blockIds, cookie };
}

/** The reference: plain Express and pg, one query each, no session, no checks. */
async function startBareReference(databaseUrl: string) {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 10 });
  const app = express();
  app.use(express.json());
  app.get('/roster/:swapId', async (req, res) => {
    const { rows } = await pool.query(
      `SELECT s.user_id, u.display_name, s.blocks, b.id, b.sequence, b.state, b.verdict, b.trimmed, b.recipient_id
         FROM signups s JOIN users u ON u.id = s.user_id LEFT JOIN blocks b ON b.swap_id = s.swap_id AND b.maker_id = s.user_id
        WHERE s.swap_id = $1 AND s.status = 'active' ORDER BY lower(u.display_name), b.sequence`,
      [Number(req.params.swapId)],
    );
    res.json(rows);
  });
  app.post('/measure/:blockId', async (req, res) => {
    const { rows } = await pool.query(
      `INSERT INTO measurements (block_id, source, width, height, verdict, deviation_width, deviation_height, created_at, updated_at)
       VALUES ($1, 'ruler', $2, $3, 'true', 0, 0, now(), now()) RETURNING id`,
      [Number(req.params.blockId), req.body.width, req.body.height],
    );
    res.status(201).json(rows[0]);
  });
  const port = await freePort();
  const server: Server = await new Promise((resolve) => {
    const s = app.listen(port, '127.0.0.1', () => resolve(s));
  });
  return { url: `http://127.0.0.1:${port}`, close: async () => { server.close(); await pool.end(); } };
}

const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))] ?? 0;

/** One autocannon run; latencies recorded per response so p95 is exact. */
async function cannon(opts: { name: string; url: string; connections: number; duration: number; rate?: number; method?: 'GET' | 'POST'; headers?: Record<string, string>; paths?: string[]; body?: string }): Promise<ApiRow> {
  const latencies: number[] = [];
  let next = 0;
  let finish!: (r: autocannon.Result) => void;
  let fail!: (e: unknown) => void;
  const done = new Promise<autocannon.Result>((resolve, reject) => ((finish = resolve), (fail = reject)));
  const instance = autocannon({
    url: opts.url,
    connections: opts.connections,
    duration: opts.duration,
    overallRate: opts.rate,
    headers: { 'content-type': 'application/json', ...opts.headers },
    requests: [
      {
        method: opts.method ?? 'GET',
        body: opts.body,
        setupRequest: (req) => (opts.paths ? { ...req, path: opts.paths[next++ % opts.paths.length] } : req),
      },
    ],
  }, (err, result) => (err ? fail(err) : finish(result)));
  instance.on('response', (_client, _status, _bytes, responseTime) => latencies.push(responseTime));
  const result = await done;
  latencies.sort((a, b) => a - b);
  return {
    name: opts.name,
    connections: opts.connections,
    ...(opts.rate ? { rate: opts.rate } : {}),
    rps: Math.round(result.requests.average),
    p50_ms: round(percentile(latencies, 50)),
    p95_ms: round(percentile(latencies, 95)),
    p99_ms: round(percentile(latencies, 99)),
    errors: result.errors + result.non2xx,
  };
}

const round = (n: number) => Math.round(n * 100) / 100;

/**
 * An open-model load at a steady rate: one request every 1/rate s whatever the answers do, so
 * latency is measured without the bursts autocannon's per-second rate limit produces.
 */
async function paced(opts: { name: string; url: string; rate: number; duration: number; headers: Record<string, string> }): Promise<ApiRow> {
  const latencies: number[] = [];
  let errors = 0;
  const inflight: Promise<void>[] = [];
  const start = performance.now();
  const total = opts.rate * opts.duration;
  for (let i = 0; i < total; i++) {
    const due = start + (i * 1000) / opts.rate;
    const wait = due - performance.now();
    if (wait > 0) await new Promise((r) => setTimeout(r, wait));
    const sent = performance.now();
    inflight.push(
      fetch(opts.url, { headers: opts.headers })
        .then(async (res) => {
          await res.arrayBuffer();
          if (!res.ok) errors += 1;
          latencies.push(performance.now() - sent);
        })
        .catch(() => void (errors += 1)),
    );
  }
  await Promise.all(inflight);
  const elapsed = (performance.now() - start) / 1000;
  latencies.sort((a, b) => a - b);
  return {
    name: opts.name, connections: 0, rate: opts.rate, rps: Math.round(latencies.length / elapsed),
    p50_ms: round(percentile(latencies, 50)), p95_ms: round(percentile(latencies, 95)), p99_ms: round(percentile(latencies, 99)), errors,
  };
}

export async function runApiBench(opts: { duration?: number } = {}): Promise<ApiRow[]> {
  const duration = opts.duration ?? 8;
  const cluster = await startThrowawayCluster('blockpost-bench-');
  const databaseUrl = await cluster.database('bench');
  const port = await freePort();
  const server = await startServer(
    loadConfig({
      NODE_ENV: 'production', DATABASE_URL: databaseUrl, SESSION_SECRET: 'bench-secret-bench-secret', PORT: String(port),
      LOG_LEVEL: 'silent', SERVE_CLIENT: 'false', JOBS: 'false', SMTP_URL: 'smtp://127.0.0.1:9', LOGIN_RATE_LIMIT: '1000',
    }),
  );
  const bare = await startBareReference(databaseUrl);
  const rows: ApiRow[] = [];
  try {
    const { swapId, blockIds, cookie } = await seedSwap(server.url);
    const measured = blockIds.slice(0, blockIds.length / 2).map((id) => `/api/blocks/${id}/measurements`);
    const app = { Cookie: cookie, 'X-Requested-With': 'blockpost' };
    const body = JSON.stringify({ width: '9 1/2', height: '9 1/2' });
    // Steady-rate runs first, on a rested machine, after a short warm-up of both servers.
    await paced({ name: 'warm-up', url: `${server.url}/api/swaps/${swapId}/roster`, rate: 50, duration: 1, headers: app });
    await paced({ name: 'warm-up', url: `${bare.url}/roster/${swapId}`, rate: 50, duration: 1, headers: {} });
    for (const rate of [50, 100, 200]) {
      const mine = await paced({ name: 'GET roster (app), steady rate', url: `${server.url}/api/swaps/${swapId}/roster`, rate, duration, headers: app });
      const ref = await paced({ name: 'GET roster (bare), steady rate', url: `${bare.url}/roster/${swapId}`, rate, duration, headers: {} });
      rows.push({ ...mine, ratio: 'goal p95 < 20 ms at 200 req/s' }, ref);
    }
    for (const connections of [50, 200]) {
      const mine = await cannon({ name: 'GET roster (app)', url: `${server.url}/api/swaps/${swapId}/roster`, connections, duration, headers: app });
      const ref = await cannon({ name: 'GET roster (bare Express + pg)', url: `${bare.url}/roster/${swapId}`, connections, duration });
      rows.push({ ...mine, ratio: `${Math.round((mine.rps / ref.rps) * 100)} % of bare` }, ref);
    }
    // The bare reference takes plain numbers; the app parses "9 1/2" and recomputes the verdict itself.
    const bareBody = JSON.stringify({ width: 9.5, height: 9.5 });
    const probe = await fetch(`${bare.url}${measured[0]!.replace('/api/blocks/', '/measure/').replace('/measurements', '')}`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: bareBody });
    if (probe.status !== 201) throw new Error(`the bare reference refused a measurement: ${probe.status} ${await probe.text()}`);
    for (const connections of [50, 200]) {
      const mine = await cannon({ name: 'POST measurement (app)', url: server.url, connections, duration, method: 'POST', headers: app, paths: measured, body });
      const refPaths = measured.map((p) => p.replace('/api/blocks/', '/measure/').replace('/measurements', ''));
      const ref = await cannon({ name: 'POST measurement (bare)', url: bare.url, connections, duration, method: 'POST', paths: refPaths, body: bareBody });
      rows.push({ ...mine, ratio: `${Math.round((mine.rps / ref.rps) * 100)} % of bare` }, ref);
    }
  } finally {
    await bare.close();
    await server.close();
    cluster.stop();
  }
  return rows;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  console.table(await runApiBench({ duration: Number(process.env.BENCH_SECONDS ?? 8) }));
  process.exit(0);
}
