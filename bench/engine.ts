/**
 * Benchmarks of the quilt math engine: median (and 95th percentile) time per call.
 * Run alone with `npx tsx bench/engine.ts`; bench/index.ts collects runEngineBench() with the rest.
 */
import { checkBlock, formatLength, parseLength, planDistribution, quiltPlan } from '../shared/quilt/index';

export interface BenchRow {
  name: string;
  median_ms: number;
  p95_ms?: number;
  calls: number;
  target?: string;
}

interface Plan {
  /** timed samples */
  samples: number;
  /** calls per sample; the sample time is divided by it */
  batch?: number;
  /** untimed calls first, so the JIT has settled */
  warmup?: number;
}

function quantile(sorted: number[], p: number): number {
  const i = Math.min(sorted.length - 1, Math.max(0, Math.ceil(p * sorted.length) - 1));
  return sorted[i] as number;
}

function measure(name: string, fn: (i: number) => unknown, plan: Plan, target?: string): BenchRow {
  const batch = plan.batch ?? 1;
  let sink = 0;
  for (let i = 0; i < (plan.warmup ?? 10); i += 1) sink += fn(i) ? 1 : 0;
  const perCall: number[] = [];
  for (let s = 0; s < plan.samples; s += 1) {
    const start = performance.now();
    for (let i = 0; i < batch; i += 1) sink += fn(i) ? 1 : 0;
    perCall.push((performance.now() - start) / batch);
  }
  if (sink < 0) console.log(sink); // keeps the calls from being optimised away
  perCall.sort((a, b) => a - b);
  const row: BenchRow = {
    name,
    median_ms: round(quantile(perCall, 0.5)),
    p95_ms: round(quantile(perCall, 0.95)),
    calls: plan.samples * batch,
  };
  return target ? { ...row, target } : row;
}

const round = (ms: number): number => Number(ms.toPrecision(4));

const makers = (n: number, blocks: number) => Array.from({ length: n }, (_, i) => ({ id: `maker-${i}`, accepted: blocks }));

/** Runs every engine benchmark; takes a few seconds. */
export async function runEngineBench(): Promise<BenchRow[]> {
  const sixty = makers(60, 4);
  const fiveHundred = makers(500, 6);
  // A small bee where some makers pledged more blocks than there are other makers, plus angels:
  // every block cannot come from a different maker, so the general min-cost-flow path runs.
  const uneven = [8, 6, 5, 3, 2, 2].map((accepted, i) => ({ id: `maker-${i}`, accepted }));
  const angels = [
    { id: 'angel-a', blocks: 4 },
    { id: 'angel-b', blocks: 3 },
  ];
  const measured = Array.from({ length: 10_000 }, (_, i) => ({
    width: 12.25 + (i % 9) / 16,
    height: 12.25 + ((i * 7) % 9) / 16,
  }));
  const texts = ['8 1/2', '8½″', '216 mm', '12.5 inches', '8 3⁄16″', '0.25 yd'];

  const rows: BenchRow[] = [
    measure('planDistribution 60 makers × 4 blocks', () => planDistribution(sixty), { samples: 200, warmup: 20 }, '< 5 ms'),
    measure(
      'planDistribution 500 makers × 6 blocks',
      () => planDistribution(fiveHundred),
      { samples: 50, warmup: 15 },
      '< 50 ms',
    ),
    measure('planDistribution 6 uneven makers + 2 angels (min-cost flow)', () => planDistribution(uneven, { angels }), {
      samples: 100,
      warmup: 10,
    }),
    measure(
      'quiltPlan 42 blocks, sashing, 2 borders',
      () => quiltPlan({ blockFinished: { width: 12, height: 12 }, blocks: 42, sashing: 2, borders: [1.5, 4] }),
      { samples: 200, batch: 10 },
    ),
    measure(
      'checkBlock (median per call over batches of 10,000)',
      (i) =>
        checkBlock({
          target: { width: 12.5, height: 12.5 },
          tolerance: 0.125,
          measured: { ...(measured[i % 10_000] as { width: number; height: number }), diagonals: [17.6, 17.7] },
        }),
      { samples: 20, batch: 10_000, warmup: 10_000 },
    ),
    measure(
      'parseLength + formatLength',
      (i) => formatLength(parseLength(texts[i % texts.length] as string), { denominator: 16 }),
      { samples: 50, batch: 1000, warmup: 1000 },
    ),
  ];
  return rows;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const rows = await runEngineBench();
  console.table(rows);
}
