import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Quad } from '@shared/quilt';
import type { PhotoEstimateDto } from '@shared/schemas/photo-estimates';
import { api } from '@/lib/api-client';
import { photoMeasureKeys } from './photo-measure-keys';

export interface SavePhotoEstimateInput {
  photoId: number;
  reference: { corners: Quad; size: string };
  block: { corners: Quad };
}

/** Sends only the marks and the reference size: the server works out the size and verdict itself. */
export const savePhotoEstimate = (blockId: number, input: SavePhotoEstimateInput) =>
  api.post<PhotoEstimateDto>(`/blocks/${blockId}/photo-estimates`, input);

export function useSavePhotoEstimate(blockId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SavePhotoEstimateInput) => savePhotoEstimate(blockId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: photoMeasureKeys.block(blockId) }),
  });
}
