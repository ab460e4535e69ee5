import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RsvpAnswer, SewDayDetailDto } from '@shared/schemas/sewdays';
import { api } from '@/lib/api-client';
import { sewDayKeys } from './sew-day-keys';

export const answerRsvp = (sewDayId: number, answer: RsvpAnswer) =>
  api.put<SewDayDetailDto>(`/sew-days/${sewDayId}/rsvp`, { answer });

export function useAnswerRsvp(guildId: number, sewDayId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (answer: RsvpAnswer) => answerRsvp(sewDayId, answer),
    onSuccess: (sewDay) => {
      queryClient.setQueryData(sewDayKeys.detail(sewDayId), sewDay);
      return queryClient.invalidateQueries({ queryKey: sewDayKeys.lists(guildId) });
    },
  });
}
