import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  FAT_QUARTER_18X22,
  fatQuarterYield,
  fatQuartersNeeded,
  inchesToYards,
  precutSquaresNeeded,
  roundUpToEighthYard,
  squaresPerYard,
  stripPlan,
  stripsPerYard,
  yardsToInches,
} from '@shared/quilt';

const eighths = (lo: number, hi: number) => fc.integer({ min: lo * 8, max: hi * 8 }).map((k) => k / 8);

describe('yards', () => {
  it('converts and rounds up to the next ⅛ yd', () => {
    expect(yardsToInches(0.125)).toBe(4.5);
    expect(inchesToYards(45)).toBe(1.25);
    expect(roundUpToEighthYard(1.01)).toBe(1.125);
    expect(roundUpToEighthYard(1.125)).toBe(1.125);
    expect(roundUpToEighthYard(0)).toBe(0);
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 50_000 }).map((k) => k / 1000),
        (y) => {
          const r = roundUpToEighthYard(y);
          expect(r).toBeGreaterThanOrEqual(y);
          expect(r - y).toBeLessThan(0.125);
          expect(Number.isInteger(r * 8)).toBe(true);
        },
      ),
    );
  });

  it('counts strips and squares per yard, with an optional straightening cut', () => {
    expect(stripsPerYard(2.5)).toBe(14);
    expect(stripsPerYard(2.5, { straighteningCut: 1.5 })).toBe(13);
    expect(squaresPerYard(5)).toBe(7 * 8);
    expect(() => stripsPerYard(0)).toThrow(/more than zero/);
  });
});

describe('stripPlan', () => {
  it('obeys its counting rules for any pieces', () => {
    const piece = fc.record({ width: eighths(1, 20), height: eighths(1, 12), count: fc.integer({ min: 0, max: 200 }) });
    fc.assert(
      fc.property(fc.array(piece, { minLength: 1, maxLength: 6 }), fc.constantFrom(40, 41, 42), (pieces, wof) => {
        const plan = stripPlan(pieces, { wof });
        for (const row of plan.rows) {
          for (const p of row.pieces) {
            expect(p.perStrip).toBe(Math.floor(wof / p.subCut));
            expect(p.strips * p.perStrip).toBeGreaterThanOrEqual(p.count);
            expect((p.strips - 1) * p.perStrip).toBeLessThan(p.count);
            expect(p.height).toBe(row.stripWidth);
          }
          expect(row.fabricLength).toBeCloseTo(row.strips * row.stripWidth, 9);
          expect(row.yards * 36).toBeGreaterThanOrEqual(row.fabricLength);
        }
        const pieceCount = pieces.filter((p) => p.count > 0).length;
        expect(plan.rows.reduce((s, r) => s + r.pieces.length, 0)).toBe(pieceCount);
        expect(plan.totals.yards * 36).toBeGreaterThanOrEqual(plan.totals.fabricLength);
        expect(plan.totals.yards * 36 - plan.totals.fabricLength).toBeLessThan(4.5);
      }),
    );
  });

  it('can turn pieces to use fewer strips', () => {
    // 21 pieces 10″ × 2″: 2″ strips give ⌊42⁄10⌋ = 4 each → 6 strips, 12″ of fabric;
    // one 10″ strip gives ⌊42⁄2⌋ = 21 → 10″ of fabric.
    const wide = [{ width: 10, height: 2, count: 21 }];
    expect(stripPlan(wide).totals).toMatchObject({ strips: 6, fabricLength: 12 });
    const turned = stripPlan(wide, { orientation: 'fewest-strips' });
    expect(turned.rows[0]).toMatchObject({ stripWidth: 10, strips: 1, fabricLength: 10 });
    expect(turned.rows[0]?.pieces[0]).toMatchObject({ subCut: 2, perStrip: 21 });
  });

  it('explains what cannot be cut', () => {
    expect(() => stripPlan([])).toThrow(/at least one piece/);
    expect(() => stripPlan([{ width: 44, height: 2, count: 1 }])).toThrow(/does not fit across a 42″/);
    expect(() => stripPlan([{ width: 4, height: 2, count: 1.5 }])).toThrow(/whole number/);
    expect(() => stripPlan([{ width: 4, height: -2, count: 1 }])).toThrow(/negative/);
  });
});

describe('fat quarters and precut squares', () => {
  it('counts pieces per fat quarter either way round, for a chosen fat quarter size', () => {
    expect(fatQuarterYield({ width: 5, height: 5 })).toBe(3 * 4);
    expect(fatQuarterYield({ width: 5.5, height: 5.5 }, FAT_QUARTER_18X22)).toBe(3 * 4);
    expect(fatQuarterYield({ width: 2.5, height: 21 })).toBe(7);
    expect(fatQuartersNeeded([{ width: 5, height: 5, count: 30 }])).toBe(3);
    expect(() => fatQuartersNeeded([{ width: 19, height: 22, count: 1 }])).toThrow(/does not fit/);
  });

  it('says how many 10-inch precut squares the pieces need', () => {
    const plan = precutSquaresNeeded([
      { width: 5, height: 5, count: 10 },
      { width: 2.5, height: 4.5, count: 17 },
      { width: 12, height: 3, count: 2 },
    ]);
    expect(plan.rows).toEqual([
      { width: 5, height: 5, count: 10, perSquare: 4, squares: 3 },
      { width: 2.5, height: 4.5, count: 17, perSquare: 8, squares: 3 },
    ]);
    expect(plan.squares).toBe(6);
    expect(plan.tooBig).toEqual([{ width: 12, height: 3, count: 2 }]);
  });
});
