/**
 * The homography checked against OpenCV (@techstark/opencv-js, cv.getPerspectiveTransform and
 * cv.perspectiveTransform) on random quadrilaterals, and photo measuring checked against a
 * pinhole camera with known geometry.
 */
import { createRequire } from 'node:module';
import type * as OpenCv from '@techstark/opencv-js';
import fc from 'fast-check';
import { beforeAll, describe, expect, it } from 'vitest';
import { type Quad, applyHomography, homography, measureFromPhoto } from '@shared/quilt';
import { type Camera, type Point, project, rectangle } from '../unit/quilt/support/camera';

/*
 * Loaded with require: the module object is a thenable that never settles, and a static import
 * hangs under vitest, whose module interop awaits it. Nor may it be awaited here.
 */
const cv = createRequire(import.meta.url)('@techstark/opencv-js') as typeof OpenCv & { Mat: unknown };

/** Waits for the wasm runtime to initialise. */
function openCvReady(): Promise<void> {
  const started = Date.now();
  return new Promise((resolve, reject) => {
    const tick = () => {
      if (cv.Mat) resolve();
      else if (Date.now() - started > 60_000) reject(new Error('OpenCV did not initialise within 60 s'));
      else setTimeout(tick, 25);
    };
    tick();
  });
}

beforeAll(openCvReady, 90_000);

const flat = (q: Quad) => q.flatMap(([x, y]) => [x, y]);

function openCvHomography(src: Quad, dst: Quad): number[] {
  const s = cv.matFromArray(4, 1, cv.CV_32FC2, flat(src));
  const d = cv.matFromArray(4, 1, cv.CV_32FC2, flat(dst));
  const m = cv.getPerspectiveTransform(s, d);
  const out = Array.from(m.data64F as Float64Array);
  s.delete();
  d.delete();
  m.delete();
  return out;
}

function openCvMap(h: number[], pts: Point[]): Point[] {
  const src = cv.matFromArray(pts.length, 1, cv.CV_64FC2, pts.flat());
  const dst = new cv.Mat();
  const m = cv.matFromArray(3, 3, cv.CV_64F, h);
  cv.perspectiveTransform(src, dst, m);
  const data = Array.from(dst.data64F as Float64Array);
  src.delete();
  dst.delete();
  m.delete();
  return pts.map((_, i) => [data[2 * i]!, data[2 * i + 1]!]);
}

/** A convex quadrilateral: a rectangle whose corners are moved by up to a quarter of its size. */
const quad = fc
  .record({
    x: fc.integer({ min: 0, max: 3000 }),
    y: fc.integer({ min: 0, max: 2000 }),
    w: fc.integer({ min: 80, max: 2000 }),
    h: fc.integer({ min: 80, max: 2000 }),
    jitter: fc.array(fc.double({ min: -0.25, max: 0.25, noNaN: true }), { minLength: 8, maxLength: 8 }),
  })
  .map(({ x, y, w, h, jitter }) => {
    const j = (i: number) => jitter[i]!;
    const corners: Quad = [
      [x + j(0) * w, y + j(1) * h],
      [x + w + j(2) * w, y + j(3) * h],
      [x + w + j(4) * w, y + h + j(5) * h],
      [x + j(6) * w, y + h + j(7) * h],
    ];
    // OpenCV takes 32-bit float points: give both sides the same rounded coordinates.
    return corners.map(([a, b]) => [Math.fround(a), Math.fround(b)]) as Quad;
  });

describe('homography agrees with cv.getPerspectiveTransform', () => {
  it('on random quadrilaterals (seeded)', () => {
    fc.assert(
      fc.property(quad, quad, (src, dst) => {
        const ours = homography(src, dst);
        const theirs = openCvHomography(src, dst);
        expect(theirs[8]).toBeCloseTo(1, 12);
        // Compare where it matters: the images of points across the source quad.
        const probes: Point[] = [];
        for (let u = 0; u <= 1; u += 0.25) {
          for (let v = 0; v <= 1; v += 0.25) {
            const top: Point = [src[0][0] + u * (src[1][0] - src[0][0]), src[0][1] + u * (src[1][1] - src[0][1])];
            const bottom: Point = [src[3][0] + u * (src[2][0] - src[3][0]), src[3][1] + u * (src[2][1] - src[3][1])];
            probes.push([top[0] + v * (bottom[0] - top[0]), top[1] + v * (bottom[1] - top[1])]);
          }
        }
        const viaOpenCv = openCvMap(theirs, probes);
        const span = Math.max(...dst.flat()) + 1;
        probes.forEach((p, i) => {
          const [x, y] = applyHomography(ours, p);
          expect(Math.abs(x - viaOpenCv[i]![0])).toBeLessThan(1e-6 * span);
          expect(Math.abs(y - viaOpenCv[i]![1])).toBeLessThan(1e-6 * span);
        });
        // Entries agree to 1e-4 even for thin, ill-conditioned quads; where they differ, ours maps the
        // four corners at least as exactly.
        ours.forEach((v, k) => expect(Math.abs(v - theirs[k]!)).toBeLessThan(1e-4 * Math.max(1, Math.abs(theirs[k]!))));
        const residual = (pts: Point[]) => Math.max(...pts.map((p, i) => Math.hypot(p[0] - dst[i]![0], p[1] - dst[i]![1])));
        const oursResidual = residual(src.map((p) => applyHomography(ours, p)));
        expect(oursResidual).toBeLessThanOrEqual(residual(openCvMap(theirs, src)) + 1e-9 * span);
      }),
      { seed: 20_270_301, numRuns: 200 },
    );
  });
});

describe('measureFromPhoto recovers a known block through a known perspective', () => {
  const cameras: Camera[] = [
    { tilt: 0, roll: 0, focal: 3000, distance: 30, target: [12, 8], centre: [2000, 1500] },
    { tilt: 20, roll: 5, focal: 3200, distance: 28, target: [12, 8], centre: [2016, 1512] },
    { tilt: 35, roll: -12, focal: 2800, distance: 36, target: [10, 10], centre: [1500, 2000] },
  ];

  it.each(cameras)('within 1/16″ (tilt $tilt°, roll $roll°)', (cam) => {
    const shoot = (q: Quad) => q.map((p) => project(cam, p)) as Quad;
    const reference = { corners: shoot(rectangle(0, 0, 6, 6)), size: 6 };
    // A 12½″ block turned 7° and a block sewn 1⁄4″ out of square (a parallelogram).
    const m = measureFromPhoto(reference, { corners: shoot(rectangle(8, 1, 12.5, 12.5, 7)) });
    for (const side of m.sides) expect(Math.abs(side - 12.5)).toBeLessThan(1 / 16);
    for (const d of m.diagonals) expect(Math.abs(d - 17.678)).toBeLessThan(1 / 16);
    const skew: Quad = [
      [8.25, 1],
      [20.75, 1],
      [20.5, 13.5],
      [8, 13.5],
    ];
    const s = measureFromPhoto(reference, { corners: shoot(skew) });
    expect(Math.abs(s.width - 12.5)).toBeLessThan(1 / 16);
    expect(Math.abs(s.height - Math.hypot(0.25, 12.5))).toBeLessThan(1 / 16);
    expect(Math.abs(s.diagonals[0] - Math.hypot(12.25, 12.5))).toBeLessThan(1 / 16);
    expect(Math.abs(s.diagonals[1] - Math.hypot(12.75, 12.5))).toBeLessThan(1 / 16);
  });

  it('gives the same block corners as OpenCV mapping through its own homography', () => {
    const cam = cameras[2]!;
    const shoot = (q: Quad) => q.map((p) => project(cam, p)) as Quad;
    const refImage = shoot(rectangle(0, 0, 6, 6)).map(([x, y]) => [Math.fround(x), Math.fround(y)]) as Quad;
    const blockImage = shoot(rectangle(8, 1, 12.5, 12.5, 7));
    const theirs = openCvMap(
      openCvHomography(refImage, [
        [0, 0],
        [6, 0],
        [6, 6],
        [0, 6],
      ]),
      blockImage,
    );
    const ours = measureFromPhoto({ corners: refImage, size: 6 }, { corners: blockImage }).corners;
    ours.forEach((p, i) => {
      expect(p[0]).toBeCloseTo(theirs[i]![0], 6);
      expect(p[1]).toBeCloseTo(theirs[i]![1], 6);
    });
  });
});
