/**
 * Meeting night on the live board: `stations` intake stations each measure their own blocks as fast
 * as the app answers, sending a clientId with each measurement as the app's own client does, while
 * `sockets` viewers watch the swap's board. The app is its own process (as production starts it), the
 * stations run in this one and the viewers in another (bench/live-viewers.ts), so neither set of
 * clients holds up the other's event loop and timing.
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
import { clusterCpuSeconds, cpuSeconds, repoRoot } from './lib/processes';
import { quantile, round } from './lib/stats';
import { newAccount, seedSwap, signIn, type Session } from './lib/seed';
import type { ViewersAnswer, ViewersCommand } from './live-viewers';

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

export async function runLiveBurstBench(
  opts: { stations?: number; sockets?: number; perStation?: number; profileDir?: string } = {},
): Promise<Row[]> {
  const stations = opts.stations ?? 10;
  const socketCount = opts.sockets ?? 200;
  const perStation = opts.perStation ?? 40;
  const cluster = await startThrowawayCluster('blockpost-burst-bench-');
  const viewersProcess = startViewers();
  let app: Awaited<ReturnType<typeof startAppProcess>> | null = null;
  try {
    const databaseUrl = await cluster.database('burst');
    app = await startAppProcess(databaseUrl, { profileDir: opts.profileDir });
    const coordinator = await newAccount(app.url, databaseUrl, 'burst-coordinator@example.test', 'Burst Coordinator');
    const guild = await coordinator.api<{ id: number }>('POST', '/guilds', { name: 'Burst Bee' });
    const swap = await seedSwap(databaseUrl, coordinator, guild.id, { members: 60, blocksEach: 4, tag: 'burst' });

    // Viewers: twenty members, ten tabs each; stations: the coordinator signed in ten times.
    const members: Session[] = [];
    for (let i = 1; i <= Math.min(20, socketCount); i++) members.push(await signIn(app.url, `bench-burst-${i}@example.test`));
    await viewersProcess.ask(
      { type: 'open', url: app.url, swapId: swap.swapId, cookies: members.map((m) => m.cookie), count: socketCount },
      'opened',
    );
    await new Promise((r) => setTimeout(r, 500)); // let the presence announcements settle
    const desks: Session[] = [];
    for (let i = 0; i < stations; i++) desks.push(await signIn(app.url, 'burst-coordinator@example.test'));

    // Each station measures its own share of the received blocks in turn, one at a time.
    const shares = desks.map((_, i) => swap.measuredBlockIds.filter((_, j) => j % stations === i));
    const burst = async (count: number) => {
      const measured = new Map<number, number[]>(); // block → recorded times of its measurements, in order
      await Promise.all(
        desks.map(async (desk, i) => {
          const share = shares[i]!;
          for (let k = 0; k < count; k++) {
            const blockId = share[k % share.length]!;
            // With a clientId, as the app's own client sends every measurement.
            const answer = await desk.api<{ at: string }>('POST', `/blocks/${blockId}/measurements`, {
              width: '9 1/2',
              height: k % 3 ? '9 1/2' : '9 3/8',
              clientId: randomUUID(),
            });
            measured.set(blockId, [...(measured.get(blockId) ?? []), Date.parse(answer.at)]);
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
    const warmUp = await burst(Math.ceil(perStation / 2));
    await allTold([...warmUp.values()].reduce((n, t) => n + t.length, 0));
    await viewersProcess.ask({ type: 'mark' }, 'marked');

    const cpuBefore = cpuSeconds(app.pid);
    const dbBefore = clusterCpuSeconds(cluster.port);
    const benchBefore = process.cpuUsage();
    const started = now();
    const measured = await burst(perStation);
    const burstMs = now() - started;
    const total = [...measured.values()].reduce((n, t) => n + t.length, 0);
    await allTold(total);
    const cpu = cpuSeconds(app.pid) - cpuBefore;
    const { viewers, cpuMs: viewersCpuMs } = await viewersProcess.ask({ type: 'report' }, 'report');
    const dbCpu = clusterCpuSeconds(cluster.port) - dbBefore;
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
    return [
      {
        scenario: `${stations} stations × ${perStation} measurements, ${socketCount} viewers, 60 × 4 swap`,
        measurements: total,
        'measurements/s': round(total / (burstMs / 1000)),
        'board changes (per viewer)': messages.length,
        'most changes in 1 s': busiest,
        'closest receipts_ms (viewer side)': Number.isFinite(closest) ? round(closest) : 'n/a',
        p50_ms: round(quantile(latencies, 0.5)),
        p95_ms: round(quantile(latencies, 0.95)),
        p99_ms: round(quantile(latencies, 0.99)),
        'first viewer p95_ms': round(quantile(firstViewer, 0.95)),
        'to activity line p50/p95_ms': `${round(quantile(untilLine, 0.5))} / ${round(quantile(untilLine, 0.95))}`,
        'line to receipt p50/p95_ms': `${round(quantile(afterLine, 0.5))} / ${round(quantile(afterLine, 0.95))}`,
        'lost changes': lost,
        'version gaps': gaps,
        'app CPU ms/measurement': round((cpu * 1000) / total, 2),
        // The machine's other users of CPU meanwhile: PostgreSQL, the stations, the viewers.
        'database CPU ms/measurement': round((dbCpu * 1000) / total, 2),
        'stations CPU ms/measurement': round((benchCpu * 1000) / total, 2),
        'viewers CPU ms/measurement': round(viewersCpuMs / total, 2),
        goal: 'p95 < 100 ms, none lost, no gap',
      },
    ];
  } finally {
    if (viewersProcess.child.exitCode === null) viewersProcess.child.kill();
    await app?.stop().catch(() => undefined);
    cluster.stop();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  console.table(await runLiveBurstBench({ profileDir: process.env.BENCH_PROFILE_DIR }));
  process.exit(0);
}
