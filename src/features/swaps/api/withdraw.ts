import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { swapKeys } from '@/entities/swap/api/swap-keys';

export const withdraw = (swapId: number) => api.delete<void>(`/swaps/${swapId}/signups/me`);

export function useWithdraw(swapId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => withdraw(swapId),
    onSettled: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: swapKeys.detail(swapId) }),
        queryClient.invalidateQueries({ queryKey: swapKeys.lists() }),
      ]),
  });
}
