import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SewDayListDto } from '@shared/schemas/sewdays';
import { api } from '@/lib/api-client';
import { sewDayKeys, type SewDayWhen } from './sew-day-keys';

export const getSewDays = (guildId: number, when: SewDayWhen) =>
  api.get<SewDayListDto>(`/guilds/${guildId}/sew-days`, { query: { when } });
export const sewDaysQueryOptions = (guildId: number, when: SewDayWhen) =>
  queryOptions({ queryKey: sewDayKeys.list(guildId, when), queryFn: () => getSewDays(guildId, when) });
export const useSewDays = (guildId: number, when: SewDayWhen) => useQuery(sewDaysQueryOptions(guildId, when));
