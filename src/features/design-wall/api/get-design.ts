import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DesignDto } from '@shared/schemas/designs';
import { api } from '@/lib/api-client';
import { designKeys } from './design-keys';

/** The caller's own design of a swap (a first layout before the first save). */
export const getDesign = (swapId: number) => api.get<DesignDto>(`/swaps/${swapId}/design`);
export const designQueryOptions = (swapId: number) =>
  queryOptions({ queryKey: designKeys.detail(swapId), queryFn: () => getDesign(swapId), staleTime: Infinity });
export const useDesign = (swapId: number) => useQuery(designQueryOptions(swapId));
