/** Photo-estimate rows as the API answers them (the latest one beside a block is blocks/latest-estimate.ts). */
import type { PhotoEstimateDto } from '@shared/schemas/photo-estimates';
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
