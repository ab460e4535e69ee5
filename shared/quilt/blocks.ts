/**
 * Seam allowances, strip sets and grid blocks. A grid block is a set of column cut widths and row
 * cut heights: each cell is a patch cut at (column width × row height) and sewn with `seam`.
 */
import { type Fraction, QuiltInputError, lengthArg, lengthListArg, sumQ } from './rational';

export const DEFAULT_SEAM = 0.25;

export function seamArg(seam: unknown): Fraction {
  const s = lengthArg('seam', seam, { zero: true });
  if (s.gte(1))
    throw new QuiltInputError('seam', `A seam allowance of ${s.valueOf()}″ is too wide; use less than 1″ (¼″ is usual).`);
  return s;
}

/** finished + 2 × seam (inches). */
export function unfinishedExact(finished: Fraction, seam: Fraction): Fraction {
  return finished.add(seam.mul(2));
}

/** Unfinished (cut, sewn-but-not-joined) size of a finished size: finished + 2 × seam. */
export function unfinishedSize(finished: number, seam: number = DEFAULT_SEAM): number {
  return unfinishedExact(lengthArg('finished', finished), seamArg(seam)).valueOf();
}

/** Finished size of an unfinished size: unfinished − 2 × seam; must leave something. */
export function finishedSize(unfinished: number, seam: number = DEFAULT_SEAM): number {
  const u = lengthArg('unfinished', unfinished);
  const s = seamArg(seam);
  const f = u.sub(s.mul(2));
  if (f.lte(0)) {
    throw new QuiltInputError(
      'unfinished',
      `An unfinished size of ${unfinished}″ leaves nothing once the ${seam}″ seam allowances are taken off.`,
    );
  }
  return f.valueOf();
}

/** Checks every strip is wider than the two seams it loses (else it vanishes into them). */
function stripsArg(field: string, widths: unknown, seam: Fraction): Fraction[] {
  const ws = lengthListArg(field, widths);
  ws.forEach((w, i) => {
    if (w.lte(seam.mul(2))) {
      throw new QuiltInputError(
        `${field}[${i}]`,
        `A strip or patch cut ${w.valueOf()}″ wide disappears into its two ${seam.valueOf()}″ seams; cut it wider than ${seam.mul(2).valueOf()}″.`,
      );
    }
  });
  return ws;
}

/** Σ widths − 2 × seam × (n − 1), exactly. */
export function stripSetWidthExact(widths: readonly Fraction[], seam: Fraction): Fraction {
  return sumQ(widths).sub(seam.mul(2 * (widths.length - 1)));
}

/**
 * Width of a sewn strip set: Σ cut widths − 2 × seam × (number of seams). Every strip must be
 * wider than two seam allowances.
 */
export function stripSetWidth(cutWidths: number[], seam: number = DEFAULT_SEAM): number {
  const s = seamArg(seam);
  return stripSetWidthExact(stripsArg('cutWidths', cutWidths, s), s).valueOf();
}

export interface Size {
  width: number;
  height: number;
}

export interface GridSpec {
  /** cut widths of the columns, left to right (inches) */
  columns: number[];
  /** cut heights of the rows, top to bottom (inches) */
  rows: number[];
  seam?: number;
  /** optional fabric role of every cell, roles[row][col] */
  roles?: string[][];
}

export interface GridPatch {
  row: number;
  col: number;
  role?: string;
  cut: Size;
  finished: Size;
  /** what shows of the patch in the unfinished block: outer edges keep their seam allowance */
  visibleInUnfinished: Size;
}

export interface GridBlock {
  seam: number;
  unfinished: Size;
  finished: Size;
  patches: GridPatch[];
}

/** Parsed, exact form of a grid spec shared by the grid functions. */
export interface ExactGrid {
  columns: Fraction[];
  rows: Fraction[];
  seam: Fraction;
  roles?: string[][];
}

export function gridArg(spec: GridSpec): ExactGrid {
  if (typeof spec !== 'object' || spec === null) throw new QuiltInputError('block', 'A grid block needs columns and rows.');
  const seam = seamArg(spec.seam ?? DEFAULT_SEAM);
  const columns = stripsArg('columns', spec.columns, seam);
  const rows = stripsArg('rows', spec.rows, seam);
  const roles = spec.roles;
  if (roles !== undefined) {
    const ok =
      Array.isArray(roles) &&
      roles.length === rows.length &&
      roles.every(
        (r) => Array.isArray(r) && r.length === columns.length && r.every((x) => typeof x === 'string' && x.trim() !== ''),
      );
    if (!ok) {
      throw new QuiltInputError('roles', `Roles must name a fabric for every cell: ${rows.length} rows of ${columns.length}.`);
    }
  }
  return roles ? { columns, rows, seam, roles } : { columns, rows, seam };
}

/** Visible part of a patch edge: inner edges lose one seam allowance each. */
function visible(cut: Fraction, index: number, count: number, seam: Fraction): Fraction {
  const inner = (index > 0 ? 1 : 0) + (index < count - 1 ? 1 : 0);
  return cut.sub(seam.mul(inner));
}

const size = (w: Fraction, h: Fraction): Size => ({ width: w.valueOf(), height: h.valueOf() });

/**
 * Sizes of a grid block. Unfinished width = Σ column widths − 2 × seam × (columns − 1), and the
 * same for height; finished = unfinished − 2 × seam. Patches are listed row by row.
 */
export function gridBlock(spec: GridSpec): GridBlock {
  const g = gridArg(spec);
  const two = g.seam.mul(2);
  const uw = stripSetWidthExact(g.columns, g.seam);
  const uh = stripSetWidthExact(g.rows, g.seam);
  const patches: GridPatch[] = [];
  g.rows.forEach((h, row) => {
    g.columns.forEach((w, col) => {
      const role = g.roles?.[row]?.[col];
      patches.push({
        row,
        col,
        ...(role !== undefined ? { role } : {}),
        cut: size(w, h),
        finished: size(w.sub(two), h.sub(two)),
        visibleInUnfinished: size(visible(w, col, g.columns.length, g.seam), visible(h, row, g.rows.length, g.seam)),
      });
    });
  });
  return { seam: g.seam.valueOf(), unfinished: size(uw, uh), finished: size(uw.sub(two), uh.sub(two)), patches };
}
