import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Role } from '@shared/schemas/guilds';
import type { MemberDto } from '@shared/types';
import { api } from '@/lib/api-client';
import { guildKeys } from '@/entities/guild/api/guild-keys';

export function useChangeRole(guildId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, role }: { userId: number; role: Role }) =>
      api.patch<MemberDto>(`/guilds/${guildId}/members/${userId}`, { role }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: guildKeys.detail(guildId) }),
  });
}

export function useRemoveMember(guildId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (userId: number) => api.delete<void>(`/guilds/${guildId}/members/${userId}`),
    onSettled: () => queryClient.invalidateQueries({ queryKey: guildKeys.detail(guildId) }),
  });
}
