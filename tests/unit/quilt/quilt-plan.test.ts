import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { MATTRESS_SIZES, layoutForTarget, quiltPlan, quiltSizeForBed } from '@shared/quilt';

const square8 = { width: 8, height: 8 };

describe('layout', () => {
  it('chooses the layout closest to square, then fewest empty cells, then portrait', () => {
    expect(quiltPlan({ blockFinished: square8, blocks: 42 }).layout).toEqual({ columns: 6, rows: 7, cells: 42, emptyCells: 0 });
    expect(quiltPlan({ blockFinished: square8, blocks: 43 }).layout).toEqual({ columns: 7, rows: 7, cells: 49, emptyCells: 6 });
    expect(quiltPlan({ blockFinished: square8, blocks: 1 }).layout).toEqual({ columns: 1, rows: 1, cells: 1, emptyCells: 0 });
    // Blocks twice as tall as wide: 8 blocks sit best as 4 across, 2 down (32″ × 32″).
    expect(quiltPlan({ blockFinished: { width: 4, height: 8 }, blocks: 8 }).layout).toMatchObject({ columns: 4, rows: 2 });
  });

  it('holds every block, with no whole empty row, for any count', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 300 }), (blocks) => {
        const { layout } = quiltPlan({ blockFinished: square8, blocks });
        expect(layout.cells).toBeGreaterThanOrEqual(blocks);
        expect((layout.rows - 1) * layout.columns).toBeLessThan(blocks);
        expect(layout.emptyCells).toBe(layout.cells - blocks);
      }),
    );
  });

  it('uses the columns it is given', () => {
    expect(quiltPlan({ blockFinished: square8, blocks: 42, columns: 5 }).layout).toEqual({
      columns: 5,
      rows: 9,
      cells: 45,
      emptyCells: 3,
    });
  });

  it('finds the blocks for a target size', () => {
    expect(layoutForTarget({ target: { width: 60, height: 80 }, blockFinished: { width: 10, height: 10 } })).toEqual({
      columns: 6,
      rows: 8,
      blocks: 48,
    });
    expect(
      layoutForTarget({ target: { width: 60, height: 80 }, blockFinished: { width: 12, height: 12 }, sashing: 2, borders: [4] }),
    ).toEqual({ columns: 4, rows: 5, blocks: 20 });
  });
});

describe('top, sashing and borders', () => {
  it('puts sashing between the blocks and round the outside, then adds each border twice', () => {
    const plan = quiltPlan({ blockFinished: { width: 12, height: 12 }, blocks: 12, columns: 3, sashing: 2, borders: [1.5, 4] });
    expect(plan.centre).toEqual({ width: 3 * 12 + 4 * 2, height: 4 * 12 + 5 * 2 });
    expect(plan.top).toEqual({ width: 44 + 11, height: 58 + 11 });
    expect(plan.sashing).toEqual({
      width: 2,
      strips: [
        { count: 16, cut: { width: 2.5, height: 12.5 } },
        { count: 15, cut: { width: 12.5, height: 2.5 } },
      ],
      cornerstones: { count: 20, cut: { width: 2.5, height: 2.5 } },
    });
    expect(plan.borders[0]).toEqual({
      finished: 1.5,
      sides: { count: 2, cut: { width: 2, height: 58.5 } },
      topAndBottom: { count: 2, cut: { width: 47.5, height: 2 } },
    });
    expect(plan.borders[1]?.sides.cut).toEqual({ width: 4.5, height: 61.5 });
  });
});

describe('binding', () => {
  it('uses the fewest strips whose diagonal joins still reach the length', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 4, max: 24 }),
        fc.integer({ min: 1, max: 60 }),
        fc.constantFrom(2.25, 2.5),
        (blockSide, blocks, width) => {
          const { binding } = quiltPlan({ blockFinished: { width: blockSide, height: blockSide }, blocks, bindingWidth: width });
          const reach = (n: number) => n * 42 - (n - 1) * width;
          expect(reach(binding.strips)).toBeGreaterThanOrEqual(binding.length);
          if (binding.strips > 1) expect(reach(binding.strips - 1)).toBeLessThan(binding.length);
          expect(binding.yards * 36).toBeGreaterThanOrEqual(binding.strips * width);
        },
      ),
    );
  });
});

describe('backing', () => {
  it('needs no seam when one width covers', () => {
    const plan = quiltPlan({ blockFinished: { width: 10, height: 10 }, blocks: 9 });
    expect(plan.backing).toMatchObject({
      width: 38,
      height: 38,
      direction: 'vertical',
      seams: 'none',
      panels: 1,
      fabricLength: 38,
      yards: 1.125,
    });
  });

  it('picks the seam direction that uses less fabric and covers the width', () => {
    fc.assert(
      fc.property(fc.integer({ min: 20, max: 120 }), fc.integer({ min: 20, max: 120 }), (w, h) => {
        const { backing } = quiltPlan({ blockFinished: { width: w, height: h }, blocks: 1 });
        const vertical = backing.direction === 'vertical';
        expect(backing.piecedWidth).toBeGreaterThanOrEqual(vertical ? backing.width : backing.height);
        expect(backing.panelLength).toBe(vertical ? backing.height : backing.width);
        expect(backing.fabricLength).toBeLessThanOrEqual(backing.alternative.fabricLength);
        expect(backing.alternative.direction).not.toBe(backing.direction);
        // One panel fewer would not cover (each join takes 2 × ½″).
        const across = vertical ? backing.width : backing.height;
        if (backing.panels > 1) expect((backing.panels - 1) * 42 - (backing.panels - 2) * 1).toBeLessThan(across);
        expect(backing.yards * 36).toBeGreaterThanOrEqual(backing.fabricLength);
      }),
    );
  });
});

describe('batting and bed sizes', () => {
  it('adds the overage all round', () => {
    expect(quiltPlan({ blockFinished: square8, blocks: 42, backingOverage: 6 }).batting).toEqual({ width: 60, height: 68 });
    expect(quiltPlan({ blockFinished: square8, blocks: 42, battingOverage: 3 }).batting).toEqual({ width: 54, height: 62 });
  });

  it('sizes a quilt for a bed from its mattress, drop and tuck', () => {
    expect(quiltSizeForBed('queen', { drop: 12, pillowTuck: 10 })).toEqual({ width: 84, height: 102 });
    expect(quiltSizeForBed('twin')).toEqual({ width: MATTRESS_SIZES.twin.width, height: MATTRESS_SIZES.twin.length });
    expect(() => quiltSizeForBed('bunk' as never)).toThrow(/Unknown mattress/);
  });
});

describe('bad input', () => {
  it('explains it', () => {
    expect(() => quiltPlan({ blockFinished: square8, blocks: 0 })).toThrow(/Blocks must be a whole number of at least 1/);
    expect(() => quiltPlan({ blockFinished: { width: -8, height: 8 }, blocks: 4 })).toThrow(
      /Block finished width cannot be negative/,
    );
    expect(() => quiltPlan({ blockFinished: square8, blocks: 4, borders: [2, Number.NaN] })).toThrow(
      /Borders 2 must be a number/,
    );
    expect(() => quiltPlan({ blockFinished: square8, blocks: 4, bindingWidth: 50 })).toThrow(/narrower than the width of fabric/);
  });
});
