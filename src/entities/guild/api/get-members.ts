import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MemberDto } from '@shared/types';
import { api } from '@/lib/api-client';
import { guildKeys } from './guild-keys';

/** The guild's members with their roles (the members page; the gift-recipient picker). */
export const getMembers = (guildId: number) => api.get<MemberDto[]>(`/guilds/${guildId}/members`);
export const membersQueryOptions = (guildId: number) =>
  queryOptions({ queryKey: guildKeys.members(guildId), queryFn: () => getMembers(guildId) });
export const useMembers = (guildId: number) => useQuery(membersQueryOptions(guildId));
