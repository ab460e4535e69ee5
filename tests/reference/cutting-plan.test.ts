/**
 * Cutting plans worked by hand with the usual rules (common practice, no source): usable WOF 42″, sub-cuts per strip
 * ⌊42 ⁄ sub-cut⌋, strips ⌈count ⁄ per strip⌉, yardage rounded up to ⅛ yd (common practice, no
 * source). The working is written beside each check.
 */
import { describe, expect, it } from 'vitest';
import { gridRecipe, precutSquaresNeeded, stripPlan } from '@shared/quilt';

describe('a cutting plan worked by hand', () => {
  it('mixed pieces from one fabric', () => {
    // Pieces: 20 of 4½″ × 2½″, 30 of 2½″ × 2½″, 6 of 4½″ × 4½″; strips as wide as the height.
    // 2½″ strips: 4½″ sub-cuts, ⌊42 ⁄ 4½⌋ = 9 a strip → ⌈20 ⁄ 9⌉ = 3 strips;
    //             2½″ sub-cuts, ⌊42 ⁄ 2½⌋ = 16 a strip → ⌈30 ⁄ 16⌉ = 2 strips; 5 strips = 12½″ of fabric.
    // 4½″ strips: 4½″ sub-cuts, 9 a strip → ⌈6 ⁄ 9⌉ = 1 strip = 4½″ of fabric.
    // Total 17″ = 0.47 yd → ½ yd; with a 1″ straightening cut 18″ = ½ yd exactly.
    const plan = stripPlan(
      [
        { width: 4.5, height: 2.5, count: 20 },
        { width: 2.5, height: 2.5, count: 30 },
        { width: 4.5, height: 4.5, count: 6 },
      ],
      { straighteningCut: 1 },
    );
    expect(plan.rows).toEqual([
      {
        stripWidth: 4.5,
        pieces: [{ width: 4.5, height: 4.5, count: 6, subCut: 4.5, perStrip: 9, strips: 1 }],
        strips: 1,
        stripLength: 42,
        fabricLength: 4.5,
        yards: 0.125,
      },
      {
        stripWidth: 2.5,
        pieces: [
          { width: 4.5, height: 2.5, count: 20, subCut: 4.5, perStrip: 9, strips: 3 },
          { width: 2.5, height: 2.5, count: 30, subCut: 2.5, perStrip: 16, strips: 2 },
        ],
        strips: 5,
        stripLength: 210,
        fabricLength: 12.5,
        yards: 0.375,
      },
    ]);
    expect(plan.totals).toEqual({ strips: 6, stripLength: 252, fabricLength: 17, yards: 0.5 });
  });

  it('a nine-patch swap of 12 blocks from 2½″ squares, with a 40″ usable width', () => {
    // Dark: 5 a block × 12 = 60; ⌊40 ⁄ 2½⌋ = 16 a strip → ⌈60 ⁄ 16⌉ = 4 strips = 10″ → 0.28 → ⅜ yd.
    // Light: 4 a block × 12 = 48 → 3 strips = 7½″ → 0.21 → ¼ yd.
    const dark = stripPlan([{ width: 2.5, height: 2.5, count: 60 }], { wof: 40 });
    const light = stripPlan([{ width: 2.5, height: 2.5, count: 48 }], { wof: 40 });
    expect(dark.totals).toEqual({ strips: 4, stripLength: 160, fabricLength: 10, yards: 0.375 });
    expect(light.totals).toEqual({ strips: 3, stripLength: 120, fabricLength: 7.5, yards: 0.25 });
  });

  it('the 4-3-2-1 strip-set block, 42 of them', () => {
    // Each block uses 4 + 3 + 2 + 1 = 10″ of strip set; 42 blocks need 420″ = exactly 10 strip
    // sets of 42″. Each set takes one strip of each width, so 10 strips of each:
    // 4″: 40″ → 1.11 → 1⅛ yd; 3″: 30″ → 0.83 → ⅞ yd; 2″: 20″ → 0.56 → ⅝ yd; 1″: 10″ → 0.28 → ⅜ yd.
    const recipe = gridRecipe({ columns: [4, 3, 2, 1], rows: [4, 3, 2, 1] }, { blocks: 42 });
    expect(recipe.stripSets[0]?.stripSets).toBe(10);
    expect(recipe.stripsToCut).toEqual([
      { width: 4, count: 10, yards: 1.125 },
      { width: 3, count: 10, yards: 0.875 },
      { width: 2, count: 10, yards: 0.625 },
      { width: 1, count: 10, yards: 0.375 },
    ]);
  });

  it('the same nine-patch from 10-inch precut squares', () => {
    // A 10″ square takes ⌊10 ⁄ 2½⌋² = 16 squares of 2½″: dark ⌈60 ⁄ 16⌉ = 4, light ⌈48 ⁄ 16⌉ = 3.
    const plan = precutSquaresNeeded([
      { width: 2.5, height: 2.5, count: 60 },
      { width: 2.5, height: 2.5, count: 48 },
    ]);
    expect(plan.rows.map((r) => [r.perSquare, r.squares])).toEqual([
      [16, 4],
      [16, 3],
    ]);
    expect(plan.squares).toBe(7);
  });
});
