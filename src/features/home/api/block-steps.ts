import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BlockDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { invalidateSwapData } from '@/entities/block/api/block-keys';
import { nextForMeKeys } from '@/entities/me/api/get-next-for-me';

/** One tap from the home screen: a pledged block is sewn, or a sewn block is handed in at a meeting. */
export type BlockStep = { blockId: number; swapId: number; step: 'sewn' | 'handed-in' };

export const takeBlockStep = ({ blockId, step }: BlockStep) =>
  step === 'sewn'
    ? api.post<BlockDto>(`/blocks/${blockId}/sewn`)
    : api.post<BlockDto>(`/blocks/${blockId}/handed-in`, { how: 'in-person' });

export function useBlockStep() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: takeBlockStep,
    onSettled: (_data, _error, { swapId }) =>
      Promise.all([queryClient.invalidateQueries({ queryKey: nextForMeKeys.all }), invalidateSwapData(queryClient, swapId)]),
  });
}
