/** The colour-spreading arrangement: what it may move, and that it never makes things worse. */
import { describe, expect, it } from 'vitest';
import { arrangeByColour, arrangementScore, deltaE2000, seededRandom, srgbToLab, type Lab } from '@shared/colour';

const random = seededRandom(7);
function palette(n: number, seed = 3): Map<number, Lab> {
  const r = seededRandom(seed);
  // Few distinct families, so a careless layout puts near-twins side by side.
  const families = ['#2F4B7C', '#B5462F', '#C8920F', '#5F7A5A', '#6B3F69', '#F7F3EA'].map(srgbToLab);
  return new Map(
    Array.from({ length: n }, (_, i) => {
      const f = families[i % families.length]!;
      return [100 + i, [f[0] + r() * 4 - 2, f[1] + r() * 4 - 2, f[2] + r() * 4 - 2] as Lab];
    }),
  );
}

function sortedByFamily(n: number): (number | null)[] {
  // Blocks of the same family side by side: a poor start.
  return Array.from({ length: n }, (_, i) => i)
    .sort((a, b) => (a % 6) - (b % 6) || a - b)
    .map((i) => 100 + i);
}

describe('arrangeByColour', () => {
  it('never moves a pinned tile or an empty or plain cell, and keeps the same blocks', () => {
    const colours = palette(30);
    // 6 × 6: 30 blocks, two empty cells in the middle and four at the end.
    const cells: (number | null)[] = sortedByFamily(30);
    cells.splice(4, 0, null);
    cells.splice(17, 0, null);
    cells.push(null, null, null, null);
    expect(cells).toHaveLength(36);
    const pinned = [0, 9, 22];
    const result = arrangeByColour({ columns: 6, rows: 6, cells, pinned, colourOf: (k) => colours.get(k) });
    cells.forEach((key, i) => {
      if (key === null) expect(result.cells[i]).toBeNull();
    });
    for (const i of pinned) expect(result.cells[i]).toBe(cells[i]);
    expect([...result.cells].filter((k) => k !== null).sort()).toEqual([...cells].filter((k) => k !== null).sort());
  });

  it('beats or equals the arrangement it is given, and reports both scores', () => {
    for (let trial = 0; trial < 8; trial += 1) {
      const colours = palette(42, trial + 10);
      const cells = sortedByFamily(42);
      const shuffled = trial % 2 ? cells : [...cells].sort(() => random() - 0.5);
      const result = arrangeByColour({ columns: 6, rows: 7, cells: shuffled, colourOf: (k) => colours.get(k), seed: trial + 1 });
      const before = arrangementScore({ columns: 6, rows: 7, cells: shuffled, colourOf: (k) => colours.get(k) });
      expect(result.before).toBeCloseTo(before, 9);
      expect(result.score).toBeGreaterThanOrEqual(result.before - 1e-9);
      expect(arrangementScore({ columns: 6, rows: 7, cells: result.cells, colourOf: (k) => colours.get(k) })).toBeCloseTo(
        result.score,
        9,
      );
    }
  });

  it('separates same-family blocks that started side by side', () => {
    const colours = palette(24);
    const cells = sortedByFamily(24);
    const result = arrangeByColour({ columns: 6, rows: 4, cells, colourOf: (k) => colours.get(k) });
    expect(result.before).toBeLessThan(6);
    expect(result.score).toBeGreaterThan(result.before + 5);
  });

  it('keeps an arrangement that cannot be bettered, and is deterministic for a seed', () => {
    const colours = palette(12);
    const cells = sortedByFamily(12);
    const a = arrangeByColour({ columns: 4, rows: 3, cells, colourOf: (k) => colours.get(k), seed: 5 });
    const b = arrangeByColour({ columns: 4, rows: 3, cells, colourOf: (k) => colours.get(k), seed: 5 });
    expect(a).toEqual(b);
    const again = arrangeByColour({ columns: 4, rows: 3, cells: a.cells, colourOf: (k) => colours.get(k), seed: 9 });
    expect(again.score).toBeGreaterThanOrEqual(a.score - 1e-9);
  });

  it('with everything pinned, returns the cells unchanged', () => {
    const colours = palette(6);
    const cells = sortedByFamily(6);
    const result = arrangeByColour({ columns: 3, rows: 2, cells, pinned: [0, 1, 2, 3, 4, 5], colourOf: (k) => colours.get(k) });
    expect(result.cells).toEqual(cells);
    expect(result.score).toBe(result.before);
  });

  it('leaves blocks without a colour out of the score', () => {
    const a = srgbToLab('#2F4B7C');
    const b = srgbToLab('#C8920F');
    const score = arrangementScore({
      columns: 3,
      rows: 1,
      cells: [1, 2, 3],
      colourOf: (k) => (k === 1 ? a : k === 3 ? b : null),
    });
    expect(score).toBe(0); // 1 and 3 are not neighbours; 2 has no colour
    expect(arrangementScore({ columns: 2, rows: 1, cells: [1, 3], colourOf: (k) => (k === 1 ? a : b) })).toBeCloseTo(
      deltaE2000(a, b),
      9,
    );
  });

  it('refuses a grid whose cells do not match columns × rows', () => {
    expect(() => arrangeByColour({ columns: 3, rows: 2, cells: [1, 2, 3], colourOf: () => null })).toThrow(RangeError);
  });
});
