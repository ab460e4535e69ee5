/**
 * `npm run bench`: every benchmark in one run on this machine, printed as tables and written to
 * docs/benchmarks.md with the machine's description. Each figure stands beside its reference or goal.
 */
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { cpus, totalmem, release } from 'node:os';
import { runBundleBench } from './bundle';
import { runApiBench, type ApiBenchResult } from './api';
import { runLiveBurstBench } from './live-burst';

type Row = Record<string, string | number | undefined>;
interface Section {
  title: string;
  note: string;
  rows: Row[];
}

const sections: Section[] = [];
const seconds = Number(process.env.BENCH_SECONDS ?? 5);
const runs = Number(process.env.BENCH_RUNS ?? 3);

async function section(title: string, note: string, run: () => Promise<Row[]> | Row[]) {
  console.log(`\n== ${title}`);
  const started = Date.now();
  try {
    const rows = await run();
    console.table(rows);
    sections.push({ title, note, rows });
  } catch (error) {
    console.error(`${title} failed: ${(error as Error).message}`);
    sections.push({ title, note: `FAILED: ${(error as Error).message}`, rows: [] });
  }
  console.log(`(${((Date.now() - started) / 1000).toFixed(1)} s)`);
}

// Optional benchmarks live beside this file; each exports one run function.
async function optional<T>(path: string, name: string): Promise<T | null> {
  try {
    const mod = (await import(path)) as Record<string, unknown>;
    return (mod[name] as T) ?? null;
  } catch {
    return null;
  }
}

const runEngineBench = await optional<() => Promise<Row[]>>('./engine.ts', 'runEngineBench');
if (runEngineBench)
  await section('Quilt math engine', 'Median time per call; target: a 60 × 4 distribution under 5 ms.', runEngineBench);
const runArrangeBench = await optional<() => Promise<Row[]>>('./arrange.ts', 'runArrangeBench');
if (runArrangeBench) {
  await section(
    'Design wall: spreading the colours',
    'Median time of the arrangement search from a random start; score = smallest CIEDE2000 difference between neighbours (higher is better), beside the median of 100 random arrangements. Target: 42 blocks under 200 ms.',
    runArrangeBench,
  );
}
let api: ApiBenchResult | null = null;
await section(
  'API (each server its own process, autocannon in another)',
  `${seconds} s per run, ${runs} runs of each server alternating app / Express / node:http; medians with the spread (min–max) in brackets. The app runs as production starts it; the references do one equivalent query with no session, checks or logging. "of Express" is the ratio of median throughputs measured in the same run, the figure to read on a shared machine.`,
  async () => {
    api = await runApiBench({ duration: seconds, runs, profileDir: process.env.BENCH_PROFILE_DIR });
    return api.rows;
  },
);
if (api) {
  const { goals, perBlock, costFit, memory } = api as ApiBenchResult;
  await section(
    'API goals',
    'Ratios to bare Express from the runs above: of the median rates, and in brackets of the CPU a request (bare Express’s server and database CPU over the app’s), which a busy machine moves less. A goal is judged on the rates.',
    () => goals,
  );
  await section(
    'Roster cost per block',
    'Server and database CPU per roster request (medians of the runs above) divided by the blocks it lists, at each size: a cost that grows with the work stays level down a column.',
    () => perBlock,
  );
  await section(
    'Roster cost: a fixed part and a part per block',
    'A least-squares line through the three sizes above (CPU per roster request against the blocks it lists), server and database apart: "fixed" is what a request costs whatever the roster’s size (session, checks, routing), "per block" what each block adds. r² says how well a straight line explains the three sizes (a cost growing faster than the blocks reads lower, its fixed part even below zero). Where the app’s fixed part is a larger multiple of bare Express’s than its part per block, the small roster’s ratio reads lowest.',
    () => costFit,
  );
  await section('Memory after the API bench', 'Resident set size of each server process at the end, and its peak.', () => memory);
}
const runLiveBench = await optional<() => Promise<Row[]>>('./live.ts', 'runLiveBench');
if (runLiveBench)
  await section(
    'Live board and chat (socket.io over loopback)',
    'From the database commit to receipt on every socket, one change at a time (each after the board’s 50 ms coalescing interval); target p95 < 50 ms.',
    runLiveBench,
  );
await section(
  'Live board under a burst (each server its own process, stations and viewers in two others)',
  `10 intake stations (this process) measure as fast as the server answers, each measurement with a clientId as the app’s client sends it, while 200 sockets (a process of their own) watch the board; an untimed burst first, then 80 measurements a station timed. Commit → receipt is timed from the measurement’s recorded time (just before the statement that writes it) to each socket’s handler. The bare reference is Express + pg + socket.io with one INSERT per measurement and the board’s changes paced by the app’s own code (server/board/change-pacing.ts), each read with one query (no session, checks, history or activity lines): what this machine allows under the same load. The second reference is the same bare server sending the app’s message (each touched maker’s whole row with every block, the totals, activity lines with names), its stations held to the rate of the app’s run just before it: what the machine allows with the app’s messages at the app’s pace, apart from the app’s other work. ${runs} runs of each, alternating; medians with the spread (min–max) in brackets, lost changes and gaps summed over the runs. Goals for the app: at most one change per swap per 50 ms per node, p95 < 100 ms, no lost change, no version gap.`,
  () => runLiveBurstBench({ rounds: runs }),
);
const runPhotoBurstBench = await optional<() => Promise<Row[]>>('./photo-burst.ts', 'runPhotoBurstBench');
if (runPhotoBurstBench)
  await section(
    'Photos: a burst of large uploads beside everyone else (app in its own process, load in another)',
    'Health latency with no burst, then while 12 uploads of 4 photos of 10000 × 10000 px arrive at once (health asked 20 times a second by the load process). Photos are re-encoded in a bounded queue outside transactions; a full queue answers 503 with Retry-After and the upload is sent again. Goal: health p95 during the burst stays under 250 ms.',
    runPhotoBurstBench,
  );
await section(
  'Client bundle (gzip)',
  'Initial route JS target < 200 kB gzip; route chunks load on demand.',
  () => runBundleBench() as unknown as Row[],
);

const machine = `${cpus().length} × ${cpus()[0]?.model ?? 'CPU'}, ${(totalmem() / 2 ** 30).toFixed(0)} GiB RAM, Linux ${release()}, Node ${process.version}`;
const table = (rows: Row[]) => {
  if (!rows.length) return '_no figures_\n';
  const keys = [...new Set(rows.flatMap((r) => Object.keys(r)))];
  return (
    [
      `| ${keys.join(' | ')} |`,
      `|${keys.map(() => '---').join('|')}|`,
      ...rows.map((r) => `| ${keys.map((k) => r[k] ?? '').join(' | ')} |`),
    ].join('\n') + '\n'
  );
};
// Hand-written notes (what the profiles showed, what each change bought) sit below this line and are kept.
const NOTES_MARK = '<!-- Notes below this line are written by hand and kept by npm run bench. -->';
const target = new URL('../docs/benchmarks.md', import.meta.url);
const previous = existsSync(target) ? readFileSync(target, 'utf8') : '';
const notes = previous.includes(NOTES_MARK) ? previous.slice(previous.indexOf(NOTES_MARK)) : `${NOTES_MARK}\n`;
const markdown = [
  '# Benchmarks',
  '',
  `Latest \`npm run bench\`, ${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC, on ${machine}.`,
  'Every server figure is measured over loopback on this one machine, so servers, load generators and PostgreSQL share its cores.',
  '',
  ...sections.flatMap((s) => [`## ${s.title}`, '', s.note, '', table(s.rows)]),
  notes,
].join('\n');
writeFileSync(target, markdown);
console.log('\nWrote docs/benchmarks.md');
process.exit(0);
