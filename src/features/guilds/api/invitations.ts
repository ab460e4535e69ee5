import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CreateInvitationInput } from '@shared/schemas/guilds';
import type { InvitationDto, InvitationPreviewDto } from '@shared/types';
import { api } from '@/lib/api-client';
import { meKeys } from '@/entities/me/api/me-keys';
import { guildKeys } from '@/entities/guild/api/guild-keys';

export const getInvitations = (guildId: number) => api.get<InvitationDto[]>(`/guilds/${guildId}/invitations`);
export const invitationsQueryOptions = (guildId: number) =>
  queryOptions({ queryKey: guildKeys.invitations(guildId), queryFn: () => getInvitations(guildId) });
export const useInvitations = (guildId: number, enabled = true) => useQuery({ ...invitationsQueryOptions(guildId), enabled });

export function useCreateInvitation(guildId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateInvitationInput) => api.post<InvitationDto>(`/guilds/${guildId}/invitations`, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: guildKeys.invitations(guildId) }),
  });
}

export function useRevokeInvitation(guildId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: number) => api.delete<void>(`/guilds/${guildId}/invitations/${invitationId}`),
    onSettled: () => queryClient.invalidateQueries({ queryKey: guildKeys.invitations(guildId) }),
  });
}

export const getInvitationPreview = (token: string) =>
  api.get<InvitationPreviewDto>(`/invitations/${encodeURIComponent(token)}`, { allowUnauthenticated: true });
export const useInvitationPreview = (token: string) =>
  useQuery({ queryKey: guildKeys.invitationPreview(token), queryFn: () => getInvitationPreview(token), retry: false });

export function useAcceptInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (token: string) =>
      api.post<{ guildId: number; guildName: string; role: string }>(`/invitations/${encodeURIComponent(token)}/accept`),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: guildKeys.all }),
        queryClient.invalidateQueries({ queryKey: meKeys.all }),
      ]),
  });
}
