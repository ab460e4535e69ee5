/**
 * Photo estimates of a block's size: the body a client sends (eight marked corners and the size of
 * the reference square), the answers, and the one computation both sides run — the client for a
 * live preview, the server for what it stores. Corners are [x, y] pixels of the stored photo, in
 * the order top-left, top-right, bottom-right, bottom-left.
 */
import { z } from 'zod';
import {
  QuiltInputError,
  checkBlock,
  measureFromPhoto,
  photoMeasureQuality,
  positiveLengthSchema,
  type Point,
  type Quad,
  type Verdict,
} from '@shared/quilt';
import { idParam } from './guilds';

/** The side of a cutting mat's grid square people usually mark: 6″. */
export const DEFAULT_REFERENCE_SIZE = 6;
/** Larger than any mat's grid; a bigger number is a typing slip. */
export const MAX_REFERENCE_SIZE = 36;
/** Two marks closer than this (photo pixels) are taken as one spot. */
const MIN_CORNER_GAP = 3;

export const CORNER_NAMES = ['top-left', 'top-right', 'bottom-right', 'bottom-left'] as const;

const pointError = 'Each corner is a pair of numbers: [x, y] in photo pixels.';
const coordinate = z.number({ error: pointError }).finite(pointError).min(-100_000, pointError).max(100_000, pointError);
const point = z.tuple([coordinate, coordinate], { error: pointError });

const corners = (what: string) =>
  z
    .array(point, { error: `Give the four corners of the ${what} as [x, y] pairs.` })
    .superRefine((pts, ctx) => {
      if (pts.length !== 4) {
        ctx.addIssue({ code: 'custom', message: `Mark all four corners of the ${what} (${pts.length} marked).` });
      }
    })
    .transform((pts) => pts as Quad);

export const referenceSizeSchema = positiveLengthSchema.refine((x) => x <= MAX_REFERENCE_SIZE, {
  message: `Use a reference square of at most ${MAX_REFERENCE_SIZE}″.`,
});

/** POST /api/blocks/:blockId/photo-estimates. Anything else sent (a verdict, sizes) is dropped. */
export const photoEstimateBodySchema = z.object({
  photoId: idParam,
  reference: z.object(
    { corners: corners('reference square'), size: referenceSizeSchema },
    { error: 'Give the reference square: its four corners and its size.' },
  ),
  block: z.object({ corners: corners('block') }, { error: 'Give the four corners of the block.' }),
});
export type PhotoEstimateBody = z.infer<typeof photoEstimateBodySchema>;

export const estimateParamsSchema = z.object({ blockId: idParam });

export interface EstimateTarget {
  width: number;
  height: number;
  tolerance: number;
  squareness: number;
}

export interface PhotoEstimateResult {
  /** inches on the mat, matched to the target's orientation (see `turned`) */
  width: number;
  height: number;
  /** top, right, bottom, left as marked on the photo */
  sides: [number, number, number, number];
  diagonals: [number, number];
  verdict: Verdict;
  deviations: { width: number; height: number; diagonal: number };
  /** one standard deviation from a 2-pixel marking error, inches */
  expectedError: number;
  referencePixels: number;
  obliqueness: number;
  warnings: string[];
  /** a limit lies within the expected error of the estimate: the verdict could go either way */
  borderline: boolean;
  /** the block was photographed sideways: its long side was matched to the target's long side */
  turned: boolean;
}

// Stored as NUMERIC(8,4); the verdict is worked out on the stored values so it can be recomputed.
const four = (x: number) => Math.round(x * 10_000) / 10_000;
const dist = (a: Point, b: Point) => Math.hypot(a[0] - b[0], a[1] - b[1]);
const cross = (a: Point, b: Point, c: Point) => (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);

/** Catches marks on one spot or on one line before the engine, with words that say which. */
function assertMarkable(field: string, what: string, quad: Quad) {
  for (let i = 0; i < 4; i += 1) {
    for (let j = i + 1; j < 4; j += 1) {
      if (dist(quad[i]!, quad[j]!) < MIN_CORNER_GAP) {
        throw new QuiltInputError(
          field,
          `Two corners of the ${what} (${CORNER_NAMES[i]} and ${CORNER_NAMES[j]}) are on the same spot; drag one to its own corner.`,
        );
      }
    }
  }
  const span = Math.max(...quad.flatMap((p) => quad.map((r) => dist(p, r))));
  for (let skip = 0; skip < 4; skip += 1) {
    const [a, b, c] = quad.filter((_, i) => i !== skip) as [Point, Point, Point];
    // Twice the triangle's area against its longest side: how far the middle point is off the line.
    if (Math.abs(cross(a, b, c)) / span < 1) {
      throw new QuiltInputError(field, `Three corners of the ${what} lie on one line; mark the four corners of the ${what}.`);
    }
  }
}

/** True when a corner lies outside a photo of the given size (a pixel of slack on each edge). */
export function outsidePhoto(quad: Quad, width: number, height: number): boolean {
  return quad.some(([x, y]) => x < -1 || y < -1 || x > width + 1 || y > height + 1);
}

/**
 * A block's size and verdict from the corners marked on its photo. Throws QuiltInputError (with
 * the field `reference.corners`, `block.corners` or `reference.size`) for corners that cannot be
 * measured. A non-square target is compared the way round the block was photographed.
 */
export function estimateFromCorners(
  reference: { corners: Quad; size: number },
  block: { corners: Quad },
  target: EstimateTarget,
): PhotoEstimateResult {
  assertMarkable('reference.corners', 'reference square', reference.corners);
  assertMarkable('block.corners', 'block', block.corners);
  const m = measureFromPhoto(reference, block);
  const quality = photoMeasureQuality(reference, block);
  let width = four(m.width);
  let height = four(m.height);
  const turned = (target.width - target.height) * (width - height) < 0;
  if (turned) [width, height] = [height, width];
  const diagonals = m.diagonals.map(four) as [number, number];
  const { verdict, deviations } = checkBlock({
    target: { width: target.width, height: target.height },
    tolerance: target.tolerance,
    squareness: target.squareness,
    measured: { width, height, diagonals },
  });
  const expectedError = four(quality.expectedError);
  const gap = Math.abs(diagonals[0] - diagonals[1]);
  const margins = [
    Math.abs(width - (target.width - target.tolerance)),
    Math.abs(width - (target.width + target.tolerance)),
    Math.abs(height - (target.height - target.tolerance)),
    Math.abs(height - (target.height + target.tolerance)),
    Math.abs(gap - target.squareness),
  ];
  return {
    width,
    height,
    sides: m.sides.map(four) as PhotoEstimateResult['sides'],
    diagonals,
    verdict,
    deviations: { width: four(deviations.width), height: four(deviations.height), diagonal: four(deviations.diagonal ?? 0) },
    expectedError,
    referencePixels: Math.round(quality.referencePixels * 100) / 100,
    obliqueness: four(quality.obliqueness),
    warnings: quality.warnings,
    borderline: Math.min(...margins) < expectedError,
    turned,
  };
}

export interface PhotoEstimateDto extends PhotoEstimateResult {
  id: number;
  blockId: number;
  /** null once the photo was removed; the estimate stays */
  photoId: number | null;
  measuredBy: { id: number; displayName: string } | null;
  reference: { corners: Quad; size: number };
  block: { corners: Quad };
  at: string;
}

/** A block's latest photo estimate as rosters and block answers carry it, beside the ruler verdict. */
export interface LatestPhotoEstimateDto {
  id: number;
  verdict: Verdict;
  width: number;
  height: number;
  expectedError: number;
  borderline: boolean;
  at: string;
}

/** GET /api/blocks/:blockId/photo-estimates: what the measuring view needs, and the history. */
export interface PhotoEstimatesDto {
  block: {
    id: number;
    swapId: number;
    guildId: number;
    sequence: number;
    state: string;
    maker: { id: number; displayName: string };
  };
  swap: {
    id: number;
    title: string;
    state: string;
    unfinished: { width: number; height: number };
    tolerance: number;
    squareness: number;
  };
  photos: { id: number; url: string; thumbUrl: string; width: number; height: number }[];
  /** the caller may add estimates (the maker, or a coordinator or admin, while the swap is open) */
  canEstimate: boolean;
  /** newest first */
  estimates: PhotoEstimateDto[];
}
