import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BlockDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { invalidateSwapData } from '@/entities/block/api/block-keys';

export const markSewn = (blockId: number) => api.post<BlockDto>(`/blocks/${blockId}/sewn`);

export function useMarkSewn(swapId: number) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: markSewn, onSettled: () => invalidateSwapData(queryClient, swapId) });
}
