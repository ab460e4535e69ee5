import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SwapSummaryDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { swapKeys } from './swap-keys';

export const getSwaps = (guildId: number) => api.get<SwapSummaryDto[]>(`/guilds/${guildId}/swaps`);
export const swapsQueryOptions = (guildId: number) =>
  queryOptions({ queryKey: swapKeys.list(guildId), queryFn: () => getSwaps(guildId) });
export const useSwaps = (guildId: number) => useQuery(swapsQueryOptions(guildId));
