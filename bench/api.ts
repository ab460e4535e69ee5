/**
 * API throughput and latency beside two bare references on the same machine and database. Every
 * server is its own Node process: the app started as production starts it (server/index.ts,
 * NODE_ENV=production), bare Express + pg, and bare node:http + pg (one equivalent query each, no
 * session, no checks). Each load run is a separate autocannon process (bench/load.ts). Runs alternate
 * app / Express / node:http and repeat; medians are reported with their spread (min–max).
 * Run alone with `npx tsx bench/api.ts`; BENCH_SECONDS, BENCH_RUNS, BENCH_ONLY (a pattern of scenario
 * names), BENCH_PROFILE_DIR (a folder for the app's `node --cpu-prof` profile; summarise it with
 * `npx tsx bench/profile.ts <file>`) and BENCH_PG_STATS=1 (print the statements that took the most
 * database time, planning and running, from pg_stat_statements) adjust it.
 */
import { linearRegression, linearRegressionLine, rSquared } from 'simple-statistics';
import { startThrowawayCluster } from '../scripts/lib/throwaway-cluster';
import { freePort } from '../scripts/lib/ports';
import type { LoadOptions } from './load';
import { startNodeServer, type NodeProcess } from './lib/processes';
import { loadWithCpu, type LoadWithCpu } from './lib/load-with-cpu';
import { median, round, withSpread } from './lib/stats';
import { startAppProcess } from './lib/app';
import { newAccount, seedSwap, type SeededSwap } from './lib/seed';
import { statementStats } from './lib/statement-stats';

type Row = Record<string, string | number>;
type ServerKey = 'app' | 'express' | 'http';
const SERVERS: ServerKey[] = ['app', 'express', 'http'];
const LABEL: Record<ServerKey, string> = { app: 'app', express: 'bare Express + pg', http: 'bare node:http + pg' };

interface Summary {
  rps: number;
  p99: number;
  /** server and database CPU per request (ms), and each apart */
  cpuMs: number;
  serverMs: number;
  dbMs: number;
}

interface Scenario {
  name: string;
  connections: number;
  rate?: number;
  request: (server: ServerKey) => Pick<LoadOptions, 'method' | 'paths' | 'body' | 'headers' | 'freshClientId'>;
}

export interface ApiBenchResult {
  rows: Row[];
  goals: Row[];
  /** The roster's CPU (server and database) per block at each size: whether cost grows with the work. */
  perBlock: Row[];
  /** The roster's CPU per request fitted over the sizes: a fixed part per request and a part per block. */
  costFit: Row[];
  memory: Row[];
}

const SIZES = [
  { members: 60, blocksEach: 4, tag: '60x4' },
  { members: 300, blocksEach: 4, tag: '300x4' },
  { members: 600, blocksEach: 6, tag: '600x6' },
];

export async function runApiBench(
  opts: { duration?: number; runs?: number; profileDir?: string; only?: RegExp; statementStats?: boolean } = {},
): Promise<ApiBenchResult> {
  const duration = opts.duration ?? 5;
  const runs = opts.runs ?? 3;
  const cluster = await startThrowawayCluster('blockpost-bench-', { statementStats: opts.statementStats });
  const servers: Partial<Record<ServerKey, NodeProcess>> = {};
  try {
    const databaseUrl = await cluster.database('bench');
    servers.app = await startAppProcess(databaseUrl, { profileDir: opts.profileDir });
    const bareEnv = { DATABASE_URL: databaseUrl, NODE_ENV: 'production' };
    servers.express = await startNodeServer({
      name: 'bare Express',
      script: 'bench/servers/bare-express.ts',
      port: await freePort(),
      readyPath: '/health',
      env: bareEnv,
    });
    servers.http = await startNodeServer({
      name: 'bare node:http',
      script: 'bench/servers/bare-http.ts',
      port: await freePort(),
      readyPath: '/health',
      env: bareEnv,
    });
    const url = (s: ServerKey) => servers[s]!.url;

    const coordinator = await newAccount(url('app'), databaseUrl, 'bench-coordinator@example.test', 'Bench Coordinator');
    const guild = await coordinator.api<{ id: number }>('POST', '/guilds', { name: 'Benchmark Bee' });
    const swaps: SeededSwap[] = [];
    for (const size of SIZES) swaps.push(await seedSwap(databaseUrl, coordinator, guild.id, size));
    const [small] = swaps as [SeededSwap];
    const appHeaders = { cookie: coordinator.cookie, 'x-requested-with': 'blockpost' };

    const roster = (swap: SeededSwap) => (s: ServerKey) =>
      s === 'app' ? { paths: [`/api/swaps/${swap.swapId}/roster`], headers: appHeaders } : { paths: [`/roster/${swap.swapId}`] };
    // The app parses "9 1/2" and works out the verdict; the references store plain numbers.
    const measure = (s: ServerKey) =>
      s === 'app'
        ? {
            method: 'POST' as const,
            paths: small.measuredBlockIds.map((id) => `/api/blocks/${id}/measurements`),
            headers: appHeaders,
            body: JSON.stringify({ width: '9 1/2', height: '9 1/2' }),
            // Each with a clientId of its own, as the app's client sends every measurement.
            freshClientId: true,
          }
        : {
            method: 'POST' as const,
            paths: small.measuredBlockIds.map((id) => `/measure/${id}`),
            body: JSON.stringify({ width: 9.5, height: 9.5 }),
          };
    const sizeName = (swap: SeededSwap) => `${swap.members} × ${swap.blocksEach}`;
    const scenarios: Scenario[] = [
      { name: `GET roster ${sizeName(small)}, 10 connections`, connections: 10, request: roster(small) },
      { name: `GET roster ${sizeName(small)}, 50 connections`, connections: 50, request: roster(small) },
      {
        name: `GET roster ${sizeName(small)}, fixed 200 req/s, 20 connections`,
        connections: 20,
        rate: 200,
        request: roster(small),
      },
      { name: 'POST measurement, 10 connections', connections: 10, request: measure },
      { name: 'POST measurement, 50 connections', connections: 50, request: measure },
      ...swaps
        .slice(1)
        .map((swap) => ({ name: `GET roster ${sizeName(swap)}, 10 connections`, connections: 10, request: roster(swap) })),
    ];

    if (opts.only) scenarios.splice(0, scenarios.length, ...scenarios.filter((s) => opts.only!.test(s.name)));

    const load = (s: ServerKey, scenario: Scenario, seconds: number): Promise<LoadWithCpu> =>
      loadWithCpu(servers[s]!.pid, cluster.port, {
        url: url(s),
        connections: scenario.connections,
        duration: seconds,
        rate: scenario.rate,
        ...scenario.request(s),
      });

    // A short untimed run of each server first, so every JIT has settled before the first figure.
    for (const s of SERVERS) await load(s, scenarios[0]!, 2);

    const rows: Row[] = [];
    const goals: Row[] = [];
    const medians = new Map<string, Record<ServerKey, Summary>>();
    for (const scenario of scenarios) {
      const results: Record<ServerKey, LoadWithCpu[]> = { app: [], express: [], http: [] };
      for (let run = 0; run < runs; run++) for (const s of SERVERS) results[s].push(await load(s, scenario, duration));
      const bytes = Object.fromEntries(
        await Promise.all(SERVERS.map(async (s) => [s, await bytesPerResponse(url(s), scenario.request(s))])),
      ) as Record<ServerKey, number>;
      const expressRps = median(results.express.map((r) => r.rps));
      const summary = {} as Record<ServerKey, Summary>;
      for (const s of SERVERS) {
        const rs = results[s];
        const rps = median(rs.map((r) => r.rps));
        summary[s] = {
          rps,
          p99: median(rs.map((r) => r.p99)),
          cpuMs: median(rs.map((r) => r.serverCpuMs + r.dbCpuMs)),
          serverMs: median(rs.map((r) => r.serverCpuMs)),
          dbMs: median(rs.map((r) => r.dbCpuMs)),
        };
        rows.push({
          scenario: scenario.name,
          server: LABEL[s],
          rps: withSpread(rs.map((r) => r.rps)),
          p50_ms: withSpread(rs.map((r) => r.p50)),
          'p97.5_ms': withSpread(rs.map((r) => r.p97_5)),
          p99_ms: withSpread(rs.map((r) => r.p99)),
          bytes: bytes[s],
          'server CPU ms/req': withSpread(
            rs.map((r) => r.serverCpuMs),
            2,
          ),
          'db CPU ms/req': withSpread(
            rs.map((r) => r.dbCpuMs),
            2,
          ),
          errors: rs.reduce((n, r) => n + r.errors + r.non2xx, 0),
          'of Express': s === 'express' ? '100 %' : `${Math.round((rps / expressRps) * 100)} %`,
        });
      }
      medians.set(scenario.name, summary);
      console.log(
        `  ${scenario.name}: app ${round(summary.app.rps)} rps, Express ${round(expressRps)} rps, node:http ${round(summary.http.rps)} rps`,
      );
    }

    const pct = (a: number, b: number) => Math.round((a / b) * 100);
    // One decimal where a goal is judged, so a ratio just under the line does not print as the line itself.
    const pctExact = (a: number, b: number) => round((a / b) * 100, 1);
    // Bare Express's server and database CPU a request over the app's: the ratio a busy machine moves least.
    const byCpu = (m: Record<ServerKey, Summary>) => `by CPU ${pctExact(m.express.cpuMs, m.app.cpuMs)} %`;
    const at = (name: string) => medians.get(name)!;
    if (opts.statementStats) console.table(await statementStats(databaseUrl));
    if (opts.only) return { rows, goals, perBlock: [], costFit: [], memory: memoryRows(servers) };
    for (const c of [10, 50]) {
      const m = at(`GET roster ${sizeName(small)}, ${c} connections`);
      goals.push(
        goal(
          `GET roster, ${c} connections: app ≥ 50 % of Express`,
          `${pctExact(m.app.rps, m.express.rps)} % (${byCpu(m)})`,
          m.app.rps >= 0.5 * m.express.rps,
        ),
      );
    }
    const paced = at(`GET roster ${sizeName(small)}, fixed 200 req/s, 20 connections`);
    goals.push(goal('GET roster at 200 req/s: rate kept (≥ 195/s)', `${round(paced.app.rps)} req/s`, paced.app.rps >= 195));
    goals.push(
      goal(
        'GET roster at 200 req/s: app p99 ≤ 2 × Express p99',
        `${paced.app.p99} ms vs ${paced.express.p99} ms`,
        paced.app.p99 <= 2 * paced.express.p99,
      ),
    );
    for (const c of [10, 50]) {
      const m = at(`POST measurement, ${c} connections`);
      goals.push(
        goal(
          `POST measurement, ${c} connections: app ≥ 25 % of Express`,
          `${pctExact(m.app.rps, m.express.rps)} % (${byCpu(m)})`,
          m.app.rps >= 0.25 * m.express.rps,
        ),
      );
    }
    const sizes = swaps.map((swap) => at(`GET roster ${sizeName(swap)}, 10 connections`));
    // Judged on the ratios as measured, like the goals above on the rates, and printed to one decimal.
    const ratios = sizes.map((m) => (m.app.rps / m.express.rps) * 100);
    const cpuRatios = sizes.map((m) => pctExact(m.express.cpuMs, m.app.cpuMs));
    goals.push(
      goal(
        `roster ratio across ${swaps.map(sizeName).join(', ')} within 10 points`,
        `${ratios.map((r) => `${round(r, 1)} %`).join(', ')} (by CPU ${cpuRatios.map((r) => `${r} %`).join(', ')})`,
        Math.max(...ratios) - Math.min(...ratios) <= 10,
      ),
    );

    // The ratio moves with both sides; this says how each side's own cost grows with the blocks it serves.
    const sized = swaps.map((swap) => ({
      swap,
      blocks: swap.members * swap.blocksEach,
      m: at(`GET roster ${sizeName(swap)}, 10 connections`),
    }));
    const perBlock = sized.map(({ swap, blocks, m }) => {
      const micros = (ms: number) => round((ms * 1000) / blocks, 1);
      return {
        roster: sizeName(swap),
        blocks,
        'app server µs/block': micros(m.app.serverMs),
        'app db µs/block': micros(m.app.dbMs),
        'bare Express server µs/block': micros(m.express.serverMs),
        'bare Express db µs/block': micros(m.express.dbMs),
        'bare node:http µs/block': micros(m.http.cpuMs),
        'app ÷ Express': `${pct(m.app.cpuMs, m.express.cpuMs)} %`,
      };
    });
    // A line through the sizes: its intercept is what a request costs whatever the roster's size (session,
    // checks, routing), its slope what each block adds. A ratio that differs between sizes comes from
    // the two sides' fixed parts differing in another proportion than their slopes.
    const costFit = SERVERS.flatMap((s) =>
      (['server', 'database'] as const).map((part) => {
        const points = sized.map(({ blocks, m }) => [blocks, part === 'server' ? m[s].serverMs : m[s].dbMs]);
        const line = linearRegression(points);
        return {
          server: LABEL[s],
          part,
          'fixed ms/request': round(line.b, 2),
          'µs/block': round(line.m * 1000, 2),
          // How well a straight line explains the three sizes (1: exactly); a cost that grows faster
          // than the blocks reads lower, with a fixed part below zero.
          'r²': round(rSquared(points, linearRegressionLine(line)), 3),
        };
      }),
    );

    return { rows, goals, perBlock, costFit, memory: memoryRows(servers) };
  } finally {
    for (const s of SERVERS) await servers[s]?.stop().catch(() => undefined);
    cluster.stop();
  }
}

function memoryRows(servers: Partial<Record<ServerKey, NodeProcess>>): Row[] {
  return SERVERS.map((s) => {
    const m = servers[s]!.memory();
    return { server: LABEL[s], rss_MiB: m?.rssMiB ?? 'n/a', peak_rss_MiB: m?.peakMiB ?? 'n/a' };
  });
}

const goal = (name: string, measured: string, met: boolean): Row => ({ goal: name, measured, met: met ? 'yes' : 'NO' });

async function bytesPerResponse(base: string, req: Pick<LoadOptions, 'method' | 'paths' | 'body' | 'headers'>): Promise<number> {
  const res = await fetch(base + req.paths[0], {
    method: req.method ?? 'GET',
    headers: { 'content-type': 'application/json', ...req.headers },
    body: req.body,
  });
  return (await res.arrayBuffer()).byteLength;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const result = await runApiBench({
    statementStats: process.env.BENCH_PG_STATS === '1',
    duration: Number(process.env.BENCH_SECONDS ?? 5),
    runs: Number(process.env.BENCH_RUNS ?? 3),
    profileDir: process.env.BENCH_PROFILE_DIR,
    only: process.env.BENCH_ONLY ? new RegExp(process.env.BENCH_ONLY) : undefined,
  });
  console.table(result.rows);
  console.table(result.goals);
  console.table(result.perBlock);
  console.table(result.costFit);
  console.table(result.memory);
  process.exit(0);
}
