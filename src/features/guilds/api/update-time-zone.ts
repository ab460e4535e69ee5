import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { GuildDto } from '@shared/types';
import { api } from '@/lib/api-client';
import { guildKeys } from '@/entities/guild/api/guild-keys';
import { swapKeys } from '@/entities/swap/api/swap-keys';

export const updateTimeZone = (guildId: number, timeZone: string) => api.patch<GuildDto>(`/guilds/${guildId}`, { timeZone });

/** Admins: the zone every date of the guild is shown, mailed and exported in. Swaps carry it too, so they refresh. */
export function useUpdateTimeZone(guildId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (timeZone: string) => updateTimeZone(guildId, timeZone),
    onSuccess: (guild) => queryClient.setQueryData(guildKeys.detail(guildId), guild),
    onSettled: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: guildKeys.all }),
        queryClient.invalidateQueries({ queryKey: swapKeys.all }),
      ]),
  });
}
