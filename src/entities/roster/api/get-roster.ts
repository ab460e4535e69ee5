import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RosterDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { swapKeys } from './swap-keys';

export const getRoster = (swapId: number) => api.get<RosterDto>(`/swaps/${swapId}/roster`);
export const rosterQueryOptions = (swapId: number) => queryOptions({ queryKey: swapKeys.roster(swapId), queryFn: () => getRoster(swapId) });
export const useRoster = (swapId: number) => useQuery(rosterQueryOptions(swapId));
