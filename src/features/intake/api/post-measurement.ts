import type { BlockDto, MeasurementDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';

export interface MeasurementSend {
  width: number;
  height: number;
  diagonals?: [number, number];
}

export type MeasurementAnswer = MeasurementDto & { block: BlockDto };

/** Records a ruler measurement; the server works out its own verdict. Sent from the offline queue. */
export const postMeasurement = (blockId: number, body: MeasurementSend, clientId: string) =>
  api.post<MeasurementAnswer>(`/blocks/${blockId}/measurements`, { ...body, source: 'ruler', clientId }, { allowUnauthenticated: true });
