import { describe, expect, it } from 'vitest';
import { type Quad, QuiltInputError, applyHomography, homography, measureFromPhoto, photoMeasureQuality } from '@shared/quilt';
import { type Camera, project, rectangle } from './support/camera';

const camera = (over: Partial<Camera> = {}): Camera => ({
  tilt: 15,
  roll: 3,
  focal: 3000,
  distance: 30,
  target: [10, 8],
  centre: [2000, 1500],
  ...over,
});
const shoot = (cam: Camera, quad: Quad) => quad.map((p) => project(cam, p)) as Quad;

describe('homography', () => {
  it('maps the four source points onto the four destination points', () => {
    const src: Quad = [
      [10, 20],
      [400, 35],
      [390, 300],
      [5, 280],
    ];
    const dst: Quad = [
      [0, 0],
      [6, 0],
      [6, 6],
      [0, 6],
    ];
    const h = homography(src, dst);
    expect(h).toHaveLength(9);
    expect(h[8]).toBe(1);
    src.forEach((p, i) => {
      const [x, y] = applyHomography(h, p);
      expect(x).toBeCloseTo(dst[i]![0], 10);
      expect(y).toBeCloseTo(dst[i]![1], 10);
    });
  });

  it('is the identity and a pure scale where it should be, and accepts 3 × 3 rows', () => {
    const sq: Quad = [
      [0, 0],
      [1, 0],
      [1, 1],
      [0, 1],
    ];
    homography(sq, sq).forEach((v, i) => expect(v).toBeCloseTo([1, 0, 0, 0, 1, 0, 0, 0, 1][i]!, 12));
    const h = homography(sq, [
      [0, 0],
      [3, 0],
      [3, 3],
      [0, 3],
    ]);
    const rows = [h.slice(0, 3), h.slice(3, 6), h.slice(6, 9)];
    expect(applyHomography(rows, [0.5, 2])).toEqual([expect.closeTo(1.5, 12), expect.closeTo(6, 12)]);
  });

  it('refuses three corners on a line', () => {
    expect(() =>
      homography(
        [
          [0, 0],
          [1, 1],
          [2, 2],
          [0, 5],
        ],
        [
          [0, 0],
          [1, 0],
          [1, 1],
          [0, 1],
        ],
      ),
    ).toThrow(/on one line/);
    expect(() =>
      homography([[0, 0]] as never, [
        [0, 0],
        [1, 0],
        [1, 1],
        [0, 1],
      ]),
    ).toThrow(/exactly four corners/);
  });
});

describe('measureFromPhoto', () => {
  it('recovers a block seen straight down at any scale', () => {
    const m = measureFromPhoto(
      {
        corners: [
          [100, 100],
          [700, 100],
          [700, 700],
          [100, 700],
        ],
        size: 6,
      },
      {
        corners: [
          [800, 100],
          [2050, 100],
          [2050, 1350],
          [800, 1350],
        ],
      },
    );
    expect(m.width).toBeCloseTo(12.5, 10);
    expect(m.height).toBeCloseTo(12.5, 10);
    expect(m.diagonals[0]).toBeCloseTo(17.6777, 4);
  });

  it('tells apart a trapezoid with equal diagonals by its sides', () => {
    const cam = camera();
    const ref = shoot(cam, rectangle(0, 0, 6, 6));
    const trapezoid: Quad = [
      [8.25, 1],
      [16.75, 1],
      [17, 9.5],
      [8, 9.5],
    ];
    const m = measureFromPhoto({ corners: ref, size: 6 }, { corners: shoot(cam, trapezoid) });
    expect(m.sides[0]).toBeCloseTo(8.5, 9);
    expect(m.sides[2]).toBeCloseTo(9, 9);
    expect(m.diagonals[0]).toBeCloseTo(m.diagonals[1], 9);
  });

  it('explains corners clicked out of order', () => {
    const ref: Quad = [
      [0, 0],
      [100, 0],
      [100, 100],
      [0, 100],
    ];
    expect(() =>
      measureFromPhoto(
        {
          corners: [
            [0, 0],
            [100, 100],
            [100, 0],
            [0, 100],
          ],
          size: 6,
        },
        { corners: ref },
      ),
    ).toThrow(/cross over/);
    expect(() =>
      measureFromPhoto(
        { corners: ref, size: 6 },
        {
          corners: [
            [0, 0],
            [100, 100],
            [100, 0],
            [0, 100],
          ],
        },
      ),
    ).toThrow(QuiltInputError);
    expect(() => measureFromPhoto({ corners: ref, size: 0 }, { corners: ref })).toThrow(/Reference size must be more than zero/);
  });
});

describe('photoMeasureQuality', () => {
  const block = rectangle(8, 1, 12.5, 12.5);

  it('is quiet for a good photo: a reference as large as the block, clicked to within a pixel', () => {
    const cam = camera({ tilt: 5, target: [12, 7] });
    const q = photoMeasureQuality(
      { corners: shoot(cam, rectangle(0, 0, 12.5, 12.5)), size: 12.5 },
      { corners: shoot(cam, rectangle(13, 0, 12.5, 12.5)) },
      { clickError: 1 },
    );
    expect(q.referencePixels).toBeGreaterThan(1000);
    expect(q.obliqueness).toBeLessThan(0.1);
    expect(q.expectedError).toBeLessThan(1 / 16);
    expect(q.warnings).toEqual([]);
  });

  it('expects less error from a larger reference square', () => {
    const cam = camera({ tilt: 5, target: [12, 7] });
    const errors = [4, 6, 8, 12.5].map(
      (size) =>
        photoMeasureQuality(
          { corners: shoot(cam, rectangle(0, 0, size, size)), size },
          { corners: shoot(cam, rectangle(13, 0, 12.5, 12.5)) },
        ).expectedError,
    );
    errors.slice(1).forEach((e, i) => expect(e).toBeLessThan(errors[i]!));
  });

  it('warns about a small reference, a steep angle and a large expected error', () => {
    const far = camera({ distance: 400 });
    const small = photoMeasureQuality({ corners: shoot(far, rectangle(0, 0, 6, 6)), size: 6 }, { corners: shoot(far, block) });
    expect(small.referencePixels).toBeLessThan(100);
    expect(small.warnings.join(' ')).toMatch(/only \d+ pixels across/);
    expect(small.warnings.join(' ')).toMatch(/Expect an error of about/);
    const steep = camera({ tilt: 55 });
    const s = photoMeasureQuality({ corners: shoot(steep, rectangle(0, 0, 6, 6)), size: 6 }, { corners: shoot(steep, block) });
    expect(s.obliqueness).toBeGreaterThan(0.2);
    expect(s.warnings.join(' ')).toMatch(/steep angle/);
    const tiny = photoMeasureQuality(
      { corners: shoot(camera(), rectangle(0, 0, 2, 2)), size: 2 },
      { corners: shoot(camera(), block) },
    );
    expect(tiny.warnings.join(' ')).toMatch(/much larger than the reference/);
  });

  it('agrees with a seeded Monte Carlo simulation of click errors', () => {
    let state = 2_027;
    const uniform = () => {
      state = (Math.imul(state, 1_664_525) + 1_013_904_223) >>> 0;
      return (state + 0.5) / 2 ** 32;
    };
    const gauss = () => Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform());
    const cam = camera({ tilt: 10, target: [12, 7] });
    const ref = shoot(cam, rectangle(0, 0, 6, 6));
    const blk = shoot(cam, rectangle(8, 1, 12.5, 12.5));
    const sigma = 1.5;
    const predicted = photoMeasureQuality({ corners: ref, size: 6 }, { corners: blk }, { clickError: sigma }).expectedError;
    const jitter = (q: Quad) => q.map(([x, y]) => [x + sigma * gauss(), y + sigma * gauss()]) as Quad;
    const samples = Array.from({ length: 2000 }, () => {
      const m = measureFromPhoto({ corners: jitter(ref), size: 6 }, { corners: jitter(blk) });
      return [m.width, m.height, m.diagonals[0], m.diagonals[1]];
    });
    const sd = [0, 1, 2, 3].map((k) => {
      const xs = samples.map((s) => s[k]!);
      const mean = xs.reduce((a, b) => a + b, 0) / xs.length;
      return Math.sqrt(xs.reduce((a, b) => a + (b - mean) ** 2, 0) / (xs.length - 1));
    });
    const ratio = Math.max(...sd) / predicted;
    expect(ratio).toBeGreaterThan(0.85);
    expect(ratio).toBeLessThan(1.15);
  });

  it('scales the expected error with the click error', () => {
    const cam = camera();
    const args = [{ corners: shoot(cam, rectangle(0, 0, 6, 6)), size: 6 }, { corners: shoot(cam, block) }] as const;
    const one = photoMeasureQuality(...args, { clickError: 1 }).expectedError;
    const four = photoMeasureQuality(...args, { clickError: 4 }).expectedError;
    expect(four / one).toBeCloseTo(4, 6);
    expect(photoMeasureQuality(...args, { clickError: 0 }).expectedError).toBe(0);
  });
});
