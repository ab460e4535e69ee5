import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ActivityDto } from '@shared/live-events';
import { api } from '@/lib/api-client';
import { liveBoardKeys } from './live-board-keys';

export const ACTIVITY_SHOWN = 20;

export const getActivity = (swapId: number) =>
  api.get<ActivityDto[]>(`/swaps/${swapId}/activity`, { query: { limit: ACTIVITY_SHOWN } });
export const activityQueryOptions = (swapId: number) =>
  queryOptions({ queryKey: liveBoardKeys.activity(swapId), queryFn: () => getActivity(swapId), staleTime: 5 * 60_000 });
export const useActivity = (swapId: number) => useQuery(activityQueryOptions(swapId));
