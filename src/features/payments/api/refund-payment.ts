import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { GuildPaymentDto } from '@shared/schemas/payments';
import { api } from '@/lib/api-client';
import { paymentKeys } from '@/entities/payment/api/payment-keys';

export const refundPayment = (guildId: number, paymentId: number) =>
  api.post<GuildPaymentDto>(`/guilds/${guildId}/payments/${paymentId}/refund`, {});

export function useRefundPayment(guildId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (paymentId: number) => refundPayment(guildId, paymentId),
    onSettled: () => queryClient.invalidateQueries({ queryKey: paymentKeys.all }),
  });
}
