/**
 * This tree's app against another revision's, under the same load, runs interleaved: what one change
 * buys on a machine whose speed moves by a fifth from one minute to the next. Both apps are their own
 * processes, each on a database of its own in one throwaway cluster (the revision's tree is a git
 * worktree beside this one, sharing node_modules); every round runs A then B, or B then A, for
 * BENCH_SECONDS (4), BENCH_ROUNDS (8) times, and the table gives each side's medians and the median of
 * the rounds' B/A ratios, which a machine slowing down for a minute moves far less than it moves
 * either side.
 *
 *   npx tsx bench/compare.ts <git revision> [scenario]   (the scenarios: SCENARIOS below; `measure` by default)
 *
 * `roster-member` reads the roster as one of the swap's makers, whose copy hides the others' verdicts;
 * `swap-member` reads the swap itself (its page's answer) as that maker, `home-member` their home screen,
 * `session-member` the session probe every start of the client sends; `guild-member`, `swaps-member` and
 * `sewdays-member` the guild's pages, `chat-member` a page of the swap's chat, `blocks-member` the
 * maker's own blocks (their swap page's list), `transitions-member` the swap's state changes (its timeline), `photo-member` a block photo's thumbnail, as the board shows it,
 * `block-photos-member` a block's gallery, `measurements-member` a block's measurements (a board row opened),
 * `fees-member` the swap's fees tab and `design-member` the maker's design wall.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, symlinkSync } from 'node:fs';
import sharp from 'sharp';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startThrowawayCluster } from '../scripts/lib/throwaway-cluster';
import { withClient } from '../scripts/lib/postgres';
import type { LoadOptions } from './load';
import { startAppProcess } from './lib/app';
import { repoRoot, type NodeProcess } from './lib/processes';
import { loadWithCpu } from './lib/load-with-cpu';
import { HISTORY_SIZE, newAccount, seedHistory, seedSwap, signIn, type SeededSwap, type Session } from './lib/seed';
import { median, round } from './lib/stats';

const SMALL = { members: 60, blocksEach: 4, tag: '60x4' };

interface Seeded {
  url: string;
  guildId: number;
  swap: SeededSwap;
  coordinator: Session;
  reader: Session;
}

/**
 * Each scenario's swap, and for a GET its path, with `{guild}` and `{swap}` for the seeded ids and any
 * other `{name}` for a value its `setup` returns; whether one of the swap's makers reads it.
 */
const SCENARIOS: Record<
  string,
  {
    size: { members: number; blocksEach: number; tag: string };
    connections: number;
    get?: string;
    asMaker?: boolean;
    setup?: (seeded: Seeded) => Promise<Record<string, number>>;
  }
> = {
  measure: { size: SMALL, connections: 10 },
  roster: { size: SMALL, connections: 10, get: '/api/swaps/{swap}/roster' },
  'roster-member': { size: SMALL, connections: 10, get: '/api/swaps/{swap}/roster', asMaker: true },
  'swap-member': { size: SMALL, connections: 10, get: '/api/swaps/{swap}', asMaker: true },
  'home-member': { size: SMALL, connections: 10, get: '/api/me/next', asMaker: true },
  'session-member': { size: SMALL, connections: 10, get: '/api/session', asMaker: true },
  'guild-member': { size: SMALL, connections: 10, get: '/api/guilds/{guild}', asMaker: true },
  'swaps-member': { size: SMALL, connections: 10, get: '/api/guilds/{guild}/swaps', asMaker: true },
  'sewdays-member': { size: SMALL, connections: 10, get: '/api/guilds/{guild}/sew-days', asMaker: true, setup: seedSewDays },
  'chat-member': { size: SMALL, connections: 10, get: '/api/chat/rooms/{room}/messages', asMaker: true, setup: seedChat },
  'transitions-member': { size: SMALL, connections: 10, get: '/api/swaps/{swap}/transitions', asMaker: true },
  'blocks-member': { size: SMALL, connections: 10, get: '/api/swaps/{swap}/blocks?maker=me', asMaker: true },
  'photo-member': { size: SMALL, connections: 10, get: '/api/photos/{photo}?size=thumb', asMaker: true, setup: seedPhoto },
  'block-photos-member': { size: SMALL, connections: 10, get: '/api/blocks/{block}/photos', asMaker: true, setup: seedPhoto },
  'measurements-member': {
    size: SMALL,
    connections: 10,
    get: '/api/blocks/{block}/measurements',
    asMaker: true,
    setup: seedMeasurements,
  },
  'fees-member': { size: SMALL, connections: 10, get: '/api/swaps/{swap}/fees', asMaker: true },
  'design-member': { size: SMALL, connections: 10, get: '/api/swaps/{swap}/design', asMaker: true },
  'roster-600': { size: HISTORY_SIZE, connections: 10, get: '/api/swaps/{swap}/roster' },
};

/** Six sew days ahead, the reader going to every other one. */
async function seedSewDays({ coordinator, reader, guildId }: Seeded) {
  const year = new Date().getFullYear() + 1;
  for (let month = 1; month <= 6; month++) {
    const day = await coordinator.api<{ id: number }>('POST', `/guilds/${guildId}/sew-days`, {
      title: `Open sewing ${month}`,
      startsAt: `${year}-0${month}-10T10:00`,
      endsAt: `${year}-0${month}-10T16:00`,
      place: 'Parish hall, back room',
    });
    if (month % 2) await reader.api('PUT', `/sew-days/${day.id}/rsvp`, { answer: 'going' });
  }
  return {};
}

/** The swap's chat room with a page of messages in it (at the room's rate limit, ten a person). */
async function seedChat({ coordinator, reader, swap }: Seeded) {
  const room = await reader.api<{ id: number }>('GET', `/swaps/${swap.swapId}/chat`);
  for (const [who, person] of [coordinator, reader].entries()) {
    for (let i = 1; i <= 10; i++) {
      await person.api('POST', `/chat/rooms/${room.id}/messages`, { body: `Pressing seams open on block ${i} (${who})` });
    }
  }
  return { room: room.id };
}

/** A photo of one of the reader's blocks, served as the board's thumbnail. */
async function seedPhoto({ reader, swap, url }: Seeded) {
  const [block] = await reader.api<{ id: number }[]>('GET', `/swaps/${swap.swapId}/blocks?maker=me`);
  const image = await sharp({ create: { width: 900, height: 900, channels: 3, background: { r: 180, g: 90, b: 60 } } })
    .jpeg()
    .toBuffer();
  const form = new FormData();
  form.append('photos', new Blob([new Uint8Array(image)], { type: 'image/jpeg' }), 'block.jpg');
  const res = await fetch(`${url}/api/blocks/${block!.id}/photos`, {
    method: 'POST',
    headers: { cookie: reader.cookie, 'x-requested-with': 'blockpost' },
    body: form,
  });
  if (!res.ok) throw new Error(`photo upload answered ${res.status}: ${await res.text()}`);
  const { photos } = (await res.json()) as { photos: { id: number }[] };
  return { photo: photos[0]!.id, block: block!.id };
}

/** One of the reader's blocks measured three times with the ruler (its history, as a board row opens it). */
async function seedMeasurements({ coordinator, reader, swap }: Seeded) {
  const blocks = await reader.api<{ id: number; state: string }[]>('GET', `/swaps/${swap.swapId}/blocks?maker=me`);
  const block = blocks.find((b) => b.state === 'measured') ?? blocks[0]!;
  if (block.state !== 'measured') await coordinator.api('POST', `/blocks/${block.id}/received`, {});
  for (const width of ['8 1/2', '8 5/8', '8 7/16'])
    await coordinator.api('POST', `/blocks/${block.id}/measurements`, { width, height: '8 1/2', note: 'rechecked' });
  return { block: block.id };
}

interface Sample {
  rps: number;
  p99: number;
  serverCpuMs: number;
  dbCpuMs: number;
}

async function main() {
  const [revision, scenarioName = 'measure'] = process.argv.slice(2);
  const scenario = SCENARIOS[scenarioName];
  if (!revision || !scenario) {
    console.error(`usage: npx tsx bench/compare.ts <git revision> [${Object.keys(SCENARIOS).join('|')}]`);
    process.exit(2);
  }
  const seconds = Number(process.env.BENCH_SECONDS ?? 4);
  const rounds = Number(process.env.BENCH_ROUNDS ?? 8);

  const sha = execFileSync('git', ['rev-parse', '--short', revision], { cwd: repoRoot, encoding: 'utf8' }).trim();
  const worktree = mkdtempSync(join(tmpdir(), `blockpost-compare-${sha}-`));
  execFileSync('git', ['worktree', 'add', '--detach', '--force', worktree, sha], { cwd: repoRoot, stdio: 'ignore' });
  symlinkSync(join(repoRoot, 'node_modules'), join(worktree, 'node_modules'));
  const cluster = await startThrowawayCluster('blockpost-compare-');
  const apps: NodeProcess[] = [];
  try {
    /**
     * Each app on a database of its own, seeded alike: on one database the two job workers queue mail
     * for the same makers, and the app that queued a maker's receipt first left the other's every
     * attempt refused, a round trip the first never made (B read 64 % of A with the same routes).
     */
    const startSide = async (name: string, root?: string) => {
      const databaseUrl = await cluster.database(`bench_${apps.length}`);
      // BENCH_PROFILE_DIR: a `node --cpu-prof` profile of this tree's side (bench/profile.ts sums it up).
      const profileDir = root ? undefined : process.env.BENCH_PROFILE_DIR;
      const app = await startAppProcess(databaseUrl, { root, name, profileDir });
      apps.push(app);
      const coordinator = await newAccount(app.url, databaseUrl, 'compare-coordinator@example.test', 'Compare Coordinator');
      const guild = await coordinator.api<{ id: number }>('POST', '/guilds', { name: 'Comparison Bee' });
      const swap: SeededSwap = await seedSwap(databaseUrl, coordinator, guild.id, scenario.size);
      if (scenario.size.tag !== HISTORY_SIZE.tag) await seedHistory(databaseUrl, coordinator, guild.id);
      // A maker seeded with the swap signs in with the bench's password (seedSwap).
      const reader = scenario.asMaker ? await signIn(app.url, `bench-${scenario.size.tag}-1@example.test`) : coordinator;
      const headers = { cookie: reader.cookie, 'x-requested-with': 'blockpost' };
      const seeded = { url: app.url, guildId: guild.id, swap, coordinator, reader };
      const ids: Record<string, number> = { guild: guild.id, swap: swap.swapId, ...(await scenario.setup?.(seeded)) };
      const request: Pick<LoadOptions, 'method' | 'paths' | 'body' | 'headers' | 'freshClientId'> =
        scenarioName === 'measure'
          ? {
              method: 'POST',
              paths: swap.measuredBlockIds.map((id) => `/api/blocks/${id}/measurements`),
              headers,
              body: JSON.stringify({ width: '9 1/2', height: '9 1/2' }),
              freshClientId: true,
            }
          : { paths: [scenario.get!.replace(/\{(\w+)\}/g, (_all, name: string) => String(ids[name]))], headers };
      return { app, request, databaseUrl };
    };
    const a = await startSide(`A (${sha})`, worktree);
    const b = await startSide('B (this tree)');
    // Both databases settled before the first round: left to autovacuum, the one seeded last was vacuumed
    // during the rounds, on its side's figures.
    for (const side of [a, b]) await withClient(side.databaseUrl, (client) => client.query('VACUUM (ANALYZE)'));

    const run = async ({ app, request }: typeof a, duration: number): Promise<Sample> => {
      const result = await loadWithCpu(app.pid, cluster.port, {
        url: app.url,
        connections: scenario.connections,
        duration,
        ...request,
      });
      if (result.errors + result.non2xx > 0) throw new Error(`${app.name}: ${result.errors + result.non2xx} failed requests`);
      const { rps, p99, serverCpuMs, dbCpuMs } = result;
      return { rps, p99, serverCpuMs, dbCpuMs };
    };

    // Warm both JITs before the first figure.
    await run(a, 3);
    await run(b, 3);
    const samples: { a: Sample[]; b: Sample[] } = { a: [], b: [] };
    for (let round = 0; round < rounds; round++) {
      // Alternate which goes first, so neither always follows the other's heap and caches.
      const order = round % 2 === 0 ? (['a', 'b'] as const) : (['b', 'a'] as const);
      for (const side of order) samples[side].push(await run(side === 'a' ? a : b, seconds));
      const last = { a: samples.a.at(-1)!, b: samples.b.at(-1)! };
      console.log(
        `  round ${round + 1}: A ${round_(last.a.rps)} rps ${last.a.serverCpuMs.toFixed(2)} ms CPU, B ${round_(last.b.rps)} rps ${last.b.serverCpuMs.toFixed(2)} ms CPU`,
      );
    }
    const ratio = (key: keyof Sample) => median(samples.a.map((s, i) => samples.b[i]![key] / s[key]));
    const side = (name: string, s: Sample[]) => ({
      server: name,
      rps: round(median(s.map((x) => x.rps))),
      p99_ms: median(s.map((x) => x.p99)),
      'server CPU ms/req': round(median(s.map((x) => x.serverCpuMs)), 3),
      'db CPU ms/req': round(median(s.map((x) => x.dbCpuMs)), 3),
    });
    console.log(`\n${scenarioName}, ${scenario.connections} connections, ${rounds} rounds of ${seconds} s each side:`);
    console.table([
      side(a.app.name, samples.a),
      side(b.app.name, samples.b),
      {
        server: 'B / A (median of rounds)',
        rps: `${round(ratio('rps') * 100)} %`,
        p99_ms: `${round(ratio('p99') * 100)} %`,
        'server CPU ms/req': `${round(ratio('serverCpuMs') * 100)} %`,
        'db CPU ms/req': `${round(ratio('dbCpuMs') * 100)} %`,
      },
    ]);
  } finally {
    for (const app of apps) await app.stop();
    cluster.stop();
    execFileSync('git', ['worktree', 'remove', '--force', worktree], { cwd: repoRoot, stdio: 'ignore' });
    if (existsSync(worktree)) rmSync(worktree, { recursive: true, force: true });
  }
}

const round_ = (n: number) => Math.round(n);

await main();
