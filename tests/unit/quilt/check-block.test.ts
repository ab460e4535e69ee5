import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { QuiltInputError, VERDICTS, VERDICT_LABELS, checkBlock, diagonalOf } from '@shared/quilt';

const target = { width: 8.5, height: 8.5 };
const check = (width: number, height: number, diagonals?: [number, number], tolerance = 0.125) =>
  checkBlock({ target, tolerance, measured: diagonals ? { width, height, diagonals } : { width, height } });

describe('checkBlock', () => {
  it('treats the tolerance boundary as within', () => {
    expect(check(8.375, 8.5).verdict).toBe('true');
    expect(check(8.625, 8.625).verdict).toBe('true');
    expect(check(8.375 - 1 / 64, 8.5).verdict).toBe('short');
    expect(check(8.5, 8.625 + 1 / 64).verdict).toBe('trim');
  });

  it('compares decimal input exactly (8.4 is inside ±0.1 of 8.5)', () => {
    expect(checkBlock({ target, tolerance: 0.1, measured: { width: 8.4, height: 8.6 } }).verdict).toBe('true');
    expect(checkBlock({ target, tolerance: 0.1, measured: { width: 8.39, height: 8.5 } }).verdict).toBe('short');
  });

  it('calls a block short even when the other side is over', () => {
    expect(check(8.25, 9).verdict).toBe('short');
  });

  it('calls a block skewed when the diagonals differ by more than the squareness limit', () => {
    expect(check(8.5, 8.5, [12, 12.25]).verdict).toBe('true');
    expect(check(8.5, 8.5, [12, 12.3]).verdict).toBe('skewed');
    expect(check(8.75, 8.75, [12, 12.3]).verdict).toBe('skewed');
    expect(check(8.25, 8.5, [12, 12.3]).verdict).toBe('short');
    expect(
      checkBlock({ target, tolerance: 0.125, squareness: 0.5, measured: { width: 8.5, height: 8.5, diagonals: [12, 12.3] } })
        .verdict,
    ).toBe('true');
  });

  it('reports deviations as measured − target and d1 − d2', () => {
    expect(check(8.375, 8.75, [12.1, 12]).deviations).toEqual({ width: -0.125, height: 0.25, diagonal: 0.1 });
    expect(check(8.5, 8.5).deviations).toEqual({ width: 0, height: 0 });
  });

  it('follows the rules in order for any block on a 1/64″ grid', () => {
    const len = fc.integer({ min: 7 * 64, max: 10 * 64 }).map((k) => k / 64);
    fc.assert(
      fc.property(
        len,
        len,
        fc.option(fc.tuple(len, len)),
        fc.integer({ min: 0, max: 32 }).map((k) => k / 64),
        (w, h, d, tol) => {
          const { verdict } = checkBlock({
            target,
            tolerance: tol,
            measured: d ? { width: w, height: h, diagonals: d } : { width: w, height: h },
          });
          const short = w < 8.5 - tol || h < 8.5 - tol;
          const skewed = d !== null && Math.abs(d[0] - d[1]) > 0.25;
          const over = w > 8.5 + tol || h > 8.5 + tol;
          expect(verdict).toBe(short ? 'short' : skewed ? 'skewed' : over ? 'trim' : 'true');
        },
      ),
    );
  });

  it('explains bad measurements', () => {
    expect(() => check(-8, 8)).toThrow(/Measured width cannot be negative/);
    expect(() => check(Number.NaN, 8)).toThrow(QuiltInputError);
    expect(() => checkBlock({ target, tolerance: -1, measured: { width: 8, height: 8 } })).toThrow(
      /Tolerance cannot be negative/,
    );
    expect(() => checkBlock({ target, tolerance: 0.1, measured: { width: 8, height: 8, diagonals: [1] as never } })).toThrow(
      /both diagonals/,
    );
  });
});

describe('verdict labels', () => {
  it('has words and a glyph for every verdict', () => {
    expect(VERDICTS.map((v) => `${VERDICT_LABELS[v].glyph} ${VERDICT_LABELS[v].label}`)).toEqual([
      '✓ True to size',
      '✂ Trim to size',
      '↓ Runs short',
      '◇ Out of square',
    ]);
  });

  it('knows the diagonal of a true block', () => {
    expect(diagonalOf(3, 4)).toBe(5);
  });
});
