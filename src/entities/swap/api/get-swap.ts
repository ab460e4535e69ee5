import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SwapDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { swapKeys } from './swap-keys';

export const getSwap = (swapId: number) => api.get<SwapDto>(`/swaps/${swapId}`);
export const swapQueryOptions = (swapId: number) =>
  queryOptions({ queryKey: swapKeys.detail(swapId), queryFn: () => getSwap(swapId) });
export const useSwap = (swapId: number) => useQuery(swapQueryOptions(swapId));
