import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ActivityDto } from '@shared/live-events';
import { api } from '@/lib/api-client';
import { liveBoardKeys } from './live-board-keys';

export const ACTIVITY_SHOWN = 20;

/** A page of a swap's activity, newest first; `before` is the id of the oldest line already shown. */
export const getActivity = (swapId: number, before?: number) =>
  api.get<ActivityDto[]>(`/swaps/${swapId}/activity`, { query: { limit: ACTIVITY_SHOWN, before } });
export const activityQueryOptions = (swapId: number) =>
  queryOptions({ queryKey: liveBoardKeys.activity(swapId), queryFn: () => getActivity(swapId), staleTime: 5 * 60_000 });
export const useActivity = (swapId: number) => useQuery(activityQueryOptions(swapId));
