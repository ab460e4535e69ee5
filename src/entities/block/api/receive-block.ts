import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BlockDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { newClientId } from '../hooks/client-id';
import { invalidateSwapData } from './swap-keys';

/** A clientId makes a repeat (a double tap, a retry after a dropped connection) harmless. */
export const receiveBlock = (blockId: number, clientId: string = newClientId()) =>
  api.post<BlockDto>(`/blocks/${blockId}/received`, { clientId });

export function useReceiveBlock(swapId: number) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: (blockId: number) => receiveBlock(blockId), onSettled: () => invalidateSwapData(queryClient, swapId) });
}
