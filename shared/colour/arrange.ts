/**
 * "Spread the colours": rearrange the blocks on a grid so that neighbouring blocks differ as much
 * as possible in colour. Neighbours are the eight cells around a cell (side by side and corner to
 * corner), so a checkerboard setting with plain blocks between still spreads its blocks.
 *
 * The score of an arrangement is its bottleneck: the smallest CIEDE2000 difference between any two
 * neighbouring blocks whose colours are known (higher is better). Empty and plain cells and pinned
 * tiles never move; only the other blocks trade places. A simulated annealing run on a smooth
 * stand-in for the bottleneck (Σ exp(−ΔE ⁄ τ) over neighbour pairs) is followed by a greedy pass on
 * the exact score; the answer is never worse than the arrangement it started from. Deterministic
 * for a given seed.
 */
import { deltaE2000, type Lab } from './lab';

export interface ArrangeInput {
  columns: number;
  rows: number;
  /** one entry per cell, row by row: a block's key, or null for an empty or plain cell */
  cells: readonly (number | null)[];
  /** indices of cells whose tile stays where it is */
  pinned?: ReadonlySet<number> | readonly number[];
  /** colour of each block by key; a block without one is left out of the score */
  colourOf: (key: number) => Lab | null | undefined;
  /** seed of the pseudo-random moves (default 1) */
  seed?: number;
  /** annealing moves (default: 3 000 per movable tile, between 20 000 and 250 000) */
  moves?: number;
}

export interface ArrangeResult {
  cells: (number | null)[];
  /** smallest colour difference between neighbours after; 0 when no two known colours touch */
  score: number;
  /** the same for the arrangement given */
  before: number;
}

/** Small, fast, seedable generator (mulberry32). */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** The cells next to each cell (eight-way), row by row. */
export function neighbourCells(columns: number, rows: number): number[][] {
  const out: number[][] = [];
  for (let r = 0; r < rows; r += 1) {
    for (let c = 0; c < columns; c += 1) {
      const list: number[] = [];
      for (let dr = -1; dr <= 1; dr += 1) {
        for (let dc = -1; dc <= 1; dc += 1) {
          if (!dr && !dc) continue;
          const rr = r + dr;
          const cc = c + dc;
          if (rr >= 0 && rr < rows && cc >= 0 && cc < columns) list.push(rr * columns + cc);
        }
      }
      out.push(list);
    }
  }
  return out;
}

interface Prepared {
  n: number;
  /** tile index in each cell, −1 for none */
  at: Int32Array;
  keys: number[];
  /** distance between tiles i and j (NaN when either colour is unknown) */
  dist: Float64Array;
  nbrs: number[][];
  movable: number[];
}

function prepare(input: ArrangeInput): Prepared {
  const { columns, rows, cells } = input;
  if (!Number.isInteger(columns) || !Number.isInteger(rows) || columns < 1 || rows < 1)
    throw new RangeError('columns and rows must be whole numbers of at least 1');
  if (cells.length !== columns * rows) throw new RangeError(`expected ${columns * rows} cells, got ${cells.length}`);
  const pinned = new Set(input.pinned ?? []);
  const keys: number[] = [];
  const at = new Int32Array(cells.length).fill(-1);
  cells.forEach((key, i) => {
    if (key === null) return;
    at[i] = keys.length;
    keys.push(key);
  });
  const n = keys.length;
  const labs = keys.map((k) => input.colourOf(k) ?? null);
  const dist = new Float64Array(n * n).fill(Number.NaN);
  for (let i = 0; i < n; i += 1) {
    for (let j = i + 1; j < n; j += 1) {
      const a = labs[i];
      const b = labs[j];
      if (!a || !b) continue;
      const d = deltaE2000(a, b);
      dist[i * n + j] = d;
      dist[j * n + i] = d;
    }
  }
  const movable = [...cells.keys()].filter((i) => at[i]! >= 0 && !pinned.has(i));
  return { n, at, keys, dist, nbrs: neighbourCells(columns, rows), movable };
}

/** Smallest neighbour difference of an arrangement, and how many pairs share it (Infinity, 0 when none). */
function bottleneck(p: Prepared, at: Int32Array): { min: number; count: number } {
  let min = Infinity;
  let count = 0;
  for (let cell = 0; cell < at.length; cell += 1) {
    const t = at[cell]!;
    if (t < 0) continue;
    for (const other of p.nbrs[cell]!) {
      if (other <= cell) continue;
      const u = at[other]!;
      if (u < 0) continue;
      const d = p.dist[t * p.n + u]!;
      if (Number.isNaN(d)) continue;
      if (d < min - 1e-12) {
        min = d;
        count = 1;
      } else if (Math.abs(d - min) <= 1e-12) count += 1;
    }
  }
  return { min, count };
}

/** Score of an arrangement given as cells of keys: the smallest difference between neighbours (0 when none). */
export function arrangementScore(input: Omit<ArrangeInput, 'seed' | 'moves' | 'pinned'>): number {
  const p = prepare(input);
  const { min } = bottleneck(p, p.at);
  return Number.isFinite(min) ? min : 0;
}

/** Is arrangement a better than b: higher bottleneck, then fewer pairs at it, then lower smooth energy. */
function better(a: { min: number; count: number; energy: number }, b: { min: number; count: number; energy: number }): boolean {
  if (a.min > b.min + 1e-9) return true;
  if (a.min < b.min - 1e-9) return false;
  if (a.count !== b.count) return a.count < b.count;
  return a.energy < b.energy - 1e-9;
}

/** Proposes an arrangement; see the module comment. */
export function arrangeByColour(input: ArrangeInput): ArrangeResult {
  const p = prepare(input);
  const start = p.at;
  const startNeck = bottleneck(p, start);
  const before = Number.isFinite(startNeck.min) ? startNeck.min : 0;
  const known: number[] = [];
  for (let i = 0; i < p.dist.length; i += 1) if (!Number.isNaN(p.dist[i]!)) known.push(p.dist[i]!);
  if (p.movable.length < 2 || known.length === 0) return { cells: [...input.cells], score: before, before };

  known.sort((x, y) => x - y);
  const tau = Math.max(0.5, known[Math.floor(known.length / 2)]! / 6);
  const weight = new Float64Array(p.dist.length);
  for (let i = 0; i < p.dist.length; i += 1) weight[i] = Number.isNaN(p.dist[i]!) ? 0 : Math.exp(-p.dist[i]! / tau);

  const at = Int32Array.from(start);
  const local = (cell: number): number => {
    const t = at[cell]!;
    let e = 0;
    for (const o of p.nbrs[cell]!) {
      const u = at[o]!;
      if (u >= 0) e += weight[t * p.n + u]!;
    }
    return e;
  };
  let energy = 0;
  for (let c = 0; c < at.length; c += 1) if (at[c]! >= 0) energy += local(c);
  energy /= 2;

  const random = seededRandom(input.seed ?? 1);
  const m = p.movable.length;
  const moves = input.moves ?? Math.min(250_000, Math.max(20_000, 3_000 * m));
  const swapDelta = (c1: number, c2: number): number => {
    const beforeE = local(c1) + local(c2);
    [at[c1], at[c2]] = [at[c2]!, at[c1]!];
    const afterE = local(c1) + local(c2);
    [at[c1], at[c2]] = [at[c2]!, at[c1]!];
    // A pair of the two cells themselves is counted in both sums and does not change.
    return afterE - beforeE;
  };
  // Starting temperature: the typical size of a move's change in energy.
  let sample = 0;
  for (let i = 0; i < 200; i += 1) {
    const c1 = p.movable[Math.floor(random() * m)]!;
    const c2 = p.movable[Math.floor(random() * m)]!;
    sample += Math.abs(swapDelta(c1, c2));
  }
  const t0 = Math.max(1e-6, sample / 200);
  const t1 = t0 / 1000;
  const cool = (t1 / t0) ** (1 / moves);
  let temp = t0;
  let bestEnergy = energy;
  let best = Int32Array.from(at);
  for (let i = 0; i < moves; i += 1, temp *= cool) {
    const c1 = p.movable[Math.floor(random() * m)]!;
    const c2 = p.movable[Math.floor(random() * m)]!;
    if (c1 === c2) continue;
    const delta = swapDelta(c1, c2);
    if (delta <= 0 || random() < Math.exp(-delta / temp)) {
      [at[c1], at[c2]] = [at[c2]!, at[c1]!];
      energy += delta;
      if (energy < bestEnergy - 1e-12) {
        bestEnergy = energy;
        best = Int32Array.from(at);
      }
    }
  }

  // Greedy pass on the exact score: move a tile of the worst pair wherever that helps.
  at.set(best);
  energy = bestEnergy;
  let state = { ...bottleneck(p, at), energy };
  const movableSet = new Set(p.movable);
  for (let round = 0; round < 2 * m; round += 1) {
    const worst = worstPairCells(p, at, state.min);
    let improved = false;
    for (const c1 of worst) {
      if (!movableSet.has(c1)) continue;
      for (const c2 of p.movable) {
        if (c2 === c1) continue;
        const delta = swapDelta(c1, c2);
        [at[c1], at[c2]] = [at[c2]!, at[c1]!];
        const next = { ...bottleneck(p, at), energy: energy + delta };
        if (better(next, state)) {
          state = next;
          energy += delta;
          improved = true;
          break;
        }
        [at[c1], at[c2]] = [at[c2]!, at[c1]!];
      }
      if (improved) break;
    }
    if (!improved) break;
  }

  // Never answer worse than the arrangement given.
  const keepStart = better({ ...startNeck, energy: 0 }, { ...state, energy: 0 });
  const finalAt = keepStart ? start : at;
  const neck = keepStart ? startNeck : state;
  const cells = [...finalAt].map((t) => (t < 0 ? null : p.keys[t]!));
  return { cells, score: Number.isFinite(neck.min) ? neck.min : 0, before };
}

/** The cells of the neighbour pairs at the bottleneck. */
function worstPairCells(p: Prepared, at: Int32Array, min: number): number[] {
  const out = new Set<number>();
  for (let cell = 0; cell < at.length; cell += 1) {
    const t = at[cell]!;
    if (t < 0) continue;
    for (const other of p.nbrs[cell]!) {
      const u = at[other]!;
      if (u < 0 || other <= cell) continue;
      const d = p.dist[t * p.n + u]!;
      if (!Number.isNaN(d) && Math.abs(d - min) <= 1e-9) {
        out.add(cell);
        out.add(other);
      }
    }
  }
  return [...out];
}
