import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { HandInInput } from '@shared/schemas/blocks';
import type { BlockDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { invalidateSwapData } from '@/entities/block/api/block-keys';

export const handIn = (blockId: number, body: HandInInput) => api.post<BlockDto>(`/blocks/${blockId}/handed-in`, body);

export function useHandIn(swapId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ blockId, ...body }: HandInInput & { blockId: number }) => handIn(blockId, body),
    onSettled: () => invalidateSwapData(queryClient, swapId),
  });
}
