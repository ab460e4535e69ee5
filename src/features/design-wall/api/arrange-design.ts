import { useMutation } from '@tanstack/react-query';
import type { ArrangeDto, DesignInput } from '@shared/schemas/designs';
import { api } from '@/lib/api-client';

/** Asks for a colour-spreading arrangement of the layout on screen; nothing is saved. */
export const arrangeDesign = (swapId: number, body: DesignInput) => api.post<ArrangeDto>(`/swaps/${swapId}/design/arrange`, body);

export function useArrangeDesign(swapId: number) {
  return useMutation({ mutationFn: (body: DesignInput) => arrangeDesign(swapId, body) });
}
