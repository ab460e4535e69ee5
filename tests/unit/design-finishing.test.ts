/**
 * The design wall's finishing plan and its layout changes. The numbers below are worked by hand
 * from the usual finishing arithmetic (common practice, no source): cut = finished + 2 × ¼″ seam;
 * strips across a 42″ width of fabric; yardage rounded up to ⅛ yd.
 */
import { describe, expect, it } from 'vitest';
import { finishingPlan } from '@shared/design/finishing-plan';
import { isPlainCell } from '@shared/schemas/designs';
import { placeBlock, resize, setAlternate, takeOff, togglePin, turn, type Layout } from '@/features/design-wall/lib/layout';

const nine = { block: { width: 9, height: 9 }, seam: 0.25 };

describe('finishingPlan', () => {
  it('3 × 2 blocks of 9″ with 2″ sashing, cornerstones and borders of 2″ and 4½″', () => {
    const plan = finishingPlan({ ...nine, columns: 3, rows: 2, plain: 0, empty: 1, sashing: 2, borders: [2, 4.5] });
    // 3 × 9 + 4 × 2 = 35 and 2 × 9 + 3 × 2 = 24; borders add 2 × 6½ each way.
    expect(plan.centre).toEqual({ width: 35, height: 24 });
    expect(plan.finished).toEqual({ width: 48, height: 37 });
    const row = (label: string) => plan.cutList.find((r) => r.label === label)!;
    expect(row('Sashing beside the blocks')).toMatchObject({ count: 8, cut: { width: 9.5, height: 2.5 }, joinedStrips: 1 });
    expect(row('Sashing above and below the blocks')).toMatchObject({ count: 9, cut: { width: 9.5, height: 2.5 } });
    expect(row('Cornerstones')).toMatchObject({ count: 12, cut: { width: 2.5, height: 2.5 } });
    // Border 2's top and bottom are 39 + 9 + ½ = 48½″ long: two strips joined, (48½ − ½) ⁄ (42 − ½) → 2.
    expect(row('Border 2 (outermost): top and bottom')).toMatchObject({
      count: 2,
      cut: { width: 48.5, height: 5 },
      joinedStrips: 2,
    });
    expect(row('Border 1 (innermost): sides')).toMatchObject({ count: 2, cut: { width: 24.5, height: 2.5 } });
    const yards = Object.fromEntries(plan.fabric.map((f) => [f.label, [f.strips, f.yards]]));
    // Sashing: 4 pieces of 9½″ to a strip → 2 + 3 strips of 2½″ = 12½″ → ⅜ yd. Cornerstones: one strip → ⅛ yd.
    expect(yards['Sashing']).toEqual([5, 0.375]);
    expect(yards['Cornerstones']).toEqual([1, 0.125]);
    // Border 1: 4 strips of 2½″ = 10″ → ⅜ yd. Border 2: 2 + 4 strips of 5″ = 30″ → ⅞ yd.
    expect(yards['Border 1 (innermost)']).toEqual([4, 0.375]);
    expect(yards['Border 2 (outermost)']).toEqual([6, 0.875]);
    expect(plan.layout).toEqual({ columns: 3, rows: 2, cells: 6, plain: 0, empty: 1 });
  });

  it('without cornerstones joins the rows with long strips the width of the centre', () => {
    const plan = finishingPlan({ ...nine, columns: 3, rows: 2, plain: 0, empty: 0, sashing: 2, cornerstones: false });
    expect(plan.cutList.find((r) => r.label === 'Long sashing between the rows')).toMatchObject({
      count: 3,
      cut: { width: 35.5, height: 2.5 },
    });
    expect(plan.cutList.some((r) => r.part === 'cornerstones')).toBe(false);
    expect(plan.finished).toEqual({ width: 35, height: 24 });
  });

  it('cuts plain alternate blocks at the unfinished block size', () => {
    const plain = [...Array(12).keys()].filter((i) => isPlainCell(i, 4, true)).length;
    expect(plain).toBe(6);
    const plan = finishingPlan({ ...nine, columns: 4, rows: 3, plain, empty: 0 });
    expect(plan.cutList[0]).toMatchObject({ part: 'plain', count: 6, cut: { width: 9.5, height: 9.5 } });
    // 4 to a 9½″ strip → 2 strips = 19″ → ⅝ yd.
    expect(plan.fabric[0]).toMatchObject({ label: 'Plain alternate blocks', strips: 2, yards: 0.625 });
    expect(plan.finished).toEqual({ width: 36, height: 27 });
  });
});

describe('design-wall layout changes', () => {
  const base = (): Layout => ({
    columns: 3,
    rows: 2,
    sashing: 0,
    cornerstones: true,
    borders: [],
    alternate: false,
    cells: [1, 2, null, 4, 5, 6].map((blockId) => ({ blockId, rotation: 0 as const })),
  });

  it('trades places on the wall, sends a displaced block to the tray, and leaves pinned tiles alone', () => {
    expect(placeBlock(base(), 1, 1).cells.map((c) => c.blockId)).toEqual([2, 1, null, 4, 5, 6]);
    expect(placeBlock(base(), 9, 0).cells.map((c) => c.blockId)).toEqual([9, 2, null, 4, 5, 6]);
    const pinned = togglePin(base(), 1);
    expect(placeBlock(pinned, 1, 1)).toBe(pinned);
    expect(placeBlock(pinned, 4, 1)).toBe(pinned);
    expect(takeOff(base(), 0).cells[0]).toEqual({ blockId: null, rotation: 0 });
  });

  it('turns by 90° (square) or 180° (not square)', () => {
    expect(turn(turn(base(), 0, true), 0, true).cells[0]!.rotation).toBe(180);
    expect(turn(base(), 0, false).cells[0]!.rotation).toBe(180);
  });

  it('keeps row and column when the grid changes, and counts blocks that no longer fit', () => {
    const { layout, offWall } = resize(base(), 2, 2);
    expect(layout.cells.map((c) => c.blockId)).toEqual([1, 2, 4, 5]);
    expect(offWall).toBe(1);
  });

  it('moves blocks onto block cells for a checkerboard, adding rows as needed', () => {
    const l = setAlternate(base(), true);
    expect(l.rows).toBe(3); // 3 × 3 holds 5 block cells
    l.cells.forEach((c, i) => {
      if (isPlainCell(i, 3, true)) expect(c.blockId).toBeNull();
    });
    expect(l.cells.flatMap((c) => (c.blockId === null ? [] : [c.blockId]))).toEqual([1, 2, 4, 5, 6]);
  });
});
