/**
 * Photo measuring checked against a general-purpose reference library, OpenCV 4.12 (npm
 * @techstark/opencv-js 4.12.0-release.1): our homography against cv.getPerspectiveTransform, and a
 * whole round trip through pixels — photos drawn by sharp from a known camera, the reference square
 * and block found again with cv.findContours / cv.approxPolyDP / cv.fitLine, then measured back.
 */
import { createRequire } from 'node:module';
import fc from 'fast-check';
import sharp from 'sharp';
import { beforeAll, describe, expect, it } from 'vitest';
import { applyHomography, homography, measureFromPhoto, type Point, type Quad } from '@shared/quilt';
import { estimateFromCorners } from '@shared/schemas/photo-estimates';
import { rectangle, scene, scenePhoto, truth, type Scene } from '../fixtures/photo-measure-scene';

/* eslint-disable @typescript-eslint/no-explicit-any -- opencv.js is typed loosely */
// Loaded with require: the module object is a thenable that never settles, and an import() of it
// (which the test runner does for packages) waits on it forever.
const cv: any = createRequire(import.meta.url)('@techstark/opencv-js');
const SIXTEENTH = 1 / 16;

// opencv.js is a thenable that never settles when awaited; wait for its runtime instead.
beforeAll(async () => {
  if (!cv.Mat) await new Promise<void>((resolve) => (cv.onRuntimeInitialized = resolve));
}, 60_000);

function opencvTransform(src: Quad, dst: Quad): number[] {
  const a = cv.matFromArray(4, 1, cv.CV_32FC2, src.flat());
  const b = cv.matFromArray(4, 1, cv.CV_32FC2, dst.flat());
  const m = cv.getPerspectiveTransform(a, b);
  const out = Array.from(m.data64F as Float64Array);
  [a, b, m].forEach((x) => x.delete());
  return out;
}

describe('homography agrees with OpenCV getPerspectiveTransform', () => {
  it('on photos of the mat from many camera positions', () => {
    fc.assert(
      fc.property(
        fc.record({
          tilt: fc.double({ min: 0, max: 40, noNaN: true }),
          roll: fc.double({ min: -180, max: 180, noNaN: true }),
          distance: fc.double({ min: 18, max: 60, noNaN: true }),
        }),
        (camera) => {
          const s = scene({ camera });
          const ours = homography(s.image.reference, [
            [0, 0],
            [6, 0],
            [6, 6],
            [0, 6],
          ]);
          // OpenCV takes float32 points, so agreement is to about 1e-6 relative.
          const theirs = opencvTransform(s.image.reference, [
            [0, 0],
            [6, 0],
            [6, 6],
            [0, 6],
          ]);
          for (const p of [...s.image.block, [800, 600] as Point]) {
            const [x1, y1] = applyHomography(ours, p);
            const [x2, y2] = applyHomography(theirs, p);
            expect(Math.hypot(x1 - x2, y1 - y2)).toBeLessThan(1e-3);
          }
          // The same matrix up to float32 rounding, once both are scaled to unit length.
          const unit = (m: number[]) => m.map((v) => v / Math.hypot(...m));
          const [a, b] = [unit(ours), unit(theirs)];
          expect(Math.hypot(...a.map((v, i) => v - b[i]!))).toBeLessThan(1e-5);
        },
      ),
      { numRuns: 60 },
    );
  });
});

/** Pixels nearest each colour of the drawing: mat, grid line, reference square, block. */
async function classify(png: Buffer) {
  const { data, info } = await sharp(png).removeAlpha().raw().toBuffer({ resolveWithObject: true });
  const palette = [
    [0x1f, 0x5a, 0x46],
    [0x3f, 0x8a, 0x6c],
    [0xf2, 0xef, 0xe6],
    [0xb5, 0x46, 0x2f],
  ];
  const cls = new Uint8Array(info.width * info.height);
  for (let i = 0; i < cls.length; i += 1) {
    let best = 0;
    let bestD = Infinity;
    palette.forEach(([r, g, b], k) => {
      const d = (data[3 * i]! - r!) ** 2 + (data[3 * i + 1]! - g!) ** 2 + (data[3 * i + 2]! - b!) ** 2;
      if (d < bestD) [best, bestD] = [k, d];
    });
    cls[i] = best;
  }
  return { cls, width: info.width, height: info.height };
}

/** TL, TR, BR, BL: round the centroid from the corner nearest the image's top-left. */
function ordered(points: Point[]): Quad {
  const cx = points.reduce((s, p) => s + p[0], 0) / 4;
  const cy = points.reduce((s, p) => s + p[1], 0) / 4;
  const round = [...points].sort((a, b) => Math.atan2(a[1] - cy, a[0] - cx) - Math.atan2(b[1] - cy, b[0] - cx));
  const start = round.reduce((best, p, i) => (p[0] + p[1] < round[best]![0] + round[best]![1] ? i : best), 0);
  return [0, 1, 2, 3].map((k) => round[(start + k) % 4]) as Quad;
}

function intersect([vx1, vy1, x1, y1]: number[], [vx2, vy2, x2, y2]: number[]): Point {
  const det = vx1! * vy2! - vy1! * vx2!;
  const t = ((x2! - x1!) * vy2! - (y2! - y1!) * vx2!) / det;
  return [x1! + t * vx1!, y1! + t * vy1!];
}

/**
 * The largest four-sided outline of a class: contour (findContours), its four corners roughly
 * (approxPolyDP), then each side refitted to its contour points (fitLine) and the sides intersected,
 * which places the corners to a fraction of a pixel.
 */
function findQuad(img: { cls: Uint8Array; width: number; height: number }, klass: number): Quad {
  const mask = cv.matFromArray(
    img.height,
    img.width,
    cv.CV_8UC1,
    Array.from(img.cls, (c) => (c === klass ? 255 : 0)),
  );
  const contours = new cv.MatVector();
  const hierarchy = new cv.Mat();
  cv.findContours(mask, contours, hierarchy, cv.RETR_EXTERNAL, cv.CHAIN_APPROX_NONE);
  let largest = 0;
  for (let i = 1; i < contours.size(); i += 1)
    if (cv.contourArea(contours.get(i)) > cv.contourArea(contours.get(largest))) largest = i;
  const contour = contours.get(largest);
  const approx = new cv.Mat();
  cv.approxPolyDP(contour, approx, 0.02 * cv.arcLength(contour, true), true);
  expect(approx.rows).toBe(4);
  const rough = Array.from({ length: 4 }, (_, i) => [approx.data32S[2 * i], approx.data32S[2 * i + 1]] as Point);
  const pts = Array.from({ length: contour.rows }, (_, i) => [contour.data32S[2 * i], contour.data32S[2 * i + 1]] as Point);
  const cx = rough.reduce((t, p) => t + p[0], 0) / 4;
  const cy = rough.reduce((t, p) => t + p[1], 0) / 4;
  const lines = rough.map((a, i) => {
    const b = rough[(i + 1) % 4]!;
    const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
    // Points along the middle 80 % of the side, well clear of the rounded-off corners.
    const side = pts.filter((p) => {
      const t = ((p[0] - a[0]) * (b[0] - a[0]) + (p[1] - a[1]) * (b[1] - a[1])) / (len * len);
      const off = Math.abs((p[0] - a[0]) * (b[1] - a[1]) - (p[1] - a[1]) * (b[0] - a[0])) / len;
      return t > 0.1 && t < 0.9 && off < 3;
    });
    const m = cv.matFromArray(side.length, 1, cv.CV_32FC2, side.flat());
    const line = new cv.Mat();
    cv.fitLine(m, line, cv.DIST_L2, 0, 0.01, 0.01);
    const [vx, vy, x0, y0] = Array.from(line.data32F as Float32Array) as [number, number, number, number];
    [m, line].forEach((x) => x.delete());
    // Pixel i spans i … i + 1 of the drawing, and the outline runs through the centres of the edge
    // pixels inside the shape: move the line half a pixel on, then half a pixel outwards.
    const [mx, my] = [(a[0] + b[0]) / 2 - cx, (a[1] + b[1]) / 2 - cy];
    const out = Math.sign(-vy * mx + vx * my) * 0.5;
    return [vx, vy, x0 + 0.5 - vy * out, y0 + 0.5 + vx * out];
  });
  [mask, contours, hierarchy, approx].forEach((x) => x.delete());
  return ordered(lines.map((l, i) => intersect(lines[(i + 3) % 4]!, l)));
}

const maxCornerError = (found: Quad, drawn: Quad) =>
  Math.max(...found.map((p, i) => Math.hypot(p[0] - drawn[i]![0], p[1] - drawn[i]![1])));

async function measureDrawn(s: Scene, format: 'png' | 'jpeg' = 'png') {
  const img = await classify(await scenePhoto(s, format));
  const found = { reference: findQuad(img, 2), block: findQuad(img, 3) };
  const measured = measureFromPhoto({ corners: found.reference, size: s.referenceSize }, { corners: found.block });
  return { found, measured, truth: truth(s) };
}

describe('measuring back a drawn photo (1600 × 1200) found by OpenCV', () => {
  // A 12″ square of the mat's grid round a 9½″ block: the marks surround what is measured.
  const round = (over: Parameters<typeof scene>[0] = {}) =>
    scene({ referenceSize: 12, block: rectangle(1.25, 1.4, 9.5, 9.5, 2), camera: { target: [6, 6] }, ...over });

  it('draws the corners where the known camera puts them', async () => {
    const s = round();
    const { found } = await measureDrawn(s);
    expect(maxCornerError(found.reference, s.image.reference)).toBeLessThan(0.25);
    expect(maxCornerError(found.block, s.image.block)).toBeLessThan(0.25);
  });

  it.each([
    ['PNG, tilted 12°', round(), 'png'],
    ['JPEG as stored after upload, tilted 12°', round(), 'jpeg'],
    ['PNG, tilted 25° and turned 30°', round({ camera: { target: [6, 6], tilt: 25, roll: 30, distance: 34 } }), 'png'],
  ] as const)('gives width, height and diagonals within 1/16″ (%s)', async (_label, s, format) => {
    const { measured, truth: t } = await measureDrawn(s, format);
    expect(Math.abs(measured.width - t.width)).toBeLessThan(SIXTEENTH);
    expect(Math.abs(measured.height - t.height)).toBeLessThan(SIXTEENTH);
    expect(Math.abs(measured.diagonals[0] - t.diagonals[0])).toBeLessThan(SIXTEENTH);
    expect(Math.abs(measured.diagonals[1] - t.diagonals[1])).toBeLessThan(SIXTEENTH);
  });

  it('finds a block drawn ⅜″ short to run short, from the pixels alone', async () => {
    const s = round({ block: rectangle(1.25, 1.4, 9.125, 9.5, 2) });
    const img = await classify(await scenePhoto(s));
    const e = estimateFromCorners(
      { corners: findQuad(img, 2), size: 12 },
      { corners: findQuad(img, 3) },
      { width: 9.5, height: 9.5, tolerance: 0.125, squareness: 0.25 },
    );
    expect(e.verdict).toBe('short');
    expect(Math.abs(e.width - 9.125)).toBeLessThan(SIXTEENTH);
  });

  it('with a 6″ square beside the block: within 1/16″ from sub-pixel corners, with a warning for hand-placed ones', async () => {
    const s = scene({ block: rectangle(7, 0.5, 9.5, 9.5) });
    const { found, measured, truth: t } = await measureDrawn(s);
    expect(Math.abs(measured.width - t.width)).toBeLessThan(SIXTEENTH);
    expect(Math.abs(measured.height - t.height)).toBeLessThan(SIXTEENTH);
    expect(Math.abs(measured.diagonals[0] - t.diagonals[0])).toBeLessThan(SIXTEENTH);
    // The expected error assumes corners placed by hand to about 2 pixels: far more than 1/16″ here.
    const e = estimateFromCorners(
      { corners: found.reference, size: 6 },
      { corners: found.block },
      { width: 9.5, height: 9.5, tolerance: 0.125, squareness: 0.25 },
    );
    expect(e.expectedError).toBeGreaterThan(4 * SIXTEENTH);
    expect(e.warnings.join(' ')).toMatch(/Expect an error of about ±0\.4\d″/);
  });
});
