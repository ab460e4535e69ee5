import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MeDto } from '@shared/types';
import { api, ApiError } from '@/lib/api-client';
import { meKeys } from './me-keys';

/** The signed-in person, or null when signed out (asked of the session probe, which answers a visitor with 204, not a logged 401). */
export async function getMe(): Promise<MeDto | null> {
  try {
    return (await api.get<MeDto | undefined>('/session', { allowUnauthenticated: true })) ?? null;
  } catch (error) {
    if (error instanceof ApiError && error.status === 401) return null;
    throw error;
  }
}

export const meQueryOptions = () => queryOptions({ queryKey: meKeys.me(), queryFn: getMe, staleTime: 60_000 });

export function useMe() {
  return useQuery(meQueryOptions());
}
