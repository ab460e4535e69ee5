import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateGuildInput } from '@shared/schemas/guilds';
import type { GuildDto } from '@shared/types';
import { api } from '@/lib/api-client';
import { meKeys } from '@/entities/me/api/me-keys';
import { guildKeys } from '@/entities/guild/api/guild-keys';

export const createGuild = (input: CreateGuildInput) => api.post<GuildDto>('/guilds', input);

export function useCreateGuild() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createGuild,
    onSuccess: (guild) => {
      queryClient.setQueryData(guildKeys.detail(guild.id), guild);
      return queryClient.invalidateQueries({ queryKey: guildKeys.lists() });
    },
    // The session's list of memberships changes too.
    onSettled: () => queryClient.invalidateQueries({ queryKey: meKeys.all }),
  });
}
