import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DesignDto, DesignInput } from '@shared/schemas/designs';
import { api } from '@/lib/api-client';
import { designKeys } from './design-keys';

export const saveDesign = (swapId: number, body: DesignInput) => api.put<DesignDto>(`/swaps/${swapId}/design`, body);

/** Saves the layout; the cache keeps the saved answer (the page keeps its own working copy). */
export function useSaveDesign(swapId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: DesignInput) => saveDesign(swapId, body),
    onSuccess: (design) => queryClient.setQueryData(designKeys.detail(swapId), design),
  });
}
