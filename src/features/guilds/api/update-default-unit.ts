import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Units } from '@shared/schemas/auth';
import type { GuildDto } from '@shared/types';
import { api } from '@/lib/api-client';
import { guildKeys } from '@/entities/guild/api/guild-keys';
import { meKeys } from '@/entities/me/api/me-keys';

export const updateDefaultUnit = (guildId: number, defaultUnit: Units) =>
  api.patch<GuildDto>(`/guilds/${guildId}`, { defaultUnit });

/** Admins: what a bare number means in this guild for members who have not chosen a unit of their own. */
export function useUpdateDefaultUnit(guildId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (unit: Units) => updateDefaultUnit(guildId, unit),
    onSuccess: (guild) => queryClient.setQueryData(guildKeys.detail(guildId), guild),
    onSettled: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: guildKeys.all }),
        queryClient.invalidateQueries({ queryKey: meKeys.me() }),
      ]),
  });
}
