/**
 * Fabric: strips cut across the width of fabric (WOF), sub-cuts, yardage rounded up to ⅛ yd,
 * fat quarters and 10-inch precut squares. 1 yd = 36″ exactly.
 */
import { type Fraction, QuiltInputError, ceilTo, countArg, lengthArg, q } from './rational';

export const INCHES_PER_YARD = 36;
export const DEFAULT_USABLE_WOF = 42;
/** Fat quarter sizes in use (sources differ: 18 × 21 or 18 × 22, common practice). */
export const FAT_QUARTER_18X21 = { width: 18, height: 21 } as const;
export const FAT_QUARTER_18X22 = { width: 18, height: 22 } as const;
export const FAT_EIGHTH_9X21 = { width: 9, height: 21 } as const;

const EIGHTH = q(1, 8);
const YARD = q(36);

export const yardsToInches = (yards: number): number => lengthArg('yards', yards, { zero: true }).mul(YARD).valueOf();
export const inchesToYards = (inches: number): number => lengthArg('inches', inches, { zero: true }).div(YARD).valueOf();

/** Yards rounded up to the next ⅛ yd (common practice, no source). */
export function roundUpToEighthYard(yards: number): number {
  return ceilTo(lengthArg('yards', yards, { zero: true }), EIGHTH).valueOf();
}

/** Yards of fabric for a length of inches (plus an optional straightening cut), up to ⅛ yd. */
export function fabricYardsExact(lengthInches: Fraction, straighteningCut: Fraction = q(0)): Fraction {
  if (lengthInches.equals(0)) return q(0);
  return ceilTo(lengthInches.add(straighteningCut).div(YARD), EIGHTH);
}

export interface StraightenOption {
  /** inches lost squaring up the cut end of the fabric first (default 0) */
  straighteningCut?: number;
}

/** Strips of width w from one yard: ⌊(36 − straightening cut) ⁄ w⌋. */
export function stripsPerYard(width: number, opts: StraightenOption = {}): number {
  const w = lengthArg('width', width);
  const s = lengthArg('straighteningCut', opts.straighteningCut ?? 0, { zero: true });
  return Math.max(0, YARD.sub(s).div(w).floor().valueOf());
}

/** Squares of side s from one yard: ⌊(36 − straightening) ⁄ s⌋ × ⌊WOF ⁄ s⌋. */
export function squaresPerYard(side: number, opts: StraightenOption & { wof?: number } = {}): number {
  const wof = lengthArg('wof', opts.wof ?? DEFAULT_USABLE_WOF);
  return stripsPerYard(side, opts) * wof.div(lengthArg('side', side)).floor().valueOf();
}

export interface Piece {
  width: number;
  height: number;
  count: number;
}

interface ExactPiece {
  width: Fraction;
  height: Fraction;
  count: number;
}

export function piecesArg(pieces: unknown): ExactPiece[] {
  if (!Array.isArray(pieces) || pieces.length === 0) throw new QuiltInputError('pieces', 'List at least one piece to cut.');
  return pieces.map((p: Piece, i) => ({
    width: lengthArg(`pieces[${i}].width`, p?.width),
    height: lengthArg(`pieces[${i}].height`, p?.height),
    count: countArg(`pieces[${i}].count`, p?.count, 0),
  }));
}

export interface StripPlanOptions extends StraightenOption {
  /** usable width of fabric, selvages off (default 42″) */
  wof?: number;
  /**
   * `height` (default): strips as wide as each piece's height, sub-cut at its width.
   * `fewest-strips`: per piece, whichever way round uses less fabric.
   */
  orientation?: 'height' | 'fewest-strips';
}

export interface StripPlanPiece {
  width: number;
  height: number;
  count: number;
  /** length of each sub-cut across the strip */
  subCut: number;
  perStrip: number;
  strips: number;
}

export interface StripPlanRow {
  stripWidth: number;
  pieces: StripPlanPiece[];
  strips: number;
  /** strips × WOF: total length of strip */
  stripLength: number;
  /** strips × strip width: length of fabric off the bolt */
  fabricLength: number;
  yards: number;
}

export interface StripPlan {
  wof: number;
  rows: StripPlanRow[];
  totals: { strips: number; stripLength: number; fabricLength: number; yards: number };
}

function orient(
  p: ExactPiece,
  wof: Fraction,
  mode: 'height' | 'fewest-strips',
): { stripWidth: Fraction; subCut: Fraction; perStrip: number; strips: number } {
  const option = (stripWidth: Fraction, subCut: Fraction) => {
    const perStrip = wof.div(subCut).floor().valueOf();
    return { stripWidth, subCut, perStrip, strips: perStrip > 0 ? Math.ceil(p.count / perStrip) : Infinity };
  };
  const a = option(p.height, p.width);
  const b = option(p.width, p.height);
  const choice = mode === 'fewest-strips' && b.stripWidth.mul(b.strips).lt(a.stripWidth.mul(a.strips)) ? b : a;
  if (choice.perStrip === 0) {
    throw new QuiltInputError(
      'pieces',
      `A ${choice.subCut.valueOf()}″ sub-cut does not fit across a ${wof.valueOf()}″ width of fabric.`,
    );
  }
  return choice;
}

/**
 * Cutting plan for pieces from strips cut across the WOF. Pieces are grouped by strip width;
 * each piece type needs ⌈count ⁄ ⌊WOF ⁄ sub-cut⌋⌉ strips (leftovers are not shared between
 * types). Yardage is rounded up to the next ⅛ yd; the total adds the straightening cut once.
 */
export function stripPlan(pieces: Piece[], opts: StripPlanOptions = {}): StripPlan {
  const wof = lengthArg('wof', opts.wof ?? DEFAULT_USABLE_WOF);
  const straighten = lengthArg('straighteningCut', opts.straighteningCut ?? 0, { zero: true });
  const mode = opts.orientation ?? 'height';
  if (mode !== 'height' && mode !== 'fewest-strips')
    throw new QuiltInputError('orientation', 'Orientation must be "height" or "fewest-strips".');
  const groups = new Map<string, { stripWidth: Fraction; pieces: StripPlanPiece[]; strips: number }>();
  for (const p of piecesArg(pieces)) {
    if (p.count === 0) continue;
    const o = orient(p, wof, mode);
    const key = o.stripWidth.toFraction();
    const g = groups.get(key) ?? { stripWidth: o.stripWidth, pieces: [], strips: 0 };
    g.pieces.push({
      width: p.width.valueOf(),
      height: p.height.valueOf(),
      count: p.count,
      subCut: o.subCut.valueOf(),
      perStrip: o.perStrip,
      strips: o.strips,
    });
    g.strips += o.strips;
    groups.set(key, g);
  }
  let fabric = q(0);
  let strips = 0;
  const rows = [...groups.values()]
    .sort((a, b) => b.stripWidth.compare(a.stripWidth))
    .map((g) => {
      const fabricLength = g.stripWidth.mul(g.strips);
      fabric = fabric.add(fabricLength);
      strips += g.strips;
      return {
        stripWidth: g.stripWidth.valueOf(),
        pieces: g.pieces,
        strips: g.strips,
        stripLength: wof.mul(g.strips).valueOf(),
        fabricLength: fabricLength.valueOf(),
        yards: fabricYardsExact(fabricLength).valueOf(),
      };
    });
  return {
    wof: wof.valueOf(),
    rows,
    totals: {
      strips,
      stripLength: wof.mul(strips).valueOf(),
      fabricLength: fabric.valueOf(),
      yards: fabricYardsExact(fabric, straighten).valueOf(),
    },
  };
}

/** Pieces of w × h that fit in a rectangle, either way round (plain grid cutting). */
export function piecesPerRectangle(piece: { width: number; height: number }, rect: { width: number; height: number }): number {
  const w = lengthArg('width', piece?.width);
  const h = lengthArg('height', piece?.height);
  const W = lengthArg('width', rect?.width);
  const H = lengthArg('height', rect?.height);
  const fit = (a: Fraction, b: Fraction) => W.div(a).floor().valueOf() * H.div(b).floor().valueOf();
  return Math.max(fit(w, h), fit(h, w));
}

/** Pieces one fat quarter yields; the fat quarter size is a parameter (18 × 21 by default). */
export function fatQuarterYield(
  piece: { width: number; height: number },
  size: { width: number; height: number } = FAT_QUARTER_18X21,
): number {
  return piecesPerRectangle(piece, size);
}

export interface PrecutPlanRow extends Piece {
  perSquare: number;
  squares: number;
}

/**
 * What 10-inch precut squares can yield instead: each square is cut into as many pieces of one
 * size as fit; pieces bigger than the square are listed in `tooBig`.
 */
export function precutSquaresNeeded(
  pieces: Piece[],
  opts: { size?: number } = {},
): { size: number; rows: PrecutPlanRow[]; squares: number; tooBig: Piece[] } {
  const side = lengthArg('size', opts.size ?? 10).valueOf();
  const square = { width: side, height: side };
  const rows: PrecutPlanRow[] = [];
  const tooBig: Piece[] = [];
  for (const p of piecesArg(pieces)) {
    const plain = { width: p.width.valueOf(), height: p.height.valueOf(), count: p.count };
    const perSquare = piecesPerRectangle(plain, square);
    if (perSquare === 0) tooBig.push(plain);
    else rows.push({ ...plain, perSquare, squares: Math.ceil(p.count / perSquare) });
  }
  return { size: side, rows, squares: rows.reduce((s, r) => s + r.squares, 0), tooBig };
}

/** Fat quarters needed for pieces, one piece size per fat quarter. */
export function fatQuartersNeeded(pieces: Piece[], size: { width: number; height: number } = FAT_QUARTER_18X21): number {
  return piecesArg(pieces).reduce((total, p) => {
    const per = fatQuarterYield({ width: p.width.valueOf(), height: p.height.valueOf() }, size);
    if (per === 0)
      throw new QuiltInputError(
        'pieces',
        `A ${p.width.valueOf()}″ × ${p.height.valueOf()}″ piece does not fit in a fat quarter.`,
      );
    return total + Math.ceil(p.count / per);
  }, 0);
}
