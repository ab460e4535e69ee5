import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  QuiltInputError,
  finishedSize,
  gridBlock,
  gridCutList,
  gridRecipe,
  gridStripSets,
  stripSetWidth,
  unfinishedSize,
} from '@shared/quilt';

/** Cut widths on a 1/16″ grid, wider than two ¼″ seams. */
const cutWidth = fc.integer({ min: 9, max: 16 * 12 }).map((k) => k / 16);

describe('seam allowance', () => {
  it('adds and removes two seam allowances', () => {
    expect(unfinishedSize(8)).toBe(8.5);
    expect(finishedSize(8.5)).toBe(8);
    expect(unfinishedSize(8, 0.375)).toBe(8.75);
    fc.assert(fc.property(cutWidth, (w) => finishedSize(unfinishedSize(w)) === w));
  });

  it('explains bad input', () => {
    expect(() => unfinishedSize(-2)).toThrow(/cannot be negative/);
    expect(() => unfinishedSize(Number.NaN)).toThrow(QuiltInputError);
    expect(() => unfinishedSize(8, 1.5)).toThrow(/too wide/);
    expect(() => finishedSize(0.5)).toThrow(/leaves nothing/);
  });
});

describe('stripSetWidth', () => {
  it('is the sum of the widths less two seam allowances per seam, for any widths', () => {
    fc.assert(
      fc.property(fc.array(cutWidth, { minLength: 1, maxLength: 20 }), (ws) => {
        const total = ws.reduce((s, w) => s + w, 0);
        expect(stripSetWidth(ws)).toBe(total - 0.5 * (ws.length - 1));
      }),
    );
  });

  it('grows by the new strip less two seam allowances when a strip is added', () => {
    fc.assert(
      fc.property(fc.array(cutWidth, { minLength: 1, maxLength: 10 }), cutWidth, (ws, w) => {
        expect(stripSetWidth([...ws, w]) - stripSetWidth(ws)).toBe(w - 0.5);
      }),
    );
  });

  it('does not depend on the order of the strips', () => {
    fc.assert(
      fc.property(fc.array(cutWidth, { minLength: 2, maxLength: 10 }), (ws) => {
        expect(stripSetWidth([...ws].reverse())).toBe(stripSetWidth(ws));
      }),
    );
  });

  it('rejects empty lists and strips that vanish into their seams', () => {
    expect(() => stripSetWidth([])).toThrow(/at least one/);
    expect(() => stripSetWidth([2, 0.5, 2])).toThrow(/disappears/);
    expect(() => stripSetWidth([2, -1])).toThrow(/negative/);
  });
});

describe('gridBlock', () => {
  it('gives every patch its cut, finished and visible size', () => {
    const block = gridBlock({ columns: [2.5, 4.5, 2.5], rows: [2.5, 4.5, 2.5] });
    expect(block.unfinished).toEqual({ width: 8.5, height: 8.5 });
    expect(block.finished).toEqual({ width: 8, height: 8 });
    expect(block.patches).toHaveLength(9);
    const centre = block.patches.find((p) => p.row === 1 && p.col === 1);
    expect(centre).toMatchObject({
      cut: { width: 4.5, height: 4.5 },
      finished: { width: 4, height: 4 },
      visibleInUnfinished: { width: 4, height: 4 },
    });
    const edge = block.patches.find((p) => p.row === 0 && p.col === 1);
    expect(edge?.visibleInUnfinished).toEqual({ width: 4, height: 2.25 });
  });

  it('visible parts tile the unfinished block and finished parts tile the finished block', () => {
    fc.assert(
      fc.property(
        fc.array(cutWidth, { minLength: 1, maxLength: 6 }),
        fc.array(cutWidth, { minLength: 1, maxLength: 6 }),
        (columns, rows) => {
          const block = gridBlock({ columns, rows });
          const firstRow = block.patches.filter((p) => p.row === 0);
          const firstCol = block.patches.filter((p) => p.col === 0);
          const sum = (xs: number[]) => xs.reduce((s, x) => s + x, 0);
          expect(sum(firstRow.map((p) => p.visibleInUnfinished.width))).toBeCloseTo(block.unfinished.width, 12);
          expect(sum(firstCol.map((p) => p.visibleInUnfinished.height))).toBeCloseTo(block.unfinished.height, 12);
          expect(sum(firstRow.map((p) => p.finished.width))).toBeCloseTo(block.finished.width, 12);
          expect(block.unfinished.width).toBe(stripSetWidth(columns));
        },
      ),
    );
  });

  it('checks the roles match the grid', () => {
    expect(() => gridBlock({ columns: [2, 2], rows: [2], roles: [['light']] })).toThrow(/every cell: 1 rows of 2/);
    expect(() => gridBlock({ columns: [], rows: [2] })).toThrow(/at least one/);
  });
});

describe('grid recipe', () => {
  const nine = {
    columns: [2.5, 2.5, 2.5],
    rows: [2.5, 2.5, 2.5],
    roles: [
      ['dark', 'light', 'dark'],
      ['light', 'dark', 'light'],
      ['dark', 'light', 'dark'],
    ],
  };

  it('groups rows with the same roles into one strip set', () => {
    const sets = gridStripSets(nine, { blocks: 1 });
    expect(sets).toHaveLength(2);
    expect(sets[0]).toMatchObject({
      strips: [
        { width: 2.5, role: 'dark' },
        { width: 2.5, role: 'light' },
        { width: 2.5, role: 'dark' },
      ],
      sewnWidth: 6.5,
    });
    expect(sets[0]?.subCuts).toEqual([{ height: 2.5, rows: [0, 2], perBlock: 2, total: 2 }]);
    expect(sets[1]?.subCuts).toEqual([{ height: 2.5, rows: [1], perBlock: 1, total: 1 }]);
  });

  it('packs the sub-cuts of many blocks into WOF-long strip sets', () => {
    // 20 blocks: 40 sub-cuts of 2½″ → 16 per 42″ strip set → 3 sets; 20 of the other → 2 sets.
    const recipe = gridRecipe(nine, { blocks: 20 });
    expect(recipe.stripSets.map((s) => s.stripSets)).toEqual([3, 2]);
    expect(recipe.stripsToCut).toEqual([
      { role: 'dark', width: 2.5, count: 3 * 2 + 2, yards: 0.625 },
      { role: 'light', width: 2.5, count: 3 + 2 * 2, yards: 0.5 },
    ]);
  });

  it('lists the patches cut one by one, grouped by role and size', () => {
    expect(gridCutList(nine, { blocks: 4 })).toEqual([
      { role: 'dark', width: 2.5, height: 2.5, count: 20 },
      { role: 'light', width: 2.5, height: 2.5, count: 16 },
    ]);
  });

  it('rejects a sub-cut longer than the strip set', () => {
    expect(() => gridStripSets({ columns: [3], rows: [44] })).toThrow(/longer than/);
    expect(() => gridStripSets(nine, { blocks: 0 })).toThrow(/at least 1/);
  });
});
