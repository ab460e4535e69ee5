import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MeasurementBodyInput } from '@shared/schemas/blocks';
import type { BlockDto, MeasurementDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { newClientId } from '@/lib/client-id';
import { invalidateSwapData } from './block-keys';

export type MeasurementAnswer = MeasurementDto & { block: BlockDto };

/** The lengths of one measurement in inches, as the intake's offline queue keeps them. */
export interface MeasurementSend {
  width: number;
  height: number;
  diagonals?: [number, number];
}

/**
 * Records a measurement; the server works out its own verdict. The clientId makes a resend harmless.
 * The intake's offline queue passes `allowUnauthenticated` so a lapsed session is reported to the queue
 * instead of leaving the page.
 */
export const measureBlock = (blockId: number, body: MeasurementBodyInput, opts: { allowUnauthenticated?: boolean } = {}) =>
  api.post<MeasurementAnswer>(`/blocks/${blockId}/measurements`, { clientId: newClientId(), ...body }, opts);

export function useMeasureBlock(swapId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ blockId, ...body }: MeasurementBodyInput & { blockId: number }) => measureBlock(blockId, body),
    onSettled: () => invalidateSwapData(queryClient, swapId),
  });
}
