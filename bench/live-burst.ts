/**
 * Meeting night on the live board: `stations` intake stations each measure their own blocks as fast
 * as the server answers, sending a clientId with each measurement as the app's own client does, while
 * `sockets` viewers watch the swap's board. The app is its own process (as production starts it), the
 * stations run in this one and the viewers in another (bench/live-viewers.ts), so neither set of
 * clients holds up the other's event loop and timing. Beside the app, the same burst is run against a
 * bare reference (bench/servers/bare-live.ts: one INSERT per measurement, changes coalesced by the same
 * rule, no session or checks), runs alternating, `rounds` of each, medians with their spread: the
 * reference tells what this machine allows under the same load. A second reference sends the app's
 * message (whole rows, totals, named lines) with the same bare work, its stations held to the app's own
 * rate: what the message alone costs the viewers and the machine, apart from the app's other work.
 *
 * Commit → receipt is timed from the measurement's own recorded time (set by the server just before
 * its transaction commits, so the figure errs on the long side) to the viewer's handler, on the
 * machine's one wall clock. A change is lost when a viewer never sees the activity line of a
 * measurement; a gap is a version number a viewer skipped.
 * Run alone with `npx tsx bench/live-burst.ts`.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import { startThrowawayCluster } from '../scripts/lib/throwaway-cluster';
import { startAppProcess } from './lib/app';
import { clusterCpuSeconds, cpuSeconds, repoRoot, startNodeServer, type NodeProcess } from './lib/processes';
import { freePort } from '../scripts/lib/ports';
import { median, quantile, round, withSpread } from './lib/stats';
import { newAccount, seedHistory, seedSwap, signIn, type Session } from './lib/seed';
import type { ViewersAnswer, ViewersCommand } from './live-viewers';
import { statementStats } from './lib/statement-stats';

type Row = Record<string, string | number>;

const now = () => performance.timeOrigin + performance.now();

/** The viewers' own process (bench/live-viewers.ts), driven one command and answer at a time. */
function startViewers() {
  const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', 'bench/live-viewers.ts'], {
    cwd: repoRoot,
    stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
  });
  const ask = <T extends ViewersAnswer['type']>(command: ViewersCommand, answer: T) =>
    new Promise<Extract<ViewersAnswer, { type: T }>>((resolve, reject) => {
      const onExit = (code: number | null) => reject(new Error(`the viewers' process exited with code ${code}`));
      child.once('exit', onExit);
      child.once('message', (message: ViewersAnswer) => {
        child.off('exit', onExit);
        if (message.type === answer) resolve(message as Extract<ViewersAnswer, { type: T }>);
        else reject(new Error(`the viewers' process answered ${message.type} to ${command.type}`));
      });
      child.send(command);
    });
  return { child, ask };
}

/** A server under the burst: how its stations measure and how its viewers sign in. */
interface BurstTarget {
  server: string;
  url: string;
  pid: number;
  /** a cookie per viewer (taken in turn) */
  viewerCookies: string[];
  /** station `station` measures `blockId` (its `k`-th measurement); the server's recorded time, ms since the epoch */
  measure(station: number, blockId: number, k: number): Promise<number>;
  /** the stations together measure no faster than this many a second (otherwise as fast as answered) */
  pace?: () => number | undefined;
}

/** One burst's figures, before they are summarised over the runs. */
interface BurstRun {
  measurements: number;
  perSecond: number;
  changes: number;
  busiest: number;
  closest: number;
  p50: number;
  p95: number;
  p99: number;
  firstP95: number;
  untilLineP50: number;
  untilLineP95: number;
  afterLineP50: number;
  afterLineP95: number;
  lost: number;
  gaps: number;
  serverCpu: number;
  dbCpu: number;
  stationsCpu: number;
  viewersCpu: number;
}

/**
 * One burst against `target` with a fresh set of viewers: an untimed warm-up burst, then the timed one.
 * Each measurement is checked off by the viewers' activity lines.
 */
async function runBurst(
  target: BurstTarget,
  opts: { swapId: number; blockIds: number[]; stations: number; sockets: number; perStation: number; clusterPort: number },
): Promise<BurstRun> {
  const viewersProcess = startViewers();
  try {
    await viewersProcess.ask(
      { type: 'open', url: target.url, swapId: opts.swapId, cookies: target.viewerCookies, count: opts.sockets },
      'opened',
    );
    await new Promise((r) => setTimeout(r, 500)); // let the presence announcements settle

    // Each station measures its own share of the received blocks in turn, one at a time.
    const shares = Array.from({ length: opts.stations }, (_, i) => opts.blockIds.filter((_, j) => j % opts.stations === i));
    const burst = async (count: number, perSecond?: number) => {
      const measured = new Map<number, number[]>(); // block → recorded times of its measurements, in order
      const from = now();
      await Promise.all(
        shares.map(async (share, i) => {
          for (let k = 0; k < count; k++) {
            // Held to the rate: the stations' measurements spread evenly over the burst, in turn.
            const early = perSecond ? from + ((k * opts.stations + i) / perSecond) * 1000 - now() : 0;
            if (early > 0) await new Promise((r) => setTimeout(r, early));
            const blockId = share[k % share.length]!;
            const at = await target.measure(i, blockId, k);
            measured.set(blockId, [...(measured.get(blockId) ?? []), at]);
          }
        }),
      );
      return measured;
    };
    const allTold = async (total: number) => {
      const deadline = Date.now() + 10_000;
      while (Date.now() < deadline) {
        if ((await viewersProcess.ask({ type: 'progress' }, 'progress')).leastTold >= total) return;
        await new Promise((r) => setTimeout(r, 100));
      }
    };

    // An untimed burst first, as the API bench warms each server up: a process that has just started
    // runs its code cold, and the figures would tell its start rather than a meeting night. The timed
    // burst then counts from the version each viewer has reached.
    const warmUp = await burst(Math.ceil(opts.perStation / 2));
    await allTold([...warmUp.values()].reduce((n, t) => n + t.length, 0));
    await viewersProcess.ask({ type: 'mark' }, 'marked');

    const cpuBefore = cpuSeconds(target.pid);
    const dbBefore = clusterCpuSeconds(opts.clusterPort);
    const benchBefore = process.cpuUsage();
    const started = now();
    const measured = await burst(opts.perStation, target.pace?.());
    const burstMs = now() - started;
    const total = [...measured.values()].reduce((n, t) => n + t.length, 0);
    await allTold(total);
    const cpu = cpuSeconds(target.pid) - cpuBefore;
    const { viewers, cpuMs: viewersCpuMs } = await viewersProcess.ask({ type: 'report' }, 'report');
    const dbCpu = clusterCpuSeconds(opts.clusterPort) - dbBefore;
    const benchUsage = process.cpuUsage(benchBefore);
    const benchCpu = (benchUsage.user + benchUsage.system) / 1e6;

    const latencies: number[] = [];
    const firstViewer: number[] = [];
    // For the first viewer, split at the activity line's own time (written as the change is made).
    const untilLine: number[] = [];
    const afterLine: number[] = [];
    let lost = 0;
    let gaps = 0;
    for (const viewer of viewers) {
      viewer.changes.forEach((c, i) => {
        if (c.version !== (i === 0 ? viewer.joinedAt : viewer.changes[i - 1]!.version) + 1) gaps += 1;
      });
      // The k-th activity line of a block answers its k-th measurement (one station measures it, in turn).
      const seen = new Map<number, number[]>();
      const written = new Map<number, number[]>();
      for (const c of viewer.changes) {
        for (const line of [...c.measured].sort((a, b) => a.id - b.id)) {
          seen.set(line.blockId, [...(seen.get(line.blockId) ?? []), c.at]);
          written.set(line.blockId, [...(written.get(line.blockId) ?? []), line.writtenAt]);
        }
      }
      for (const [blockId, times] of measured) {
        const arrivals = seen.get(blockId) ?? [];
        lost += Math.max(0, times.length - arrivals.length);
        times.forEach((t, k) => {
          if (arrivals[k] === undefined) return;
          latencies.push(arrivals[k]! - t);
          if (viewer !== viewers[0]) return;
          firstViewer.push(arrivals[k]! - t);
          const line = written.get(blockId)?.[k];
          if (line !== undefined) {
            untilLine.push(line - t);
            afterLine.push(arrivals[k]! - line);
          }
        });
      }
    }
    const messages = viewers[0]!.changes;
    let busiest = 0;
    for (let i = 0; i < messages.length; i++)
      busiest = Math.max(busiest, messages.filter((m) => m.at >= messages[i]!.at && m.at < messages[i]!.at + 1000).length);
    const closest = messages.slice(1).reduce((min, m, i) => Math.min(min, m.at - messages[i]!.at), Infinity);
    return {
      measurements: total,
      perSecond: total / (burstMs / 1000),
      changes: messages.length,
      busiest,
      closest,
      p50: quantile(latencies, 0.5),
      p95: quantile(latencies, 0.95),
      p99: quantile(latencies, 0.99),
      firstP95: quantile(firstViewer, 0.95),
      untilLineP50: quantile(untilLine, 0.5),
      untilLineP95: quantile(untilLine, 0.95),
      afterLineP50: quantile(afterLine, 0.5),
      afterLineP95: quantile(afterLine, 0.95),
      lost,
      gaps,
      // The machine's other users of CPU meanwhile: PostgreSQL, the stations, the viewers.
      serverCpu: (cpu * 1000) / total,
      dbCpu: (dbCpu * 1000) / total,
      stationsCpu: (benchCpu * 1000) / total,
      viewersCpu: viewersCpuMs / total,
    };
  } finally {
    if (viewersProcess.child.exitCode === null) viewersProcess.child.kill();
  }
}

const BARE = 'bare Express + pg + socket.io';
const BARE_APP_MESSAGE = "bare, the app's message, at the app's rate";

/** A bare reference (bench/servers/bare-live.ts) as its own process on the bench's database. */
async function startBareLive(databaseUrl: string, message: 'plain' | 'app'): Promise<NodeProcess> {
  return startNodeServer({
    name: message === 'app' ? BARE_APP_MESSAGE : BARE,
    script: 'bench/servers/bare-live.ts',
    port: await freePort(),
    readyPath: '/health',
    env: { DATABASE_URL: databaseUrl, NODE_ENV: 'production', BARE_MESSAGE: message },
  });
}

export async function runLiveBurstBench(
  opts: {
    stations?: number;
    sockets?: number;
    perStation?: number;
    rounds?: number;
    profileDir?: string;
    statementStats?: boolean;
  } = {},
): Promise<Row[]> {
  const stations = opts.stations ?? 10;
  const sockets = opts.sockets ?? 200;
  const perStation = opts.perStation ?? 80;
  const rounds = opts.rounds ?? Number(process.env.BENCH_RUNS ?? 3);
  const cluster = await startThrowawayCluster('blockpost-burst-bench-', { statementStats: opts.statementStats });
  const servers: NodeProcess[] = [];
  try {
    const databaseUrl = await cluster.database('burst');
    const app = await startAppProcess(databaseUrl, { profileDir: opts.profileDir });
    servers.push(app);
    const bare = await startBareLive(databaseUrl, 'plain');
    servers.push(bare);
    const bareAppMessage = await startBareLive(databaseUrl, 'app');
    servers.push(bareAppMessage);
    const coordinator = await newAccount(app.url, databaseUrl, 'burst-coordinator@example.test', 'Burst Coordinator');
    const guild = await coordinator.api<{ id: number }>('POST', '/guilds', { name: 'Burst Bee' });
    const swap = await seedSwap(databaseUrl, coordinator, guild.id, { members: 60, blocksEach: 4, tag: 'burst' });
    await seedHistory(databaseUrl, coordinator, guild.id);

    // Viewers: twenty members, ten tabs each; stations: the coordinator signed in ten times.
    const members: Session[] = [];
    for (let i = 1; i <= Math.min(20, sockets); i++) members.push(await signIn(app.url, `bench-burst-${i}@example.test`));
    const desks: Session[] = [];
    for (let i = 0; i < stations; i++) desks.push(await signIn(app.url, 'burst-coordinator@example.test'));
    const width = '9 1/2';
    const height = (k: number) => (k % 3 ? '9 1/2' : '9 3/8');
    const targets: BurstTarget[] = [
      {
        server: 'app',
        url: app.url,
        pid: app.pid,
        viewerCookies: members.map((m) => m.cookie),
        // With a clientId, as the app's own client sends every measurement.
        measure: async (station, blockId, k) =>
          Date.parse(
            (
              await desks[station]!.api<{ at: string }>('POST', `/blocks/${blockId}/measurements`, {
                width,
                height: height(k),
                clientId: randomUUID(),
              })
            ).at,
          ),
      },
      bareTarget(BARE, bare, swap.swapId),
      {
        ...bareTarget(BARE_APP_MESSAGE, bareAppMessage, swap.swapId),
        // The rate of the app's run just before it, in the same round (see the order below).
        pace: () => runs.get('app')!.at(-1)?.perSecond,
      },
    ];

    const runs = new Map<string, BurstRun[]>(targets.map((t) => [t.server, []]));
    // The app and the bare reference alternate which goes first; the reference with the app's
    // message always follows the app, so it is held to the rate the app reached moments before.
    const [appBurst, bareBurst, appMessageBurst] = targets as [BurstTarget, BurstTarget, BurstTarget];
    for (let round = 0; round < rounds; round++) {
      const order = round % 2 ? [bareBurst, appBurst, appMessageBurst] : [appBurst, appMessageBurst, bareBurst];
      for (const target of order) {
        runs.get(target.server)!.push(
          await runBurst(target, {
            swapId: swap.swapId,
            blockIds: swap.measuredBlockIds,
            stations,
            sockets,
            perStation,
            clusterPort: cluster.port,
          }),
        );
      }
    }
    if (opts.statementStats) console.table(await statementStats(databaseUrl));
    return summarise(targets, runs, { stations, sockets, perStation });
  } finally {
    for (const server of servers) await server.stop().catch(() => undefined);
    cluster.stop();
  }
}

/** A bare reference's stations: one plain POST a measurement, no session. */
function bareTarget(server: string, bare: NodeProcess, swapId: number): BurstTarget {
  return {
    server,
    url: bare.url,
    pid: bare.pid,
    viewerCookies: [''],
    measure: async (_station, blockId, k) => {
      const r = await fetch(`${bare.url}/swaps/${swapId}/blocks/${blockId}/measure`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ width: 9.5, height: k % 3 ? 9.5 : 9.375 }),
      });
      if (r.status !== 201) throw new Error(`the bare reference answered ${r.status}: ${await r.text()}`);
      return Date.parse(((await r.json()) as { at: string }).at);
    },
  };
}

/** A row per server: medians of the runs with their spread; losses and gaps summed over every run. */
function summarise(
  targets: BurstTarget[],
  runs: Map<string, BurstRun[]>,
  size: { stations: number; sockets: number; perStation: number },
): Row[] {
  const bareP95 = median(runs.get(targets[1]!.server)!.map((r) => r.p95));
  return targets.map((target) => {
    const rs = runs.get(target.server)!;
    const spread = (pick: (r: BurstRun) => number, places = 0) => withSpread(rs.map(pick), places);
    const sum = (pick: (r: BurstRun) => number) => rs.reduce((n, r) => n + pick(r), 0);
    const isApp = target === targets[0];
    const p95 = median(rs.map((r) => r.p95));
    const lost = sum((r) => r.lost);
    const gaps = sum((r) => r.gaps);
    const busiest = Math.max(...rs.map((r) => r.busiest));
    // Infinity when no run had two changes to compare.
    const closest = Math.min(...rs.map((r) => r.closest));
    return {
      scenario: `${size.stations} stations × ${size.perStation} measurements, ${size.sockets} viewers, 60 × 4 swap`,
      server: target.server,
      runs: rs.length,
      measurements: spread((r) => r.measurements),
      'measurements/s': spread((r) => r.perSecond),
      'board changes (per viewer)': spread((r) => r.changes),
      'most changes in 1 s': busiest,
      'closest receipts_ms (viewer side)': Number.isFinite(closest) ? round(closest) : 'n/a',
      p50_ms: spread((r) => r.p50),
      p95_ms: spread((r) => r.p95),
      p99_ms: spread((r) => r.p99),
      'first viewer p95_ms': spread((r) => r.firstP95),
      'to activity line p50/p95_ms': `${round(median(rs.map((r) => r.untilLineP50)))} / ${round(median(rs.map((r) => r.untilLineP95)))}`,
      'line to receipt p50/p95_ms': `${round(median(rs.map((r) => r.afterLineP50)))} / ${round(median(rs.map((r) => r.afterLineP95)))}`,
      'lost changes': lost,
      'version gaps': gaps,
      'server CPU ms/measurement': spread((r) => r.serverCpu, 2),
      'database CPU ms/measurement': spread((r) => r.dbCpu, 2),
      'stations CPU ms/measurement': spread((r) => r.stationsCpu, 2),
      'viewers CPU ms/measurement': spread((r) => r.viewersCpu, 2),
      'p95 of bare': `${Math.round((p95 / bareP95) * 100)} %`,
      goal: isApp ? 'p95 < 100 ms, none lost, no gap, ≤ 1 change per 50 ms' : '',
      met: isApp ? (p95 < 100 && lost === 0 && gaps === 0 && busiest <= 21 ? 'yes' : 'NO') : '',
    };
  });
}

if (import.meta.url === `file://${process.argv[1]}`) {
  console.table(
    await runLiveBurstBench({ profileDir: process.env.BENCH_PROFILE_DIR, statementStats: process.env.BENCH_PG_STATS === '1' }),
  );
  process.exit(0);
}
