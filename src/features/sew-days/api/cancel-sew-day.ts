import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SewDayDetailDto } from '@shared/schemas/sewdays';
import { api } from '@/lib/api-client';
import { sewDayKeys } from './sew-day-keys';

export const cancelSewDay = (sewDayId: number) => api.post<SewDayDetailDto>(`/sew-days/${sewDayId}/cancel`);

export function useCancelSewDay(guildId: number, sewDayId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => cancelSewDay(sewDayId),
    onSuccess: (sewDay) => {
      queryClient.setQueryData(sewDayKeys.detail(sewDayId), sewDay);
      return queryClient.invalidateQueries({ queryKey: sewDayKeys.lists(guildId) });
    },
  });
}
