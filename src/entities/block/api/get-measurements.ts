import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MeasurementDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { blockKeys } from './block-keys';

export const getMeasurements = (blockId: number) => api.get<MeasurementDto[]>(`/blocks/${blockId}/measurements`);
export const measurementsQueryOptions = (blockId: number) =>
  queryOptions({ queryKey: blockKeys.measurements(blockId), queryFn: () => getMeasurements(blockId) });
export const useMeasurements = (blockId: number, enabled = true) => useQuery({ ...measurementsQueryOptions(blockId), enabled });
