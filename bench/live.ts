/**
 * Live board fan-out and chat round trip over loopback, on a throwaway PostgreSQL cluster:
 * - a block change is committed through the REST API; the clock starts when the service emits its
 *   event (right after the commit) and stops in each of 200 connected sockets' handlers. Changes are
 *   one at a time, an officer's pace: each waits out the board's coalescing interval after the last,
 *   so it is timed as the first change after a quiet spell (bench/live-burst.ts times a busy board);
 * - the same with the 200 sockets on a second app node, so the change crosses the PostgreSQL adapter;
 * - a chat message sent over a socket: until its acknowledgement, and until another reader has it.
 * Server and clients share this process (and its two cores), so figures include the clients' own work.
 * Run alone with `npx tsx bench/live.ts`.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import type { BoardChange } from '../shared/live-events';
import type { ChatMessageDto } from '../shared/schemas/chat';
import { loadConfig } from '../server/config';
import { startServer, type RunningServer } from '../server/index';
import { Membership } from '../server/db/models';
import { BOARD_CHANGE_INTERVAL_MS } from '../server/board/board-fanout';
import { startThrowawayCluster } from '../scripts/lib/throwaway-cluster';
import { newAccount } from './lib/seed';
import { ask, connect, type LiveClient as Client } from './lib/sockets';

export interface LiveRow {
  name: string;
  samples: number;
  p50_ms: number;
  p95_ms: number;
  p99_ms: number;
  max_ms: number;
}

const DAY = 86_400_000;

function row(name: string, samples: number[]): LiveRow {
  const sorted = [...samples].sort((a, b) => a - b);
  const at = (q: number) => sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))] ?? NaN;
  const ms = (x: number) => Math.round(x * 100) / 100;
  return {
    name,
    samples: sorted.length,
    p50_ms: ms(at(0.5)),
    p95_ms: ms(at(0.95)),
    p99_ms: ms(at(0.99)),
    max_ms: ms(sorted.at(-1) ?? NaN),
  };
}

async function person(baseUrl: string, databaseUrl: string, i: number) {
  const session = await newAccount(
    baseUrl,
    databaseUrl,
    `live-bench-${i}@example.test`,
    `Bench Maker ${String(i).padStart(2, '0')}`,
  );
  return { id: session.userId, cookie: session.cookie, api: session.api };
}

/** Sends `changes` block changes through node `writer` and times their arrival at every socket. */
async function fanOut(
  writer: RunningServer,
  sockets: Client[],
  swapId: number,
  blockIds: number[],
  coordinator: Awaited<ReturnType<typeof person>>,
) {
  const samples: number[] = [];
  const slowest: number[] = [];
  let committedAt = 0;
  writer.deps.events.onAny((name, payload) => {
    if (name === 'block.changed' && (payload as { swapId: number }).swapId === swapId) committedAt = performance.now();
  });
  for (const blockId of blockIds) {
    // Back to back, every change would wait out the interval since the last and be timed with it.
    await new Promise((resolve) => setTimeout(resolve, BOARD_CHANGE_INTERVAL_MS));
    const arrivals = sockets.map(
      (s) =>
        new Promise<number>((resolve) => {
          const listener = (change: BoardChange) => {
            if (!change.activities.some((a) => a.blockId === blockId)) return;
            s.off('board:changed', listener);
            resolve(performance.now());
          };
          s.on('board:changed', listener);
        }),
    );
    await coordinator.api('POST', `/blocks/${blockId}/received`, {});
    const times = (await Promise.all(arrivals)).map((t) => t - committedAt);
    samples.push(...times);
    slowest.push(Math.max(...times));
  }
  return { samples, slowest };
}

export async function runLiveBench(opts: { sockets?: number; members?: number; messages?: number } = {}): Promise<LiveRow[]> {
  const socketsWanted = opts.sockets ?? 200;
  const members = opts.members ?? 30;
  const messages = opts.messages ?? 100;
  const cluster = await startThrowawayCluster('blockpost-live-bench-');
  const nodes: RunningServer[] = [];
  const sockets: Client[] = [];
  let uploads: string | undefined;
  try {
    const url = await cluster.database('live_bench');
    // The two nodes share this throwaway install's own photo store, never the repository's uploads/.
    uploads = mkdtempSync(join(tmpdir(), 'blockpost-live-bench-uploads-'));
    const config = (port = '0') =>
      loadConfig({
        DATABASE_URL: url,
        UPLOAD_DIR: uploads,
        SESSION_SECRET: 'bench-secret-bench-secret',
        PORT: port,
        LOG_LEVEL: 'silent',
        SERVE_CLIENT: 'false',
        JOBS: 'false',
        NODE_ENV: 'test',
        REGISTER_RATE_LIMIT: '100000',
      });
    nodes.push(await startServer(config()), await startServer(config()));
    const [nodeA, nodeB] = nodes as [RunningServer, RunningServer];

    // A swap in collecting with `members` makers of 2 blocks each: a realistic roster to recompute per change.
    const coordinator = await person(nodeA.url, url, 0);
    const guild = await coordinator.api<{ id: number }>('POST', '/guilds', { name: 'Live Bench Bee' });
    const swap = await coordinator.api<{ id: number }>('POST', `/guilds/${guild.id}/swaps`, {
      title: 'Bench Stripes',
      block: { kind: 'grid', columns: [3.5, 3.5, 3.5], rows: [3.5, 3.5, 3.5], seam: 0.25 },
      quota: { min: 1, max: 6 },
      signupClosesAt: new Date(Date.now() + 10 * DAY).toISOString(),
      dueAt: new Date(Date.now() + 40 * DAY).toISOString(),
    });
    await coordinator.api('POST', `/swaps/${swap.id}/transitions`, { to: 'signup' });
    const people = [];
    for (let i = 1; i <= members; i++) {
      const p = await person(nodeA.url, url, i);
      await Membership.create({ guildId: guild.id, userId: p.id, role: 'member' });
      await p.api('POST', `/swaps/${swap.id}/signups`, { blocks: 2 });
      people.push(p);
    }
    await coordinator.api('POST', `/swaps/${swap.id}/transitions`, { to: 'sewing' });
    await coordinator.api('POST', `/swaps/${swap.id}/transitions`, { to: 'collecting' });
    const blocks: number[] = [];
    for (const p of people)
      blocks.push(...(await p.api<{ id: number }[]>('GET', `/swaps/${swap.id}/blocks?maker=me`)).map((b) => b.id));

    const rows: LiveRow[] = [];
    for (const [label, node, share] of [
      ['same node', nodeA, blocks.slice(0, blocks.length / 2)],
      ['other node, via the PostgreSQL adapter', nodeB, blocks.slice(blocks.length / 2)],
    ] as const) {
      for (const s of sockets.splice(0)) s.disconnect();
      for (let i = 0; i < socketsWanted; i++) sockets.push(await connect(node.url, people[i % people.length]!.cookie));
      await Promise.all(sockets.map((s) => ask(s, 'board:join', { swapId: swap.id })));
      await new Promise((r) => setTimeout(r, 500)); // let the presence announcements settle
      const { samples, slowest } = await fanOut(nodeA, sockets, swap.id, [...share], coordinator);
      rows.push(row(`board change → ${socketsWanted} sockets, ${label} (commit → receipt)`, samples));
      rows.push(row(`board change → last of ${socketsWanted} sockets, ${label}`, slowest));
    }

    // Chat: senders take turns so nobody reaches the per-person limit of 10 messages in 10 s.
    const sewDay = await coordinator.api<{ chatRoomId: number }>('POST', `/guilds/${guild.id}/sew-days`, {
      title: 'Bench sew day',
      startsAt: '2099-01-02T10:00',
      endsAt: '2099-01-02T12:00',
      place: 'Hall',
    });
    for (const s of sockets.splice(0)) s.disconnect();
    const senders = await Promise.all(people.slice(0, 20).map((p) => connect(nodeA.url, p.cookie)));
    const reader = await connect(nodeA.url, coordinator.cookie);
    sockets.push(...senders, reader);
    for (const s of sockets) await ask(s, 'chat:join', { roomId: sewDay.chatRoomId });
    const acked: number[] = [];
    const delivered: number[] = [];
    for (let i = 0; i < messages; i++) {
      const body = `Bench line ${i}`;
      const seen = new Promise<number>((resolve) => {
        const listener = (m: ChatMessageDto) => {
          if (m.body !== body) return;
          reader.off('message:created', listener);
          resolve(performance.now());
        };
        reader.on('message:created', listener);
      });
      const start = performance.now();
      await ask(senders[i % senders.length]!, 'message:send', { roomId: sewDay.chatRoomId, body });
      acked.push(performance.now() - start);
      delivered.push((await seen) - start);
    }
    rows.push(row('chat message:send → acknowledgement', acked));
    rows.push(row('chat message:send → another reader has it', delivered));
    return rows;
  } finally {
    for (const s of sockets) s.disconnect();
    for (const node of nodes.reverse()) await node.close().catch(() => undefined);
    cluster.stop();
    if (uploads) rmSync(uploads, { recursive: true, force: true });
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const rows = await runLiveBench();
  console.table(rows);
  process.exit(0);
}
