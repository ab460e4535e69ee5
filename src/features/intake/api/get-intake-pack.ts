import { queryOptions, useQuery } from '@tanstack/react-query';
import type { IntakePackDto } from '@shared/schemas/intake';
import { api, ApiError } from '@/lib/api-client';
import { loadPack, savePack, type StoredPack } from '../offline/intake-db';
import { intakeKeys } from './intake-keys';

export type IntakePack = StoredPack & { fromDevice: boolean };

/**
 * The swap's intake pack: fresh from the server and kept on the device, or the kept copy when the
 * server cannot be reached. Refusals (403, 404) are not hidden behind an old copy.
 */
export async function getIntakePack(swapId: number): Promise<IntakePack> {
  try {
    const pack = await api.get<IntakePackDto>(`/swaps/${swapId}/intake`);
    return { ...(await savePack(pack)), fromDevice: false };
  } catch (error) {
    const unreachable = error instanceof ApiError && (error.status === 0 || error.status >= 500);
    const kept = unreachable ? await loadPack(swapId) : undefined;
    if (!kept) throw error;
    return { ...kept, fromDevice: true };
  }
}

export const intakePackQueryOptions = (swapId: number) =>
  queryOptions({
    queryKey: intakeKeys.pack(swapId),
    queryFn: () => getIntakePack(swapId),
    // Runs without a network too: the kept copy answers. Local changes are written into it as they happen.
    networkMode: 'always',
    staleTime: Infinity,
    refetchOnWindowFocus: false,
    retry: false,
  });

export const useIntakePack = (swapId: number) => useQuery(intakePackQueryOptions(swapId));
