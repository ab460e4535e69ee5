import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { GuildDto } from '@shared/types';
import { api } from '@/lib/api-client';
import { guildKeys } from '@/entities/guild/api/guild-keys';
import { paymentKeys } from '@/entities/payment/api/payment-keys';

export interface GuildPaymentSettings {
  currency?: string;
  dues?: { amount: number; year: number } | null;
}

export const updateGuildPayments = (guildId: number, body: GuildPaymentSettings) =>
  api.patch<GuildDto>(`/guilds/${guildId}`, body);

export function useUpdateGuildPayments(guildId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: GuildPaymentSettings) => updateGuildPayments(guildId, body),
    onSuccess: (guild) => {
      queryClient.setQueryData(guildKeys.detail(guildId), guild);
      return queryClient.invalidateQueries({ queryKey: paymentKeys.dues(guildId) });
    },
  });
}
