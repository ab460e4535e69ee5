/** Photo-estimate rows as the API answers them, and the latest estimate of many blocks at once. */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
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

interface LatestRow {
  id: number;
  block_id: number;
  verdict: Verdict;
  width: string;
  height: string;
  expected_error: string;
  borderline: boolean;
  created_at: Date;
}

function toLatest(rows: LatestRow[]): Map<number, LatestPhotoEstimateDto> {
  const byBlock = new Map<number, LatestPhotoEstimateDto>();
  for (const r of rows) {
    byBlock.set(r.block_id, {
      id: r.id,
      verdict: r.verdict,
      width: Number(r.width),
      height: Number(r.height),
      expectedError: Number(r.expected_error),
      borderline: r.borderline,
      at: new Date(r.created_at).toISOString(),
    });
  }
  return byBlock;
}

const LATEST = `SELECT DISTINCT ON (e.block_id) e.id, e.block_id, e.verdict, e.width, e.height, e.expected_error, e.borderline, e.created_at
                  FROM photo_estimates e`;
const NEWEST_FIRST = 'ORDER BY e.block_id, e.created_at DESC, e.id DESC';

/** The latest photo estimate of each block, in one query; blocks without one are absent. */
export async function latestPhotoEstimates(sequelize: Sequelize, blockIds: number[], transaction?: Transaction): Promise<Map<number, LatestPhotoEstimateDto>> {
  if (blockIds.length === 0) return new Map();
  const rows = await sequelize.query<LatestRow>(`${LATEST} WHERE e.block_id = ANY($ids::int[]) ${NEWEST_FIRST}`, {
    bind: { ids: blockIds }, type: QueryTypes.SELECT, transaction,
  });
  return toLatest(rows);
}

/** The latest photo estimate of every block of a swap, in one query. */
export async function latestPhotoEstimatesBySwap(sequelize: Sequelize, swapId: number, transaction?: Transaction): Promise<Map<number, LatestPhotoEstimateDto>> {
  const rows = await sequelize.query<LatestRow>(`${LATEST} JOIN blocks b ON b.id = e.block_id WHERE b.swap_id = $swapId ${NEWEST_FIRST}`, {
    bind: { swapId }, type: QueryTypes.SELECT, transaction,
  });
  return toLatest(rows);
}
