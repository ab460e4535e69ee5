/**
 * How to make a grid block in quantity: the strip sets (rows of the grid sewn as long strips and
 * sub-cut at the row heights) and, for cutting patch by patch, the cut list grouped by fabric role.
 */
import { type GridSpec, gridArg, stripSetWidthExact } from './blocks';
import { fabricYardsExact } from './fabric';
import { Fraction, QuiltInputError, countArg, lengthArg } from './rational';

export const DEFAULT_WOF = 42;

export interface RecipeOptions {
  /** number of blocks to make (default 1) */
  blocks?: number;
  /** usable width of fabric in inches (default 42) */
  wof?: number;
}

export interface StripSetDesign {
  /** the strips sewn side by side, in column order */
  strips: { width: number; role?: string }[];
  /** width of the sewn strip set */
  sewnWidth: number;
  /** sub-cuts across the strip set; each becomes one row of the block */
  subCuts: { height: number; rows: number[]; perBlock: number; total: number }[];
  /** length of strip set used by one block */
  lengthPerBlock: number;
  /** strip sets, each one WOF long, to sew for all blocks (sub-cuts packed first-fit decreasing) */
  stripSets: number;
}

export interface CutListRow {
  role?: string;
  width: number;
  height: number;
  count: number;
}

export interface StripToCut {
  role?: string;
  width: number;
  /** strips cut across the width of fabric */
  count: number;
  yards: number;
}

export interface GridRecipe {
  blocks: number;
  wof: number;
  stripSets: StripSetDesign[];
  /** strips to cut for all the strip sets, grouped by role and width */
  stripsToCut: StripToCut[];
  /** the same block cut patch by patch */
  cutList: CutListRow[];
}

function options(opts: RecipeOptions): { blocks: number; wof: Fraction } {
  return { blocks: countArg('blocks', opts.blocks ?? 1, 1), wof: lengthArg('wof', opts.wof ?? DEFAULT_WOF) };
}

/** Number of bins of length `capacity` needed for `items`, first-fit decreasing. */
export function packFirstFitDecreasing(items: readonly Fraction[], capacity: Fraction): number {
  const sorted = [...items].sort((a, b) => b.compare(a));
  const free: Fraction[] = [];
  for (const item of sorted) {
    const slot = free.findIndex((f) => f.gte(item));
    if (slot >= 0) free[slot] = (free[slot] as Fraction).sub(item);
    else free.push(capacity.sub(item));
  }
  return free.length;
}

/**
 * Strip-set recipe: rows with the same sequence of roles share a strip set made of one strip per
 * column (cut at the column width, across the WOF), sub-cut at each row's height.
 */
export function gridStripSets(spec: GridSpec, opts: RecipeOptions = {}): StripSetDesign[] {
  const g = gridArg(spec);
  const { blocks, wof } = options(opts);
  const groups = new Map<string, number[]>();
  g.rows.forEach((_, row) => {
    const key = JSON.stringify(g.roles?.[row] ?? []);
    groups.set(key, [...(groups.get(key) ?? []), row]);
  });
  return [...groups.values()].map((rows) => {
    const byHeight = new Map<string, { height: Fraction; rows: number[] }>();
    for (const row of rows) {
      const h = g.rows[row] as Fraction;
      const entry = byHeight.get(h.toFraction()) ?? { height: h, rows: [] };
      entry.rows.push(row);
      byHeight.set(h.toFraction(), entry);
    }
    const items: Fraction[] = [];
    const subCuts = [...byHeight.values()].map(({ height, rows: rs }) => {
      if (height.gt(wof)) {
        throw new QuiltInputError('rows', `A ${height.valueOf()}″ sub-cut is longer than the ${wof.valueOf()}″ strip set.`);
      }
      for (let i = 0; i < rs.length * blocks; i += 1) items.push(height);
      return { height: height.valueOf(), rows: rs, perBlock: rs.length, total: rs.length * blocks };
    });
    const lengthPerBlock = rows.reduce((s, row) => s.add(g.rows[row] as Fraction), new Fraction(0));
    const first = rows[0] ?? 0;
    return {
      strips: g.columns.map((w, col) => {
        const role = g.roles?.[first]?.[col];
        return role !== undefined ? { width: w.valueOf(), role } : { width: w.valueOf() };
      }),
      sewnWidth: stripSetWidthExact(g.columns, g.seam).valueOf(),
      subCuts,
      lengthPerBlock: lengthPerBlock.valueOf(),
      stripSets: packFirstFitDecreasing(items, wof),
    };
  });
}

/** Patches to cut one by one for `blocks` blocks, grouped by role and cut size, largest first. */
export function gridCutList(spec: GridSpec, opts: RecipeOptions = {}): CutListRow[] {
  const g = gridArg(spec);
  const { blocks } = options(opts);
  const rows = new Map<string, { role?: string; width: Fraction; height: Fraction; count: number }>();
  g.rows.forEach((h, row) => {
    g.columns.forEach((w, col) => {
      const role = g.roles?.[row]?.[col];
      const key = JSON.stringify([role ?? null, w.toFraction(), h.toFraction()]);
      const entry = rows.get(key) ?? { ...(role !== undefined ? { role } : {}), width: w, height: h, count: 0 };
      entry.count += blocks;
      rows.set(key, entry);
    });
  });
  return [...rows.values()]
    .sort(
      (a, b) =>
        (a.role ?? '').localeCompare(b.role ?? '') ||
        b.width.mul(b.height).compare(a.width.mul(a.height)) ||
        b.width.compare(a.width),
    )
    .map((r) => ({
      ...(r.role !== undefined ? { role: r.role } : {}),
      width: r.width.valueOf(),
      height: r.height.valueOf(),
      count: r.count,
    }));
}

/** Strip sets, the strips to cut for them (with yardage rounded up to ⅛ yd), and the cut list. */
export function gridRecipe(spec: GridSpec, opts: RecipeOptions = {}): GridRecipe {
  const { blocks, wof } = options(opts);
  const stripSets = gridStripSets(spec, opts);
  const strips = new Map<string, { role?: string; width: Fraction; count: number }>();
  for (const set of stripSets) {
    for (const strip of set.strips) {
      const width = lengthArg('width', strip.width);
      const key = JSON.stringify([strip.role ?? null, width.toFraction()]);
      const entry = strips.get(key) ?? { ...(strip.role !== undefined ? { role: strip.role } : {}), width, count: 0 };
      entry.count += set.stripSets;
      strips.set(key, entry);
    }
  }
  const stripsToCut = [...strips.values()].map((s) => ({
    ...(s.role !== undefined ? { role: s.role } : {}),
    width: s.width.valueOf(),
    count: s.count,
    yards: fabricYardsExact(s.width.mul(s.count)).valueOf(),
  }));
  return { blocks, wof: wof.valueOf(), stripSets, stripsToCut, cutList: gridCutList(spec, opts) };
}
