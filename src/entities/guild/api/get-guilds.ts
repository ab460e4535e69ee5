import { queryOptions, useQuery } from '@tanstack/react-query';
import type { GuildDto } from '@shared/types';
import { api } from '@/lib/api-client';
import { guildKeys } from './guild-keys';

export const getGuilds = () => api.get<GuildDto[]>('/guilds');
export const guildsQueryOptions = () => queryOptions({ queryKey: guildKeys.lists(), queryFn: getGuilds });
export const useGuilds = () => useQuery(guildsQueryOptions());
