import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SewDayDetailDto, SewDayFormValues } from '@shared/schemas/sewdays';
import { api } from '@/lib/api-client';
import { sewDayKeys } from './sew-day-keys';

export const scheduleSewDay = (guildId: number, input: SewDayFormValues) =>
  api.post<SewDayDetailDto>(`/guilds/${guildId}/sew-days`, input);

export function useScheduleSewDay(guildId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SewDayFormValues) => scheduleSewDay(guildId, input),
    onSuccess: (sewDay) => {
      queryClient.setQueryData(sewDayKeys.detail(sewDay.id), sewDay);
      return queryClient.invalidateQueries({ queryKey: sewDayKeys.lists(guildId) });
    },
  });
}
