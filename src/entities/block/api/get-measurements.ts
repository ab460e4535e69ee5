import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MeasurementDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { swapKeys } from './swap-keys';

export const getMeasurements = (blockId: number) => api.get<MeasurementDto[]>(`/blocks/${blockId}/measurements`);
export const measurementsQueryOptions = (blockId: number) =>
  queryOptions({ queryKey: swapKeys.measurements(blockId), queryFn: () => getMeasurements(blockId) });
export const useMeasurements = (blockId: number, enabled = true) => useQuery({ ...measurementsQueryOptions(blockId), enabled });
