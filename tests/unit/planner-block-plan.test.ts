import { describe, expect, it } from 'vitest';
import { planBlock } from '../../src/features/planner/components/block-plan';
import { parseList } from '../../src/features/planner/hooks/use-length-field';

describe('the planner’s block plan', () => {
  it('makes two-at-a-time HSTs from pairs of squares finished + ⅞″', () => {
    // Half-square triangles two at a time: square = finished + ⅞″, one light and one dark square
    // make two units (quilt guild block-making handouts on half-square triangles).
    const plan = planBlock({ kind: 'hst', finished: 3, method: 'two-at-a-time', seam: 0.25 }, 12, 42);
    expect(plan.unfinished).toEqual({ width: 3.5, height: 3.5 });
    expect(plan.cuts.map((c) => [c.what, c.width, c.count])).toEqual([
      ['Light square', 3.875, 6],
      ['Dark square', 3.875, 6],
    ]);
    // 42 ÷ 3⅞ = 10.8 → 10 squares per strip, so one strip of each fabric.
    expect(plan.strips.totals.strips).toBe(2);
  });

  it('counts square-in-a-square corners as two squares a block', () => {
    const plan = planBlock({ kind: 'square-in-square', finished: 6, seam: 0.25 }, 5, 42);
    expect(plan.cuts[1]).toMatchObject({ what: 'Corner squares', count: 10 });
    expect(plan.unfinished.width).toBe(6.5);
  });

  it('rounds flying-geese batches up to whole sets', () => {
    // No-waste geese make four per set (quilt guild handouts on flying geese): 6 geese need 2 sets.
    const plan = planBlock({ kind: 'flying-geese', width: 6, height: 3, method: 'no-waste', seam: 0.25 }, 6, 42);
    const goose = plan.cuts.find((c) => c.what.startsWith('Goose'))!;
    expect(goose).toMatchObject({ width: 7.25, count: 2 });
  });

  it('reads comma-separated lengths and names the bad entry', () => {
    expect(parseList('3½, 3 1/2, 89 mm').values).toEqual([3.5, 3.5, 89 / 25.4]);
    // An empty entry is pointed at rather than dropped; a trailing comma while typing is not an entry.
    expect(parseList('2 1/2, , 2').error).toBe('Entry 2 is empty: type a length there or remove the extra comma.');
    expect(parseList('3, 2,').values).toEqual([3, 2]);
    // In millimetre mode a bare number is millimetres (1 in = 25.4 mm exactly, NIST SP 811, Appendix B.8).
    expect(parseList('254, 127', { units: 'mm' }).values).toEqual([10, 5]);
    expect(parseList('64, 2"', { units: 'mm' }).values).toEqual([64 / 25.4, 2]);
    expect(parseList('3, zero').error).toMatch(/^Entry 2 \(“zero”\)/);
    expect(parseList('').error).toMatch(/at least one/);
  });
});
