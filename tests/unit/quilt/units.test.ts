import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  HST_METHODS,
  batchCuts,
  flyingGeeseCuts,
  hstCut,
  hstCutSize,
  hstUnits,
  qstCut,
  qstCutSize,
  settingTriangles,
  squareInSquareCuts,
} from '@shared/quilt';

const finished = fc.integer({ min: 4, max: 16 * 16 }).map((k) => k / 16);
const isEighth = (x: number) => Number.isInteger(x * 8);

describe('HST', () => {
  it('gives the cut square and the yield per pair of squares', () => {
    expect(hstCutSize(3)).toBe(3.875);
    expect(hstCutSize(3, 'trim')).toBe(4);
    expect(hstCutSize(3, 'eight-at-a-time')).toBe(7.75);
    expect(hstCutSize(3, 'four-at-a-time')).toBe(5.5); // (3 + ⅞)·√2 = 5.48 → 5½
    expect(HST_METHODS.map(hstUnits)).toEqual([2, 2, 4, 8]);
    expect(hstCut(3, 'trim')).toEqual({ square: 4, squares: 2, yields: 2, trimTo: 3.5, roundedUp: false });
  });

  it('four-at-a-time is always on a ⅛″ step and never smaller than the geometry needs', () => {
    fc.assert(
      fc.property(finished, (f) => {
        const cut = hstCutSize(f, 'four-at-a-time');
        expect(isEighth(cut)).toBe(true);
        // A square a sewn all round and cut on both diagonals opens to units of side (a − ½)⁄√2.
        expect((cut - 0.5) / Math.SQRT2).toBeGreaterThanOrEqual(f + 0.5);
        expect(cut - 0.125).toBeLessThan((f + 0.875) * Math.SQRT2);
      }),
    );
  });

  it('rejects unknown methods and bad sizes', () => {
    expect(() => hstCutSize(3, 'six-at-a-time' as never)).toThrow(/HST method must be one of/);
    expect(() => hstCutSize(0)).toThrow(/more than zero/);
    expect(() => hstUnits('x' as never)).toThrow(/HST method/);
  });
});

describe('QST', () => {
  it('adds 1¼″', () => {
    expect(qstCutSize(4)).toBe(5.25);
    expect(qstCut(4)).toEqual({ square: 5.25, squares: 2, yields: 2, roundedUp: false });
  });
});

describe('flying geese', () => {
  it('no-waste: one big square and four small ones make four geese', () => {
    expect(flyingGeeseCuts(4, 2, 'no-waste')).toEqual([
      { role: 'goose', shape: 'square', width: 5.25, height: 5.25, count: 1, yields: 4 },
      { role: 'sky', shape: 'square', width: 2.875, height: 2.875, count: 4, yields: 4 },
    ]);
  });

  it('stitch-and-flip: a rectangle and two squares make one goose', () => {
    expect(flyingGeeseCuts(6, 3, 'stitch-and-flip')).toEqual([
      { role: 'goose', shape: 'rectangle', width: 6.5, height: 3.5, count: 1, yields: 1 },
      { role: 'sky', shape: 'square', width: 3.5, height: 3.5, count: 2, yields: 1 },
    ]);
  });

  it('scales to a number of geese in whole batches', () => {
    const plan = batchCuts(flyingGeeseCuts(4, 2), 10);
    expect(plan.batches).toBe(3);
    expect(plan.spare).toBe(2);
    expect(plan.pieces.map((p) => p.count)).toEqual([3, 12]);
  });

  it('insists geese are twice as wide as tall', () => {
    expect(() => flyingGeeseCuts(5, 2)).toThrow(/make them 4″ wide/);
    expect(() => flyingGeeseCuts(4, 2, 'folded' as never)).toThrow(/method/);
  });
});

describe('square-in-a-square and setting triangles', () => {
  it('rounds the irrational sizes up to ⅛″', () => {
    expect(squareInSquareCuts(6)).toEqual({
      centre: { square: 4.75, count: 1 }, // 6⁄√2 + ½ = 4.743 → 4¾
      corners: { square: 3.875, count: 2, cut: 'once-diagonally', triangles: 4 },
      roundedUp: true,
    });
    expect(settingTriangles(12).side.square).toBe(18.25); // 12√2 + 1¼ = 18.22 → 18¼
    expect(settingTriangles(12).corner.square).toBe(9.375); // 12⁄√2 + ⅞ = 9.36 → 9⅜
  });

  it('never rounds down, and rounds by less than ⅛″', () => {
    fc.assert(
      fc.property(finished, (s) => {
        const centre = squareInSquareCuts(s).centre.square;
        const exact = s / Math.SQRT2 + 0.5;
        expect(isEighth(centre - 0.5)).toBe(true);
        expect(centre).toBeGreaterThanOrEqual(exact);
        expect(centre - exact).toBeLessThan(0.125);
        const { side, corner } = settingTriangles(s);
        expect(side.square).toBeGreaterThanOrEqual(s * Math.SQRT2 + 1.25);
        expect(side.square - (s * Math.SQRT2 + 1.25)).toBeLessThan(0.125);
        expect(corner.square).toBeGreaterThanOrEqual(s / Math.SQRT2 + 0.875);
      }),
    );
  });
});
