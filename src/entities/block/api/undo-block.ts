import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BlockDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { invalidateSwapData } from './block-keys';

/** Reverts the block's latest step; the answer says which step in `undone`. */
export const undoBlock = (blockId: number) => api.post<BlockDto & { undone: string }>(`/blocks/${blockId}/undo`);

export function useUndoBlock(swapId: number) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: undoBlock, onSettled: () => invalidateSwapData(queryClient, swapId) });
}
