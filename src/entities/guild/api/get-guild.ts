import { queryOptions, useQuery } from '@tanstack/react-query';
import type { GuildDto } from '@shared/types';
import { api } from '@/lib/api-client';
import { guildKeys } from './guild-keys';

export const getGuild = (guildId: number) => api.get<GuildDto>(`/guilds/${guildId}`);
export const guildQueryOptions = (guildId: number) =>
  queryOptions({ queryKey: guildKeys.detail(guildId), queryFn: () => getGuild(guildId) });
export const useGuild = (guildId: number) => useQuery(guildQueryOptions(guildId));
