import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { VerdictsVisibleTo } from '@shared/schemas/guilds';
import type { GuildDto } from '@shared/types';
import { api } from '@/lib/api-client';
import { guildKeys } from '@/entities/guild/api/guild-keys';

export const updateVerdictVisibility = (guildId: number, verdictsVisibleTo: VerdictsVisibleTo) =>
  api.patch<GuildDto>(`/guilds/${guildId}`, { verdictsVisibleTo });

/** Admins: who sees the verdicts on other makers' blocks. */
export function useUpdateVerdictVisibility(guildId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (to: VerdictsVisibleTo) => updateVerdictVisibility(guildId, to),
    onSuccess: (guild) => queryClient.setQueryData(guildKeys.detail(guildId), guild),
    onSettled: () => queryClient.invalidateQueries({ queryKey: guildKeys.all }),
  });
}
