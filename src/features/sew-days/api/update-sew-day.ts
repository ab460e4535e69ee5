import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SewDayDetailDto, SewDayFormValues } from '@shared/schemas/sewdays';
import { api } from '@/lib/api-client';
import { sewDayKeys } from './sew-day-keys';

export const updateSewDay = (sewDayId: number, input: Partial<SewDayFormValues>) =>
  api.patch<SewDayDetailDto>(`/sew-days/${sewDayId}`, input);

export function useUpdateSewDay(guildId: number, sewDayId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: Partial<SewDayFormValues>) => updateSewDay(sewDayId, input),
    onSuccess: (sewDay) => {
      queryClient.setQueryData(sewDayKeys.detail(sewDayId), sewDay);
      return queryClient.invalidateQueries({ queryKey: sewDayKeys.lists(guildId) });
    },
  });
}
