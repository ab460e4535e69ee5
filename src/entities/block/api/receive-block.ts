import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BlockDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { newClientId } from '@/lib/client-id';
import { invalidateSwapData } from './block-keys';

/**
 * Marks a block received. A clientId makes a repeat (a double tap, a retry after a dropped connection)
 * harmless; the intake's offline queue passes `allowUnauthenticated` so a lapsed session is reported
 * to the queue instead of leaving the page.
 */
export const receiveBlock = (blockId: number, clientId: string = newClientId(), opts: { allowUnauthenticated?: boolean } = {}) =>
  api.post<BlockDto>(`/blocks/${blockId}/received`, { clientId }, opts);

export function useReceiveBlock(swapId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (blockId: number) => receiveBlock(blockId),
    onSettled: () => invalidateSwapData(queryClient, swapId),
  });
}
