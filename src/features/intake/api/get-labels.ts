import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LabelSheetDataDto } from '@shared/schemas/intake';
import { api } from '@/lib/api-client';
import { intakeKeys } from './intake-keys';

/** Labels for the caller's blocks (`me`), one maker's (officers) or all of them (officers). */
export const getLabels = (swapId: number, maker: string) =>
  api.get<LabelSheetDataDto>(`/swaps/${swapId}/labels`, { query: { maker } });
export const labelsQueryOptions = (swapId: number, maker: string) =>
  queryOptions({ queryKey: intakeKeys.labels(swapId, maker), queryFn: () => getLabels(swapId, maker), staleTime: 5 * 60_000 });
export const useLabels = (swapId: number, maker: string) => useQuery(labelsQueryOptions(swapId, maker));
