import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MeasurementBodyInput } from '@shared/schemas/blocks';
import type { BlockDto, MeasurementDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { newClientId } from '../hooks/client-id';
import { invalidateSwapData } from './swap-keys';

export type MeasurementAnswer = MeasurementDto & { block: BlockDto };

export const measureBlock = (blockId: number, body: MeasurementBodyInput) =>
  api.post<MeasurementAnswer>(`/blocks/${blockId}/measurements`, { clientId: newClientId(), ...body });

export function useMeasureBlock(swapId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ blockId, ...body }: MeasurementBodyInput & { blockId: number }) => measureBlock(blockId, body),
    onSettled: () => invalidateSwapData(queryClient, swapId),
  });
}
