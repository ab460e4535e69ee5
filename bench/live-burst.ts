/**
 * Meeting night on the live board: `stations` intake stations each measure their own blocks as fast
 * as the app answers, while `sockets` viewers watch the swap's board. The app is its own process
 * (as production starts it); stations and viewers share this one.
 *
 * Commit → receipt is timed from the measurement's own recorded time (set by the server just before
 * its transaction commits, so the figure errs on the long side) to the viewer's handler, on the
 * machine's one wall clock. A change is lost when a viewer never sees the activity line of a
 * measurement; a gap is a version number a viewer skipped.
 * Run alone with `npx tsx bench/live-burst.ts`.
 */
import { performance } from 'node:perf_hooks';
import { io as connectClient, type Socket } from 'socket.io-client';
import type { Ack, BoardChange, BoardJoined, ClientToServerEvents, ServerToClientEvents } from '../shared/live-events';
import { startThrowawayCluster } from '../scripts/lib/throwaway-cluster';
import { startAppProcess } from './lib/app';
import { cpuSeconds } from './lib/processes';
import { quantile, round } from './lib/stats';
import { newAccount, seedSwap, signIn, type Session } from './lib/seed';

type Client = Socket<ServerToClientEvents, ClientToServerEvents>;
type Row = Record<string, string | number>;

const now = () => performance.timeOrigin + performance.now();

function connect(url: string, cookie: string): Promise<Client> {
  const socket: Client = connectClient(url, {
    transports: ['websocket'],
    extraHeaders: { cookie },
    reconnection: false,
    forceNew: true,
  });
  return new Promise((resolve, reject) => {
    socket.once('connect', () => resolve(socket));
    socket.once('connect_error', reject);
  });
}

function join(socket: Client, swapId: number): Promise<BoardJoined> {
  return new Promise((resolve, reject) => {
    (socket.emit as (e: string, p: unknown, cb: (a: Ack<BoardJoined>) => void) => void)('board:join', { swapId }, (answer) =>
      'error' in answer ? reject(new Error(answer.error.message)) : resolve(answer.data),
    );
  });
}

interface Viewer {
  joinedAt: number;
  /** version and receipt time of every change */
  changes: { version: number; at: number; change: BoardChange }[];
}

export async function runLiveBurstBench(
  opts: { stations?: number; sockets?: number; perStation?: number; profileDir?: string } = {},
): Promise<Row[]> {
  const stations = opts.stations ?? 10;
  const socketCount = opts.sockets ?? 200;
  const perStation = opts.perStation ?? 40;
  const cluster = await startThrowawayCluster('blockpost-burst-bench-');
  const sockets: Client[] = [];
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
    const viewers: Viewer[] = [];
    for (let i = 0; i < socketCount; i++) {
      const socket = await connect(app.url, members[i % members.length]!.cookie);
      const viewer: Viewer = { joinedAt: 0, changes: [] };
      socket.on('board:changed', (change) => void viewer.changes.push({ version: change.version, at: now(), change }));
      viewer.joinedAt = (await join(socket, swap.swapId)).version;
      sockets.push(socket);
      viewers.push(viewer);
    }
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
            const answer = await desk.api<{ at: string }>('POST', `/blocks/${blockId}/measurements`, {
              width: '9 1/2',
              height: k % 3 ? '9 1/2' : '9 3/8',
            });
            measured.set(blockId, [...(measured.get(blockId) ?? []), Date.parse(answer.at)]);
          }
        }),
      );
      return measured;
    };
    const told = (v: Viewer) => v.changes.flatMap((c) => c.change.activities).filter((a) => a.kind === 'block.measured').length;
    const allTold = async (total: number) => {
      const deadline = Date.now() + 10_000;
      while (viewers.some((v) => told(v) < total) && Date.now() < deadline) await new Promise((r) => setTimeout(r, 100));
    };

    // An untimed burst first, as the API bench warms each server up: a process that has just started
    // runs its code cold, and the figures would tell its start rather than a meeting night. The timed
    // burst then counts from the version each viewer has reached.
    const warmUp = await burst(Math.ceil(perStation / 2));
    await allTold([...warmUp.values()].reduce((n, t) => n + t.length, 0));
    for (const viewer of viewers) {
      viewer.joinedAt = viewer.changes.at(-1)?.version ?? viewer.joinedAt;
      viewer.changes = [];
    }

    const cpuBefore = cpuSeconds(app.pid);
    const started = now();
    const measured = await burst(perStation);
    const burstMs = now() - started;
    const total = [...measured.values()].reduce((n, t) => n + t.length, 0);
    await allTold(total);
    const cpu = cpuSeconds(app.pid) - cpuBefore;

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
        const lines = c.change.activities.filter((a) => a.kind === 'block.measured').sort((a, b) => a.id - b.id);
        for (const line of lines) {
          seen.set(line.blockId!, [...(seen.get(line.blockId!) ?? []), c.at]);
          written.set(line.blockId!, [...(written.get(line.blockId!) ?? []), Date.parse(line.at)]);
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
        goal: 'p95 < 100 ms, none lost, no gap',
      },
    ];
  } finally {
    for (const s of sockets) s.disconnect();
    await app?.stop().catch(() => undefined);
    cluster.stop();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  console.table(await runLiveBurstBench({ profileDir: process.env.BENCH_PROFILE_DIR }));
  process.exit(0);
}
