import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RosterDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { rosterKeys } from './roster-keys';

/** The swap's roster (GET /api/swaps/:swapId/roster); `useRosterLive` keeps it current from board changes. */
export const getRoster = (swapId: number) => api.get<RosterDto>(`/swaps/${swapId}/roster`);
export const rosterQueryOptions = (swapId: number) =>
  queryOptions({ queryKey: rosterKeys.detail(swapId), queryFn: () => getRoster(swapId), staleTime: 5 * 60_000 });
export const useRoster = (swapId: number) => useQuery(rosterQueryOptions(swapId));
