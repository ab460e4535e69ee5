/**
 * Seam allowance, strip sets and unit formulas checked against the usual trade values and against
 * exact geometry. Sources are named beside each check; trade values are marked as common practice.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  flyingGeeseCuts,
  hstCutSize,
  qstCutSize,
  settingTriangles,
  squareInSquareCuts,
  stripSetWidth,
  unfinishedSize,
} from '@shared/quilt';

const finishedSizes = fc.integer({ min: 8, max: 16 * 16 }).map((k) => k / 16);

describe('seam allowance', () => {
  it('¼″ seam: unfinished = finished + ½″ (guild glossaries of quilting terms; common practice)', () => {
    expect(unfinishedSize(12)).toBe(12.5);
    expect(unfinishedSize(6)).toBe(6.5);
    fc.assert(fc.property(finishedSizes, (f) => unfinishedSize(f) === f + 0.5));
  });
});

describe('strip sets (quilting tips columns on strip piecing)', () => {
  it('9 strips cut 3¼″ sew to 25¼″', () => {
    expect(stripSetWidth(Array(9).fill(3.25))).toBe(25.25);
  });

  it('16 strips cut 2⅜″ sew to 30½″', () => {
    expect(stripSetWidth(Array(16).fill(2.375))).toBe(30.5);
  });

  it('n equal strips of width w give (w − ½) × n + ½', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 40 }),
        fc.integer({ min: 5, max: 96 }).map((k) => k / 8),
        (n, w) => {
          expect(stripSetWidth(Array(n).fill(w))).toBe((w - 0.5) * n + 0.5);
        },
      ),
    );
  });
});

describe('half-square triangles (quilt guild block-making handouts on HSTs)', () => {
  it('two at a time: finished + ⅞″, which covers the exact allowance ½ + √2⁄4 ≈ 0.854″', () => {
    const exact = 0.5 + Math.SQRT2 / 4;
    expect(exact).toBeCloseTo(0.854, 3);
    expect(hstCutSize(3)).toBe(3.875);
    fc.assert(
      fc.property(finishedSizes, (f) => {
        const cut = hstCutSize(f, 'two-at-a-time');
        expect(cut).toBe(f + 0.875);
        // Geometry: a square a, sewn ¼″ either side of the diagonal, opens to units of a − √2⁄4;
        // they must reach the unfinished size f + ½.
        expect(cut - Math.SQRT2 / 4).toBeGreaterThanOrEqual(f + 0.5);
        expect(cut - (f + exact)).toBeLessThan(0.125);
      }),
    );
  });

  it('trim methods: finished + 1″', () => {
    fc.assert(fc.property(finishedSizes, (f) => hstCutSize(f, 'trim') === f + 1));
  });

  it('eight at a time: 2 × finished + 1¾″ (two two-at-a-time squares side by side each way)', () => {
    fc.assert(
      fc.property(
        finishedSizes,
        (f) => hstCutSize(f, 'eight-at-a-time') === 2 * f + 1.75 && hstCutSize(f, 'eight-at-a-time') === 2 * hstCutSize(f),
      ),
    );
  });

  it('four at a time, sewn all round and cut on both diagonals: (finished + ⅞″) × √2 rounded up to ⅛″ (from memory)', () => {
    fc.assert(
      fc.property(finishedSizes, (f) => {
        const cut = hstCutSize(f, 'four-at-a-time');
        // Geometry: each quarter opens to a unit of side (a − ½)⁄√2, so a ≥ (f + ½)√2 + ½.
        const least = (f + 0.5) * Math.SQRT2 + 0.5;
        expect(cut).toBeGreaterThanOrEqual(least);
        expect(cut - least).toBeLessThan(0.125 + 0.04);
        // "finished × √2 + ⅞" would be about ⅓″ too small, so it is not the rule used.
        expect(f * Math.SQRT2 + 0.875).toBeLessThan(least);
      }),
    );
  });
});

describe('quarter-square triangles (quilt guild block-making handouts)', () => {
  it('finished + 1¼″, which covers the exact allowance (1 + √2)⁄2 ≈ 1.207″', () => {
    const exact = (1 + Math.SQRT2) / 2;
    expect(exact).toBeCloseTo(1.207, 3);
    fc.assert(
      fc.property(finishedSizes, (f) => {
        expect(qstCutSize(f)).toBe(f + 1.25);
        expect(qstCutSize(f) - f).toBeGreaterThanOrEqual(exact);
      }),
    );
  });
});

describe('flying geese (common practice, no source; the cut sizes of guild block-making handouts)', () => {
  it('no-waste: one square finished width + 1¼″ and four squares finished height + ⅞″', () => {
    fc.assert(
      fc.property(finishedSizes, (h) => {
        const [goose, sky] = flyingGeeseCuts(2 * h, h, 'no-waste');
        expect(goose).toMatchObject({ width: 2 * h + 1.25, count: 1, yields: 4 });
        expect(sky).toMatchObject({ width: h + 0.875, count: 4, yields: 4 });
        // The goose is a quarter-square triangle of long side w; the sky an HST of leg h.
        expect(goose!.width - 2 * h).toBeGreaterThanOrEqual((1 + Math.SQRT2) / 2);
        expect(sky!.width - h).toBeGreaterThanOrEqual(0.5 + Math.SQRT2 / 4);
      }),
    );
  });

  it('stitch-and-flip: rectangle (h + ½) × (w + ½) and two squares h + ½', () => {
    expect(flyingGeeseCuts(4, 2, 'stitch-and-flip')).toEqual([
      { role: 'goose', shape: 'rectangle', width: 4.5, height: 2.5, count: 1, yields: 1 },
      { role: 'sky', shape: 'square', width: 2.5, height: 2.5, count: 2, yields: 1 },
    ]);
  });
});

describe('square-in-a-square and on-point settings (exact geometry: a square’s diagonal is its side × √2)', () => {
  it('centre S⁄√2 + ½″ and corners S⁄2 + ⅞″ cut once, irrational sizes rounded up to ⅛″', () => {
    fc.assert(
      fc.property(finishedSizes, (s) => {
        const cuts = squareInSquareCuts(s);
        expect(cuts.centre.square).toBeGreaterThanOrEqual(s / Math.SQRT2 + 0.5);
        expect(cuts.centre.square - (s / Math.SQRT2 + 0.5)).toBeLessThan(0.125);
        expect(cuts.corners).toMatchObject({ square: s / 2 + 0.875, count: 2, cut: 'once-diagonally', triangles: 4 });
      }),
    );
  });

  it('side setting triangles B√2 + 1¼″ cut twice; corner triangles B⁄√2 + ⅞″ cut once', () => {
    // Worked: B = 12: 12√2 + 1¼ = 18.22 → 18¼; 12⁄√2 + ⅞ = 9.36 → 9⅜.
    expect(settingTriangles(12)).toEqual({
      side: { square: 18.25, cut: 'twice-diagonally', yields: 4 },
      corner: { square: 9.375, cut: 'once-diagonally', yields: 2 },
      roundedUp: true,
    });
    fc.assert(
      fc.property(finishedSizes, (b) => {
        const { side, corner } = settingTriangles(b);
        expect(side.square).toBeGreaterThanOrEqual(b * Math.SQRT2 + 1.25);
        expect(side.square - (b * Math.SQRT2 + 1.25)).toBeLessThan(0.125);
        expect(corner.square).toBeGreaterThanOrEqual(b / Math.SQRT2 + 0.875);
        expect(corner.square - (b / Math.SQRT2 + 0.875)).toBeLessThan(0.125);
      }),
    );
  });
});
