/**
 * Tolerance verdict for a measured block. All comparisons are exact rationals, so a block at
 * exactly target − tolerance (8⅜″ against 8½″ ± ⅛″) is within tolerance.
 */
import type { Verdict } from '../vocabulary';
import { type Fraction, QuiltInputError, lengthArg } from './rational';

// The verdict's words, glyph and colour live with the rest of the shown vocabulary.
export { VERDICTS, VERDICT_LABELS, type Verdict } from '../vocabulary';

export const DEFAULT_SQUARENESS = 0.25;

export interface CheckBlockInput {
  target: { width: number; height: number };
  /** allowed difference either way on each side (inches) */
  tolerance: number;
  /** largest allowed difference between the two diagonals (default ¼″) */
  squareness?: number;
  measured: { width: number; height: number; diagonals?: [number, number] };
}

export interface CheckBlockResult {
  verdict: Verdict;
  /** measured − target; diagonal is d1 − d2 */
  deviations: { width: number; height: number; diagonal?: number };
}

function verdictOf(
  target: [Fraction, Fraction],
  measured: [Fraction, Fraction],
  tol: Fraction,
  diagonalGap: Fraction | undefined,
  squareness: Fraction,
): Verdict {
  const [tw, th] = target;
  const [mw, mh] = measured;
  if (mw.lt(tw.sub(tol)) || mh.lt(th.sub(tol))) return 'short';
  if (diagonalGap !== undefined && diagonalGap.abs().gt(squareness)) return 'skewed';
  if (mw.gt(tw.add(tol)) || mh.gt(th.add(tol))) return 'trim';
  return 'true';
}

/**
 * Verdict for a measured block against its unfinished target. In order: `short` if either side is
 * under target − tolerance (even when the other is over); `skewed` if the diagonals differ by more
 * than the squareness limit; `trim` if either side is over target + tolerance; else `true`.
 */
export function checkBlock(opts: CheckBlockInput): CheckBlockResult {
  if (typeof opts !== 'object' || opts === null) throw new QuiltInputError('measured', 'Give the target and the measured size.');
  const tw = lengthArg('target.width', opts.target?.width);
  const th = lengthArg('target.height', opts.target?.height);
  const tol = lengthArg('tolerance', opts.tolerance, { zero: true });
  const squareness = lengthArg('squareness', opts.squareness ?? DEFAULT_SQUARENESS, { zero: true });
  const m = opts.measured;
  const mw = lengthArg('measured.width', m?.width);
  const mh = lengthArg('measured.height', m?.height);
  let gap: Fraction | undefined;
  if (m?.diagonals !== undefined) {
    if (!Array.isArray(m.diagonals) || m.diagonals.length !== 2) {
      throw new QuiltInputError('measured.diagonals', 'Give both diagonals, or neither.');
    }
    gap = lengthArg('measured.diagonals[0]', m.diagonals[0]).sub(lengthArg('measured.diagonals[1]', m.diagonals[1]));
  }
  const verdict = verdictOf([tw, th], [mw, mh], tol, gap, squareness);
  const deviations: CheckBlockResult['deviations'] = { width: mw.sub(tw).valueOf(), height: mh.sub(th).valueOf() };
  if (gap !== undefined) deviations.diagonal = gap.valueOf();
  return { verdict, deviations };
}

/** Diagonal of a true width × height rectangle: √(w² + h²), to compare measured diagonals with. */
export function diagonalOf(width: number, height: number): number {
  return Math.hypot(lengthArg('width', width).valueOf(), lengthArg('height', height).valueOf());
}
