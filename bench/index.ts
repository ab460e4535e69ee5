/**
 * `npm run bench`: every benchmark in one run on this machine, printed as tables and written to
 * docs/benchmarks.md with the machine's description. Each figure stands beside its reference or goal.
 */
import { writeFileSync } from 'node:fs';
import { cpus, totalmem, release } from 'node:os';
import { runBundleBench } from './bundle';
import { runApiBench } from './api';

type Row = Record<string, string | number | undefined>;
interface Section {
  title: string;
  note: string;
  rows: Row[];
}

const sections: Section[] = [];
const seconds = Number(process.env.BENCH_SECONDS ?? 8);

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
if (runEngineBench) await section('Quilt math engine', 'Median time per call; target: a 60 × 4 distribution under 5 ms.', runEngineBench);
await section('API (autocannon over loopback)', `${seconds} s per run; the app versus bare Express + pg doing one equivalent query. Goals: roster p95 < 20 ms at 200 req/s; throughput ≥ 50 % of bare.`, async () => (await runApiBench({ duration: seconds })) as unknown as Row[]);
const runLiveBench = await optional<() => Promise<Row[]>>('./live.ts', 'runLiveBench');
if (runLiveBench) await section('Live board and chat (socket.io over loopback)', 'From the database commit to receipt on every socket; target p95 < 50 ms.', runLiveBench);
await section('Client bundle (gzip)', 'Initial route JS target < 200 kB gzip; route chunks load on demand.', () => runBundleBench() as unknown as Row[]);

const machine = `${cpus().length} × ${cpus()[0]?.model ?? 'CPU'}, ${(totalmem() / 2 ** 30).toFixed(0)} GiB RAM, Linux ${release()}, Node ${process.version}`;
const table = (rows: Row[]) => {
  if (!rows.length) return '_no figures_\n';
  const keys = [...new Set(rows.flatMap((r) => Object.keys(r)))];
  return [`| ${keys.join(' | ')} |`, `|${keys.map(() => '---').join('|')}|`, ...rows.map((r) => `| ${keys.map((k) => r[k] ?? '').join(' | ')} |`)].join('\n') + '\n';
};
const markdown = [
  '# Benchmarks',
  '',
  `Latest \`npm run bench\`, ${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC, on ${machine}.`,
  'Every server figure is measured over loopback on this one machine, so client and server share its cores.',
  '',
  ...sections.flatMap((s) => [`## ${s.title}`, '', s.note, '', table(s.rows)]),
].join('\n');
writeFileSync(new URL('../docs/benchmarks.md', import.meta.url), markdown);
console.log('\nWrote docs/benchmarks.md');
process.exit(0);
