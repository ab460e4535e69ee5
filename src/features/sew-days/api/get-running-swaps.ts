import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SwapSummaryDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { sewDayKeys } from './sew-day-keys';

const running = new Set(['signup', 'sewing', 'collecting', 'sorting']);

/** The guild's swaps that are under way, for links to their live boards. */
export const getRunningSwaps = (guildId: number) =>
  api.get<SwapSummaryDto[]>(`/guilds/${guildId}/swaps`).then((swaps) => swaps.filter((s) => running.has(s.state)));
export const runningSwapsQueryOptions = (guildId: number) =>
  queryOptions({ queryKey: sewDayKeys.swaps(guildId), queryFn: () => getRunningSwaps(guildId) });
export const useRunningSwaps = (guildId: number) => useQuery(runningSwapsQueryOptions(guildId));
