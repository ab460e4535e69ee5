/** Photo-estimate rows as the API answers them, and the latest estimate of a block as the block answers show it. */
import type { Verdict } from '@shared/quilt';
import type { LatestPhotoEstimateDto, PhotoEstimateDto } from '@shared/schemas/photo-estimates';
import type { PhotoEstimate } from '../db/models';

export function estimateDto(row: PhotoEstimate): PhotoEstimateDto {
  return {
    id: row.id,
    blockId: row.blockId,
    photoId: row.photoId,
    measuredBy: row.measuredBy ? { id: row.measuredBy.id, displayName: row.measuredBy.displayName } : null,
    reference: { corners: row.referenceCorners, size: row.referenceSize },
    block: { corners: row.blockCorners },
    width: row.width,
    height: row.height,
    sides: [row.sideTop, row.sideRight, row.sideBottom, row.sideLeft],
    diagonals: [row.diagonal1, row.diagonal2],
    turned: row.turned,
    verdict: row.verdict,
    deviations: { width: row.deviationWidth, height: row.deviationHeight, diagonal: row.deviationDiagonal },
    expectedError: row.expectedError,
    borderline: row.borderline,
    referencePixels: row.referencePixels,
    obliqueness: row.obliqueness,
    warnings: row.warnings,
    at: row.createdAt.toISOString(),
  };
}

/** A latest-estimate row: NUMERIC and times as pg gives them, or as numbers and ISO strings from JSON. */
export interface LatestEstimateRow {
  id: number;
  block_id: number;
  verdict: Verdict;
  width: string | number;
  height: string | number;
  expected_error: string | number;
  borderline: boolean;
  created_at: Date | string;
}

export function latestEstimateDto(r: LatestEstimateRow): LatestPhotoEstimateDto {
  return {
    id: r.id,
    verdict: r.verdict,
    width: Number(r.width),
    height: Number(r.height),
    expectedError: Number(r.expected_error),
    borderline: r.borderline,
    at: new Date(r.created_at).toISOString(),
  };
}

export function latestEstimateDtos(rows: LatestEstimateRow[]): Map<number, LatestPhotoEstimateDto> {
  return new Map(rows.map((r) => [r.block_id, latestEstimateDto(r)]));
}

export const LATEST_ESTIMATES = `SELECT DISTINCT ON (e.block_id) e.id, e.block_id, e.verdict, e.width, e.height, e.expected_error, e.borderline, e.created_at
                  FROM photo_estimates e`;
export const NEWEST_ESTIMATE_FIRST = 'ORDER BY e.block_id, e.created_at DESC, e.id DESC';
