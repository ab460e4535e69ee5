/** The latest photo estimate of a block as the block and roster answers show it, beside the ruler verdict. */
import type { Verdict } from '@shared/quilt';
import type { LatestPhotoEstimateDto } from '@shared/schemas/photo-estimates';

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
