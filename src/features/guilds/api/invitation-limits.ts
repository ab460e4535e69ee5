import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvitationLimitsDto } from '@shared/types';
import { api } from '@/lib/api-client';
import { guildKeys } from '@/entities/guild/api/guild-keys';

export const getInvitationLimits = (guildId: number) => api.get<InvitationLimitsDto>(`/guilds/${guildId}/invitations/limits`);

// Under the invitations key: sending or withdrawing an invitation refreshes the counts too.
export const invitationLimitsQueryOptions = (guildId: number) =>
  queryOptions({ queryKey: [...guildKeys.invitations(guildId), 'limits'] as const, queryFn: () => getInvitationLimits(guildId) });

export const useInvitationLimits = (guildId: number) => useQuery(invitationLimitsQueryOptions(guildId));
