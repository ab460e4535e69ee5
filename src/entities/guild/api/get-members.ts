import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MemberDto } from '@shared/types';
import { api } from '@/lib/api-client';
import { swapKeys } from './swap-keys';

/** The guild's members, to choose a gift recipient from. */
export const getGuildMembers = (guildId: number) => api.get<MemberDto[]>(`/guilds/${guildId}/members`);
export const guildMembersQueryOptions = (guildId: number) =>
  queryOptions({ queryKey: swapKeys.members(guildId), queryFn: () => getGuildMembers(guildId) });
export const useGuildMembers = (guildId: number) => useQuery(guildMembersQueryOptions(guildId));
