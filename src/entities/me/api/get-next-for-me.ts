import { queryOptions, useQuery } from '@tanstack/react-query';
import type { NextForMeDto } from '@shared/schemas/home';
import { api } from '@/lib/api-client';

/** Keys of the home screen's "what is next for me"; not kept across sign-out (unlike the person's own keys). */
export const nextForMeKeys = {
  all: ['next-for-me'] as const,
};

export const getNextForMe = () => api.get<NextForMeDto>('/me/next');
export const nextForMeQueryOptions = () =>
  queryOptions({ queryKey: nextForMeKeys.all, queryFn: getNextForMe, staleTime: 30_000 });
export const useNextForMe = () => useQuery(nextForMeQueryOptions());
