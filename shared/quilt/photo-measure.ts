/**
 * Measuring a block from a photo: four clicked corners of a reference square of known size lying
 * flat beside the block fix the homography from the image to the cutting-mat plane; the block's
 * four corners mapped through it give its sides and diagonals in inches. Corner order for both:
 * top-left, top-right, bottom-right, bottom-left.
 */
import { type Homography, type Point, type Quad, applyHomography, homography, isConvexQuad, pointsArg } from './homography';
import { QuiltInputError, lengthArg } from './rational';

export interface PhotoReference {
  corners: Quad;
  /** side of the reference square in inches */
  size: number;
}

export interface PhotoMeasurement {
  /** block corners on the mat, inches */
  corners: Quad;
  sides: [number, number, number, number];
  width: number;
  height: number;
  /** top-left → bottom-right, top-right → bottom-left */
  diagonals: [number, number];
}

const dist = (a: Point, b: Point): number => Math.hypot(a[0] - b[0], a[1] - b[1]);

function imageToMat(reference: PhotoReference): Homography {
  const corners = pointsArg('reference.corners', reference?.corners);
  const s = lengthArg('reference.size', reference?.size).valueOf();
  if (!isConvexQuad(corners)) {
    throw new QuiltInputError('reference.corners', 'The reference corners cross over; click them in order round the square.');
  }
  return homography(corners, [
    [0, 0],
    [s, 0],
    [s, s],
    [0, s],
  ]);
}

function measureWith(h: Homography, blockCorners: Quad): PhotoMeasurement {
  const ws = blockCorners.map(([x, y]) => (h[6] as number) * x + (h[7] as number) * y + (h[8] as number));
  if (!ws.every((w) => Math.sign(w) === Math.sign(ws[0] as number) && w !== 0)) {
    throw new QuiltInputError('block.corners', 'The block corners are not on the same flat surface as the reference square.');
  }
  const c = blockCorners.map((p) => applyHomography(h, p)) as Quad;
  const [tl, tr, br, bl] = c;
  const sides: [number, number, number, number] = [dist(tl, tr), dist(tr, br), dist(br, bl), dist(bl, tl)];
  return {
    corners: c,
    sides,
    width: (sides[0] + sides[2]) / 2,
    height: (sides[1] + sides[3]) / 2,
    diagonals: [dist(tl, br), dist(tr, bl)],
  };
}

/**
 * A block's size from a photo: sides [top, right, bottom, left], width and height as the averages
 * of opposite sides, and both diagonals, in inches on the plane of the reference square.
 */
export function measureFromPhoto(reference: PhotoReference, block: { corners: Quad }): PhotoMeasurement {
  const h = imageToMat(reference);
  const corners = pointsArg('block.corners', block?.corners);
  if (!isConvexQuad(corners))
    throw new QuiltInputError('block.corners', 'The block corners cross over; click them in order round the block.');
  return measureWith(h, corners);
}

export interface PhotoQuality {
  /** shortest side of the reference square in the photo, pixels */
  referencePixels: number;
  /** how far from a straight-down view: largest ÷ smallest perspective scale over the corners, minus 1 */
  obliqueness: number;
  /** one standard deviation of the width, height and diagonals from corner-click error, inches */
  expectedError: number;
  warnings: string[];
}

export const QUALITY_LIMITS = {
  minReferencePixels: 100,
  maxObliqueness: 0.2,
  maxExpectedError: 1 / 16,
  maxBlockToReference: 5,
} as const;

/**
 * How much to trust a photo measurement. Each of the eight clicked corners is assumed off by a
 * random `clickError` pixels in x and y (default 2); the error is propagated to the width, height
 * and diagonals through the numerical derivatives of the whole computation. Warns when the
 * reference is small in the frame, the view steep, the block far larger than the reference, or
 * the expected error above 1/16″. Lens distortion and blocks not lying flat are not modelled.
 */
export function photoMeasureQuality(
  reference: PhotoReference,
  block: { corners: Quad },
  opts: { clickError?: number } = {},
): PhotoQuality {
  const base = measureFromPhoto(reference, block);
  const sigma = lengthArg('clickError', opts.clickError ?? 2, { zero: true }).valueOf();
  const ref = pointsArg('reference.corners', reference.corners);
  const blk = pointsArg('block.corners', block.corners);
  const h = imageToMat(reference);
  const referencePixels = Math.min(...ref.map((p, i) => dist(p, ref[(i + 1) % 4] as Point)));
  const ws = [...ref, ...blk].map(([x, y]) => Math.abs((h[6] as number) * x + (h[7] as number) * y + (h[8] as number)));
  const obliqueness = Math.max(...ws) / Math.min(...ws) - 1;

  const outputs = (m: PhotoMeasurement) => [m.width, m.height, m.diagonals[0], m.diagonals[1]];
  const variance = [0, 0, 0, 0];
  const step = 0.5;
  for (let k = 0; k < 16; k += 1) {
    const shifted = (delta: number) => {
      const pts = [...ref, ...blk].map((p) => [...p] as Point);
      const p = pts[k >> 1] as Point;
      if (k & 1) p[1] += delta;
      else p[0] += delta;
      return outputs(measureWith(imageToMat({ corners: pts.slice(0, 4) as Quad, size: reference.size }), pts.slice(4) as Quad));
    };
    const plus = shifted(step);
    const minus = shifted(-step);
    plus.forEach((p, i) => {
      const derivative = (p - (minus[i] as number)) / (2 * step);
      variance[i] = (variance[i] as number) + derivative * derivative;
    });
  }
  const expectedError = sigma * Math.sqrt(Math.max(...variance));

  const warnings: string[] = [];
  if (referencePixels < QUALITY_LIMITS.minReferencePixels) {
    warnings.push(
      `The reference square is only ${Math.round(referencePixels)} pixels across; move closer or use a larger square (at least ${QUALITY_LIMITS.minReferencePixels} pixels).`,
    );
  }
  if (obliqueness > QUALITY_LIMITS.maxObliqueness) {
    warnings.push('The photo is taken at a steep angle; hold the camera straight above the block.');
  }
  if (Math.max(base.width, base.height) > QUALITY_LIMITS.maxBlockToReference * reference.size) {
    warnings.push('The block is much larger than the reference square; use a larger square for a reliable size.');
  }
  if (expectedError > QUALITY_LIMITS.maxExpectedError) {
    warnings.push(`Expect an error of about ±${expectedError.toFixed(2)}″ on this photo; measure with a ruler before deciding.`);
  }
  return { referencePixels, obliqueness, expectedError, warnings };
}
