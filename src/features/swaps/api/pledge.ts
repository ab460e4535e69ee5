import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SignupDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { swapKeys } from '@/entities/swap/api/swap-keys';

export const pledge = (swapId: number, blocks: number) => api.post<SignupDto>(`/swaps/${swapId}/signups`, { blocks });

/** Signs up or changes the pledge; the swap, its roster and the caller's blocks all change. */
export function usePledge(swapId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (blocks: number) => pledge(swapId, blocks),
    onSettled: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: swapKeys.detail(swapId) }),
        queryClient.invalidateQueries({ queryKey: swapKeys.lists() }),
      ]),
  });
}
