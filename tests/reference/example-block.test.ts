/**
 * The strip-set block every quilter can check with a ruler (common practice, no source):
 * strips cut 4″, 3″, 2″ and 1″ sewn with ¼″ seams, cross-cut at the same widths and re-sewn as a
 * 4 × 4 grid.
 */
import { describe, expect, it } from 'vitest';
import { gridBlock, gridStripSets, quiltPlan, stripSetWidth } from '@shared/quilt';

const cuts = [4, 3, 2, 1];

describe('the 4-3-2-1 strip-set block', () => {
  it('the strip set is 8½″ wide: 10″ of strips less 3 seams × ½″', () => {
    expect(stripSetWidth(cuts)).toBe(8.5);
  });

  it('re-sewn as a 4 × 4 grid it is 8½″ unfinished and 8″ finished', () => {
    const block = gridBlock({ columns: cuts, rows: cuts });
    expect(block.unfinished).toEqual({ width: 8.5, height: 8.5 });
    expect(block.finished).toEqual({ width: 8, height: 8 });
  });

  it('its 1″ corner patch shows ¾″ × ¾″ in the unfinished block (the outer ¼″ stays as seam allowance)', () => {
    const corner = gridBlock({ columns: cuts, rows: cuts }).patches.find((p) => p.row === 3 && p.col === 3);
    expect(corner).toMatchObject({
      cut: { width: 1, height: 1 },
      finished: { width: 0.5, height: 0.5 },
      visibleInUnfinished: { width: 0.75, height: 0.75 },
    });
  });

  it('one strip set serves every row: sub-cut at 4″, 3″, 2″ and 1″', () => {
    const [set] = gridStripSets({ columns: cuts, rows: cuts });
    expect(set?.sewnWidth).toBe(8.5);
    expect(set?.subCuts.map((s) => s.height)).toEqual([4, 3, 2, 1]);
    expect(set?.lengthPerBlock).toBe(10);
  });

  it('42 blocks in a 6 × 7 layout make a 48″ × 56″ top', () => {
    const plan = quiltPlan({ blockFinished: gridBlock({ columns: cuts, rows: cuts }).finished, blocks: 42, columns: 6 });
    expect(plan.layout).toEqual({ columns: 6, rows: 7, cells: 42, emptyCells: 0 });
    expect(plan.top).toEqual({ width: 48, height: 56 });
    // Without a column count the layout closest to square is the same one.
    expect(quiltPlan({ blockFinished: { width: 8, height: 8 }, blocks: 42 }).top).toEqual({ width: 48, height: 56 });
  });
});
