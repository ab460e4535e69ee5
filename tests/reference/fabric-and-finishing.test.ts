/**
 * Fabric, binding, backing, bed sizes and squareness worked by hand and checked against the published
 * source named beside each check. Trade facts without a source are marked "common practice, no source".
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  CRIB_INTERIOR_CPSC,
  FAT_EIGHTH_9X21,
  FAT_QUARTER_18X21,
  FAT_QUARTER_18X22,
  MATTRESS_SIZES,
  diagonalOf,
  parseLength,
  quiltPlan,
  roundUpToEighthYard,
  squaresPerYard,
  stripsPerYard,
  yardsToInches,
} from '@shared/quilt';

describe('yards and strips', () => {
  it('1 yd = 36″ and ⅛ yd = 4½″', () => {
    expect(yardsToInches(1)).toBe(36);
    expect(yardsToInches(0.125)).toBe(4.5);
    expect(parseLength('0.125 yd')).toBe(4.5);
  });

  it('strips of width w per yard = ⌊36 ⁄ w⌋: 2½″ gives 14', () => {
    expect(stripsPerYard(2.5)).toBe(14);
    fc.assert(
      fc.property(
        fc.integer({ min: 4, max: 96 }).map((k) => k / 8),
        (w) => stripsPerYard(w) === Math.floor(36 / w),
      ),
    );
  });

  it('charts that allow a straightening cut say 13 strips of 2½″: the cut is a parameter', () => {
    expect(stripsPerYard(2.5, { straighteningCut: 2 })).toBe(13);
    fc.assert(
      fc.property(
        fc.integer({ min: 4, max: 96 }).map((k) => k / 8),
        fc.integer({ min: 0, max: 16 }).map((k) => k / 8),
        (w, cut) => {
          expect(stripsPerYard(w, { straighteningCut: cut })).toBe(Math.floor((36 - cut) / w));
        },
      ),
    );
  });

  it('squares of side s per yard = ⌊36 ⁄ s⌋ × ⌊WOF ⁄ s⌋', () => {
    expect(squaresPerYard(5, { wof: 42 })).toBe(7 * 8);
    expect(squaresPerYard(5, { wof: 40 })).toBe(7 * 8);
    expect(squaresPerYard(2.5, { wof: 40 })).toBe(14 * 16);
  });

  it('yardage is rounded up to the next ⅛ yd (common practice, no source)', () => {
    expect(roundUpToEighthYard(17 / 36)).toBe(0.5);
    expect(roundUpToEighthYard(4.5 / 36)).toBe(0.125);
    expect(roundUpToEighthYard(4.6 / 36)).toBe(0.25);
  });

  it('fat quarter ≈ 18″ × 21–22″ and fat eighth ≈ 9″ × 21″ (sources differ, so both are offered)', () => {
    expect(FAT_QUARTER_18X21).toEqual({ width: 18, height: 21 });
    expect(FAT_QUARTER_18X22).toEqual({ width: 18, height: 22 });
    expect(FAT_EIGHTH_9X21).toEqual({ width: 9, height: 21 });
  });
});

describe('binding (binding how-to handouts of quilt guilds and shops)', () => {
  it('length = perimeter + 12″; strips of 2½″ across the WOF, each diagonal join using one strip width', () => {
    // 60″ × 80″ top: perimeter 280″, length 292″. ⌈292 ⁄ 42⌉ = 7 strips would reach only
    // 7 × 42 − 6 × 2½ = 279″ once joined on the diagonal, so 8 strips (318½″) are needed.
    const { binding } = quiltPlan({ blockFinished: { width: 10, height: 10 }, blocks: 48, columns: 6 });
    expect(binding).toMatchObject({ perimeter: 280, length: 292, stripWidth: 2.5, strips: 8, joinLoss: 2.5 });
    expect(Math.ceil(292 / 42)).toBe(7);
    expect(binding.yards).toBe(0.625); // 8 × 2½″ = 20″ → 0.56 yd → ⅝ yd
  });

  it('never needs fewer strips than ⌈length ⁄ WOF⌉ and at most one more for quilts up to king size', () => {
    fc.assert(
      fc.property(fc.integer({ min: 4, max: 12 }), fc.integer({ min: 4, max: 12 }), (c, r) => {
        const { binding } = quiltPlan({
          blockFinished: { width: 9, height: 9 },
          blocks: c * r,
          columns: c,
          bindingWidth: 2.25,
          bindingAllowance: 10,
        });
        const rule = Math.ceil(binding.length / 42);
        expect(binding.strips).toBeGreaterThanOrEqual(rule);
        expect(binding.strips).toBeLessThanOrEqual(rule + 1);
      }),
    );
  });
});

describe('backing (common practice, no source: 4″ each side for home quilting, seams whichever way uses less)', () => {
  it('worked by hand for a 60″ × 80″ top', () => {
    // Needs 68″ × 88″. Vertical seams: 2 widths (42 + 42 − 1 = 83″ ≥ 68″) × 88″ = 176″ → 4.89 → 5 yd.
    // Horizontal seams: 3 widths (126 − 2 = 124″ ≥ 88″) × 68″ = 204″ → 5.67 → 5¾ yd. Vertical wins.
    const { backing } = quiltPlan({ blockFinished: { width: 10, height: 10 }, blocks: 48, columns: 6 });
    expect(backing).toMatchObject({
      width: 68,
      height: 88,
      direction: 'vertical',
      seams: 'vertical',
      panels: 2,
      piecedWidth: 83,
      fabricLength: 176,
      yards: 5,
    });
    expect(backing.alternative).toMatchObject({
      seams: 'horizontal',
      panels: 3,
      piecedWidth: 124,
      fabricLength: 204,
      yards: 5.75,
    });
  });

  it('checks that the joined widths really cover: a seam loses its allowance on both widths', () => {
    // 76″ wide backing from 38″ usable widths: 2 × 38 − 1 = 75″ is short, so 3 widths are needed.
    const { backing } = quiltPlan({ blockFinished: { width: 68, height: 30 }, blocks: 1, backingWof: 38 });
    expect(backing.width).toBe(76);
    expect(backing.alternative.direction === 'vertical' ? backing.alternative.panels : backing.panels).toBe(3);
    // With a ¼″ joining seam each join loses ½″: 2 × 38 − ½ = 75½″, still short.
    const quarter = quiltPlan({ blockFinished: { width: 68, height: 30 }, blocks: 1, backingWof: 38, backingSeam: 0.25 }).backing;
    expect([quarter, quarter.alternative].find((b) => b.direction === 'vertical')?.panels).toBe(3);
  });

  it('6–8″ each side for longarm machines is a parameter', () => {
    expect(
      quiltPlan({ blockFinished: { width: 10, height: 10 }, blocks: 48, columns: 6, backingOverage: 8 }).backing,
    ).toMatchObject({ width: 76, height: 96 });
  });
});

describe('mattress sizes (a mattress industry council size chart; CPSC 16 CFR 1241)', () => {
  it('lists the chart sizes in inches', () => {
    expect(MATTRESS_SIZES).toEqual({
      crib: { width: 27, length: 52 },
      twin: { width: 38, length: 75 },
      full: { width: 54, length: 75 },
      queen: { width: 60, length: 80 },
      king: { width: 76, length: 80 },
      'california-king': { width: 72, length: 84 },
    });
  });

  it('keeps the CPSC full-size crib interior 28 ± ⅝ × 52⅜ ± ⅝', () => {
    expect(CRIB_INTERIOR_CPSC).toEqual({ width: 28, length: 52.375, tolerance: 0.625 });
  });
});

describe('squareness (swap practice: common practice, no source)', () => {
  it('diagonal of a 12½″ square = 17.678″ and of a 6½″ square = 9.192″', () => {
    expect(diagonalOf(12.5, 12.5)).toBeCloseTo(17.678, 3);
    expect(diagonalOf(6.5, 6.5)).toBeCloseTo(9.192, 3);
  });
});
