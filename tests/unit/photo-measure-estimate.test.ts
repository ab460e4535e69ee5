import { describe, expect, it } from 'vitest';
import { QuiltInputError, measureFromPhoto, type Quad } from '@shared/quilt';
import { estimateFromCorners, outsidePhoto, photoEstimateBodySchema } from '@shared/schemas/photo-estimates';
import { rectangle, scene, shoot } from '../fixtures/photo-measure-scene';

// A 9½″ unfinished square with ±⅛″ and a ¼″ squareness limit (common practice, no source).
const target = { width: 9.5, height: 9.5, tolerance: 0.125, squareness: 0.25 };
const SIXTEENTH = 1 / 16;

function estimateOf(block: Quad, over: Parameters<typeof scene>[0] = {}, t = target) {
  const s = scene({ block, ...over });
  return estimateFromCorners({ corners: s.image.reference, size: s.referenceSize }, { corners: s.image.block }, t);
}

describe('estimateFromCorners', () => {
  it('gives each verdict for blocks of a known size seen at an angle', () => {
    const cases: [Quad, string][] = [
      [rectangle(7, 0.5, 9.5, 9.5), 'true'],
      [rectangle(7, 0.5, 9.875, 9.75), 'trim'],
      [rectangle(7, 0.5, 9.125, 9.5), 'short'],
      // Sheared by ⅜″: the diagonals differ by about ½″.
      [
        [
          [7, 0.5],
          [16.5, 0.5],
          [16.875, 10],
          [7.375, 10],
        ],
        'skewed',
      ],
    ];
    for (const [block, verdict] of cases) {
      const e = estimateOf(block);
      expect(e.verdict, `block ${JSON.stringify(block)}`).toBe(verdict);
    }
    const short = estimateOf(rectangle(7, 0.5, 9.125, 9.5));
    expect(short.width).toBeCloseTo(9.125, 3);
    expect(short.deviations.width).toBeCloseTo(-0.375, 3);
    expect(short.diagonals[0]).toBeCloseTo(Math.hypot(9.125, 9.5), 3);
  });

  it('recovers the size within 1/16″ from whole-pixel marks when the reference square goes round the block', () => {
    const s = scene({ referenceSize: 12, block: rectangle(1.5, 1.25, 9.5, 9.5, 2), camera: { target: [6, 6] } });
    const round = (q: Quad) => q.map(([x, y]) => [Math.round(x), Math.round(y)]) as Quad;
    const e = estimateFromCorners({ corners: round(s.image.reference), size: 12 }, { corners: round(s.image.block) }, target);
    expect(Math.abs(e.width - 9.5)).toBeLessThan(SIXTEENTH);
    expect(Math.abs(e.height - 9.5)).toBeLessThan(SIXTEENTH);
    expect(e.expectedError).toBeGreaterThan(0);
    expect(e.expectedError).toBeLessThan(0.1);
    expect(e.borderline).toBe(false);
  });

  it('expects a far larger error from a 6″ reference beside the block than from a 12″ one round it', () => {
    const small = estimateOf(rectangle(7, 0.5, 9.5, 9.5));
    const large = estimateOf(rectangle(1.25, 1.25, 9.5, 9.5), { referenceSize: 12, camera: { target: [6, 6] } });
    expect(small.expectedError).toBeGreaterThan(3 * large.expectedError);
    expect(small.warnings.join(' ')).toMatch(/Expect an error of about ±0\.\d\d″/);
  });

  it('states an expected error that matches the spread of sizes from 2-pixel marking errors', () => {
    const s = scene({ block: rectangle(7, 0.5, 9.5, 9.5) });
    const stated = estimateOf(s.mat.block).expectedError;
    // Seeded normal deviates (Park–Miller generator, Box–Muller transform), so the run is repeatable.
    let seed = 20_240_611;
    const uniform = () => (seed = (seed * 48_271) % 2_147_483_647) / 2_147_483_647;
    const normal = () => Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform());
    const jitter = (q: Quad) => q.map(([x, y]) => [x + 2 * normal(), y + 2 * normal()]) as Quad;
    const samples = Array.from({ length: 2000 }, () => {
      const m = measureFromPhoto({ corners: jitter(s.image.reference), size: 6 }, { corners: jitter(s.image.block) });
      return [m.width, m.height, m.diagonals[0], m.diagonals[1]];
    });
    const spread = [0, 1, 2, 3].map((k) => {
      const xs = samples.map((r) => r[k]!);
      const mean = xs.reduce((a, b) => a + b, 0) / xs.length;
      return Math.sqrt(xs.reduce((a, b) => a + (b - mean) ** 2, 0) / (xs.length - 1));
    });
    expect(Math.max(...spread) / stated).toBeGreaterThan(0.8);
    expect(Math.max(...spread) / stated).toBeLessThan(1.2);
  });

  it('compares a block photographed sideways with the target the right way round', () => {
    // Flying geese 3½″ × 6½″ unfinished (finished 3 × 6 plus ½″): photographed long side across.
    const geese = { width: 6.5, height: 3.5, tolerance: 0.125, squareness: 0.25 };
    const upright = estimateOf(rectangle(8, 1, 3.5, 6.5), {}, geese);
    expect(upright.turned).toBe(true);
    expect(upright.verdict).toBe('true');
    expect(upright.width).toBeCloseTo(6.5, 3);
    const across = estimateOf(rectangle(8, 1, 6.5, 3.5), {}, geese);
    expect(across.turned).toBe(false);
    expect(across.verdict).toBe('true');
  });

  it('flags an estimate within its expected error of a limit as borderline', () => {
    const round = { referenceSize: 12, camera: { target: [6, 6] as [number, number] } };
    const near = estimateOf(rectangle(1.25, 1.25, 9.4, 9.5), round);
    expect(near.verdict).toBe('true');
    expect(near.borderline).toBe(true);
    const clear = estimateOf(rectangle(1.25, 1.25, 9.5, 9.5), round);
    expect(clear.borderline).toBe(false);
  });

  it('warns about a small reference square and a steep angle', () => {
    const far = estimateOf(rectangle(7, 0.5, 9.5, 9.5), { camera: { focal: 500 } });
    expect(far.referencePixels).toBeLessThan(100);
    expect(far.warnings.join(' ')).toMatch(/only \d+ pixels across/);
    const steep = estimateOf(rectangle(7, 0.5, 9.5, 9.5), { camera: { tilt: 50, distance: 40 } });
    expect(steep.warnings.join(' ')).toMatch(/steep angle/);
  });

  it('names the problem with corners that cannot be measured', () => {
    const ref: Quad = [
      [100, 100],
      [400, 100],
      [400, 400],
      [100, 400],
    ];
    const block: Quad = [
      [500, 100],
      [900, 100],
      [900, 500],
      [500, 500],
    ];
    const call = (r: Quad, b: Quad) => () => estimateFromCorners({ corners: r, size: 6 }, { corners: b }, target);
    expect(
      call(ref, [
        [500, 100],
        [501, 101],
        [900, 500],
        [500, 500],
      ]),
    ).toThrow(/top-left and top-right\) are on the same spot/);
    expect(
      call(
        [
          [100, 100],
          [250, 100],
          [400, 100],
          [100, 400],
        ],
        block,
      ),
    ).toThrow(/Three corners of the reference square lie on one line/);
    expect(
      call(ref, [
        [500, 100],
        [900, 500],
        [900, 100],
        [500, 500],
      ]),
    ).toThrow(/cross over/);
    try {
      call(ref, [
        [500, 100],
        [900, 500],
        [900, 100],
        [500, 500],
      ])();
    } catch (error) {
      expect(error).toBeInstanceOf(QuiltInputError);
      expect((error as QuiltInputError).field).toBe('block.corners');
    }
  });

  it('tells when a corner is off the photo', () => {
    const q: Quad = [
      [0, 0],
      [1600, 0],
      [1600, 1200],
      [0, 1200],
    ];
    expect(outsidePhoto(q, 1600, 1200)).toBe(false);
    expect(
      outsidePhoto(
        [
          [0, 0],
          [1605, 0],
          [1600, 1200],
          [0, 1200],
        ],
        1600,
        1200,
      ),
    ).toBe(true);
  });
});

describe('photoEstimateBodySchema', () => {
  const body = {
    photoId: 3,
    reference: {
      corners: [
        [1, 2],
        [3, 4],
        [5, 6],
        [7, 8],
      ],
      size: '152.4 mm',
    },
    block: {
      corners: [
        [1, 2],
        [3, 4],
        [5, 6],
        [7, 8],
      ],
    },
  };

  it('reads any length form for the reference size and drops numbers the client worked out', () => {
    const parsed = photoEstimateBodySchema.parse({ ...body, verdict: 'true', width: 9.5 });
    expect(parsed.reference.size).toBe(6);
    expect(parsed).not.toHaveProperty('verdict');
    expect(parsed).not.toHaveProperty('width');
  });

  it('says how many corners were marked when there are not four', () => {
    const r = photoEstimateBodySchema.safeParse({
      ...body,
      block: {
        corners: [
          [1, 2],
          [3, 4],
          [5, 6],
        ],
      },
    });
    expect(r.success).toBe(false);
    expect(r.error!.issues[0]!.message).toBe('Mark all four corners of the block (3 marked).');
    expect(r.error!.issues[0]!.path).toEqual(['block', 'corners']);
  });

  it('refuses a corner that is not a pair of finite numbers, and an oversized reference', () => {
    const bad = photoEstimateBodySchema.safeParse({
      ...body,
      reference: {
        ...body.reference,
        corners: [
          [1, 2],
          [3, 'x'],
          [5, 6],
          [7, 8],
        ],
      },
    });
    expect(bad.error!.issues[0]!.message).toMatch(/pair of numbers/);
    const big = photoEstimateBodySchema.safeParse({ ...body, reference: { ...body.reference, size: 40 } });
    expect(big.error!.issues[0]!.message).toMatch(/at most 36″/);
  });
});

// Exported scene helpers are exercised here so their geometry is itself checked.
describe('the synthetic camera', () => {
  it('looks straight down as a pure scale when not tilted or turned', () => {
    const s = scene({ camera: { tilt: 0, roll: 0 } });
    const [tl, tr] = shoot(s.camera, rectangle(0, 0, 6, 6));
    expect(tr[0] - tl[0]).toBeCloseTo((6 * 1800) / 30, 9);
    expect(tr[1]).toBeCloseTo(tl[1], 9);
  });
});
