/**
 * Benchmark of the design wall's colour-spreading search: median time of arrangeByColour for 42 and
 * 120 blocks, and its score beside the median score of 100 random arrangements of the same blocks.
 * Run alone with `npx tsx bench/arrange.ts`; bench/index.ts collects runArrangeBench() with the rest.
 */
import { arrangeByColour, arrangementScore, seededRandom, srgbToLab, type Lab } from '../shared/colour/index';

export interface ArrangeBenchRow {
  blocks: number;
  grid: string;
  median_ms: number;
  p95_ms: number;
  runs: number;
  score: number;
  random_median_score: number;
  start_score: number;
  target?: string;
}

// Twelve fabric families, each block a small shift from its family: many near-twins, as in a swap
// where everyone was asked for the same colours.
const FAMILIES = [
  '#2F4B7C',
  '#B5462F',
  '#C8920F',
  '#5F7A5A',
  '#6B3F69',
  '#F7F3EA',
  '#1E2B44',
  '#E9C46A',
  '#8AB0C8',
  '#D98C7A',
  '#3E5641',
  '#A89F91',
];

function blocksFor(n: number, seed: number): Map<number, Lab> {
  const random = seededRandom(seed);
  const families = FAMILIES.map(srgbToLab);
  return new Map(
    Array.from({ length: n }, (_, i) => {
      const f = families[Math.floor(random() * families.length)]!;
      return [i + 1, [f[0] + random() * 8 - 4, f[1] + random() * 8 - 4, f[2] + random() * 8 - 4] as Lab];
    }),
  );
}

function shuffled<T>(items: T[], random: () => number): T[] {
  const out = [...items];
  for (let i = out.length - 1; i > 0; i -= 1) {
    const j = Math.floor(random() * (i + 1));
    [out[i], out[j]] = [out[j]!, out[i]!];
  }
  return out;
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const quantile = (xs: number[], p: number) =>
  [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.ceil(p * xs.length) - 1)]!;
const round = (x: number, digits = 4) => Number(x.toPrecision(digits));

function benchOne(n: number, columns: number, rows: number, runs: number): ArrangeBenchRow {
  const colours = blocksFor(n, n);
  const colourOf = (k: number) => colours.get(k);
  const random = seededRandom(1000 + n);
  const keys = [...colours.keys()];
  const randomScores = Array.from({ length: 100 }, () =>
    arrangementScore({ columns, rows, cells: shuffled(keys, random), colourOf }),
  );
  const start = shuffled(keys, random);
  arrangeByColour({ columns, rows, cells: start, colourOf }); // warm-up
  const times: number[] = [];
  let score = 0;
  for (let i = 0; i < runs; i += 1) {
    const t0 = performance.now();
    score = arrangeByColour({ columns, rows, cells: start, colourOf }).score;
    times.push(performance.now() - t0);
  }
  return {
    blocks: n,
    grid: `${columns} × ${rows}`,
    median_ms: round(median(times)),
    p95_ms: round(quantile(times, 0.95)),
    runs,
    score: round(score),
    random_median_score: round(median(randomScores)),
    start_score: round(arrangementScore({ columns, rows, cells: start, colourOf })),
  };
}

/** Both sizes; a few seconds. */
export async function runArrangeBench(): Promise<ArrangeBenchRow[]> {
  return [{ ...benchOne(42, 6, 7, 15), target: '< 200 ms' }, benchOne(120, 10, 12, 7)];
}

if (import.meta.url === `file://${process.argv[1]}`) console.table(await runArrangeBench());
