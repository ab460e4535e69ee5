import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AcceptBlockInput } from '@shared/schemas/blocks';
import type { BlockDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { invalidateSwapData } from '@/entities/block/api/block-keys';

export const acceptBlock = (blockId: number, body: AcceptBlockInput) => api.post<BlockDto>(`/blocks/${blockId}/accept`, body);

export function useAcceptBlock(swapId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ blockId, ...body }: AcceptBlockInput & { blockId: number }) => acceptBlock(blockId, body),
    onSettled: () => invalidateSwapData(queryClient, swapId),
  });
}
