/**
 * Patchwork unit formulas: half-square triangles (HST), quarter-square triangles (QST), flying
 * geese, square-in-a-square and on-point setting triangles. Inputs are finished sizes in inches;
 * results are cut sizes. Sizes that involve √2 are rounded UP to the next ⅛″, decided exactly.
 */
import { type Fraction, QuiltInputError, ceilSqrtTo, lengthArg, q } from './rational';

const EIGHTH = q(1, 8);
const SEVEN_EIGHTHS = q(7, 8);
const ONE_QUARTER_MORE = q(5, 4);

export type HstMethod = 'two-at-a-time' | 'trim' | 'four-at-a-time' | 'eight-at-a-time';
export const HST_METHODS: readonly HstMethod[] = ['two-at-a-time', 'trim', 'four-at-a-time', 'eight-at-a-time'];

/** HSTs made from one pair of squares (one square of each fabric). */
export const HST_YIELDS: Readonly<Record<HstMethod, number>> = {
  'two-at-a-time': 2,
  trim: 2,
  'four-at-a-time': 4,
  'eight-at-a-time': 8,
};

/** ⌈√(2·x²)⌉ to ⅛″: x·√2 rounded up. */
const timesRoot2Up = (x: Fraction): Fraction => ceilSqrtTo(x.mul(x).mul(2), EIGHTH);
/** ⌈√(x²/2)⌉ to ⅛″: x⁄√2 rounded up. */
const overRoot2Up = (x: Fraction): Fraction => ceilSqrtTo(x.mul(x).div(2), EIGHTH);

function methodArg(method: unknown): HstMethod {
  if (!HST_METHODS.includes(method as HstMethod)) {
    throw new QuiltInputError('method', `HST method must be one of ${HST_METHODS.join(', ')}.`);
  }
  return method as HstMethod;
}

/** Exact cut-square size for an HST method. */
export function hstCutExact(finished: Fraction, method: HstMethod): Fraction {
  switch (method) {
    case 'two-at-a-time':
      return finished.add(SEVEN_EIGHTHS);
    case 'trim':
      return finished.add(1);
    case 'four-at-a-time':
      // Sewn all round, cut on both diagonals: (finished + ⅞) × √2, rounded up to ⅛″.
      return timesRoot2Up(finished.add(SEVEN_EIGHTHS));
    case 'eight-at-a-time':
      return finished.mul(2).add(q(7, 4));
  }
}

/**
 * Side of the two squares to cut for HSTs of a finished size: two-at-a-time finished + ⅞″;
 * trim (cut oversize, trim to finished + ½″) finished + 1″; four-at-a-time (finished + ⅞″) × √2
 * rounded up to ⅛″; eight-at-a-time 2 × finished + 1¾″.
 */
export function hstCutSize(finished: number, method: HstMethod = 'two-at-a-time'): number {
  return hstCutExact(lengthArg('finished', finished), methodArg(method)).valueOf();
}

/** HSTs one pair of squares yields with the method. */
export function hstUnits(method: HstMethod = 'two-at-a-time'): number {
  return HST_YIELDS[methodArg(method)];
}

export interface UnitCut {
  /** side of each square to cut */
  square: number;
  /** squares to cut per batch (one of each fabric for HSTs) */
  squares: number;
  /** units one batch yields */
  yields: number;
  /** size to trim each unit to, where the method trims */
  trimTo?: number;
  /** true when the exact size was irrational and has been rounded up to ⅛″ */
  roundedUp: boolean;
}

/** Object form of hstCutSize with the yield and trim size. */
export function hstCut(finished: number, method: HstMethod = 'two-at-a-time'): UnitCut {
  const f = lengthArg('finished', finished);
  const m = methodArg(method);
  return {
    square: hstCutExact(f, m).valueOf(),
    squares: 2,
    yields: HST_YIELDS[m],
    ...(m === 'trim' || m === 'four-at-a-time' ? { trimTo: f.add(q(1, 2)).valueOf() } : {}),
    roundedUp: m === 'four-at-a-time',
  };
}

/** Side of the squares for quarter-square triangles: finished + 1¼″. */
export function qstCutSize(finished: number): number {
  return lengthArg('finished', finished).add(ONE_QUARTER_MORE).valueOf();
}

/** Object form of qstCutSize: two squares make two two-colour QSTs. */
export function qstCut(finished: number): UnitCut {
  return { square: qstCutSize(finished), squares: 2, yields: 2, roundedUp: false };
}

export type GeeseMethod = 'no-waste' | 'stitch-and-flip';

export interface GeesePiece {
  role: 'goose' | 'sky';
  shape: 'square' | 'rectangle';
  width: number;
  height: number;
  /** pieces to cut per batch */
  count: number;
  /** geese one batch makes */
  yields: number;
}

/**
 * Pieces for flying geese of a finished width × height (width must be twice the height).
 * No-waste makes four: one goose square width + 1¼″ and four sky squares height + ⅞″.
 * Stitch-and-flip makes one: a goose rectangle (width + ½″) × (height + ½″) and two sky squares
 * height + ½″.
 */
export function flyingGeeseCuts(finishedWidth: number, finishedHeight: number, method: GeeseMethod = 'no-waste'): GeesePiece[] {
  const w = lengthArg('finishedWidth', finishedWidth);
  const h = lengthArg('finishedHeight', finishedHeight);
  if (!w.equals(h.mul(2))) {
    throw new QuiltInputError(
      'finishedWidth',
      `Flying geese are twice as wide as they are tall: for ${finishedHeight}″ high make them ${h.mul(2).valueOf()}″ wide.`,
    );
  }
  const half = q(1, 2);
  if (method === 'no-waste') {
    const goose = w.add(ONE_QUARTER_MORE).valueOf();
    const sky = h.add(SEVEN_EIGHTHS).valueOf();
    return [
      { role: 'goose', shape: 'square', width: goose, height: goose, count: 1, yields: 4 },
      { role: 'sky', shape: 'square', width: sky, height: sky, count: 4, yields: 4 },
    ];
  }
  if (method === 'stitch-and-flip') {
    const sky = h.add(half).valueOf();
    return [
      { role: 'goose', shape: 'rectangle', width: w.add(half).valueOf(), height: sky, count: 1, yields: 1 },
      { role: 'sky', shape: 'square', width: sky, height: sky, count: 2, yields: 1 },
    ];
  }
  throw new QuiltInputError('method', 'Flying geese method must be "no-waste" or "stitch-and-flip".');
}

/** Scales per-batch pieces to make `units` units: whole batches, with any spare units. */
export function batchCuts<T extends { count: number; yields: number }>(
  pieces: T[],
  units: number,
): { batches: number; spare: number; pieces: T[] } {
  if (!Number.isInteger(units) || units < 1) throw new QuiltInputError('units', 'Make at least one unit.');
  const yields = pieces[0]?.yields ?? 1;
  const batches = Math.ceil(units / yields);
  return { batches, spare: batches * yields - units, pieces: pieces.map((p) => ({ ...p, count: p.count * batches })) };
}

export interface SquareInSquareCuts {
  /** centre square: S⁄√2 + ½″, rounded up to ⅛″ */
  centre: { square: number; count: 1 };
  /** two squares S⁄2 + ⅞″, each cut once diagonally into two corner triangles */
  corners: { square: number; count: 2; cut: 'once-diagonally'; triangles: 4 };
  roundedUp: true;
}

/** Cuts for a square-in-a-square unit of finished side S. */
export function squareInSquareCuts(finished: number): SquareInSquareCuts {
  const s = lengthArg('finished', finished);
  return {
    centre: { square: overRoot2Up(s).add(q(1, 2)).valueOf(), count: 1 },
    corners: { square: s.div(2).add(SEVEN_EIGHTHS).valueOf(), count: 2, cut: 'once-diagonally', triangles: 4 },
    roundedUp: true,
  };
}

export interface SettingTriangles {
  /** side setting triangles: squares B√2 + 1¼″ cut twice diagonally, four per square */
  side: { square: number; cut: 'twice-diagonally'; yields: 4 };
  /** corner triangles: squares B⁄√2 + ⅞″ cut once diagonally, two per square */
  corner: { square: number; cut: 'once-diagonally'; yields: 2 };
  roundedUp: true;
}

/** Setting triangles for blocks of finished side B set on point (both rounded up to ⅛″). */
export function settingTriangles(blockFinished: number): SettingTriangles {
  const b = lengthArg('blockFinished', blockFinished);
  return {
    side: { square: timesRoot2Up(b).add(ONE_QUARTER_MORE).valueOf(), cut: 'twice-diagonally', yields: 4 },
    corner: { square: overRoot2Up(b).add(SEVEN_EIGHTHS).valueOf(), cut: 'once-diagonally', yields: 2 },
    roundedUp: true,
  };
}
