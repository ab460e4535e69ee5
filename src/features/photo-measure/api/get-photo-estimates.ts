import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PhotoEstimatesDto } from '@shared/schemas/photo-estimates';
import { api } from '@/lib/api-client';
import { photoMeasureKeys } from './photo-measure-keys';

/** The block, its swap's target, its photos and its photo estimates (newest first). */
export const getPhotoEstimates = (blockId: number) => api.get<PhotoEstimatesDto>(`/blocks/${blockId}/photo-estimates`);
export const photoEstimatesQueryOptions = (blockId: number) =>
  queryOptions({ queryKey: photoMeasureKeys.estimates(blockId), queryFn: () => getPhotoEstimates(blockId) });
export const usePhotoEstimates = (blockId: number) => useQuery(photoEstimatesQueryOptions(blockId));
