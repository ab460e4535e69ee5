import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SwapTransitionDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { swapKeys } from '@/entities/swap/api/swap-keys';

export const getTransitions = (swapId: number) => api.get<SwapTransitionDto[]>(`/swaps/${swapId}/transitions`);
export const transitionsQueryOptions = (swapId: number) =>
  queryOptions({ queryKey: swapKeys.transitions(swapId), queryFn: () => getTransitions(swapId) });
export const useTransitions = (swapId: number) => useQuery(transitionsQueryOptions(swapId));
