import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { GuildPaymentsDto, PaymentKind, PaymentStatus } from '@shared/schemas/payments';
import { api } from '@/lib/api-client';
import { paymentKeys } from '@/entities/payment/api/payment-keys';

export interface PaymentFilters {
  status?: PaymentStatus;
  kind?: PaymentKind;
  swapId?: number;
  year?: number;
}

export const getGuildPayments = (guildId: number, filters: PaymentFilters) =>
  api.get<GuildPaymentsDto>(`/guilds/${guildId}/payments`, { query: { ...filters } });
export const guildPaymentsQueryOptions = (guildId: number, filters: PaymentFilters) =>
  queryOptions({
    queryKey: paymentKeys.guild(guildId, { ...filters }),
    queryFn: () => getGuildPayments(guildId, filters),
    placeholderData: keepPreviousData,
  });
export const useGuildPayments = (guildId: number, filters: PaymentFilters) =>
  useQuery(guildPaymentsQueryOptions(guildId, filters));

/** The same list as a CSV file, for the link's href. */
export function guildPaymentsCsvUrl(guildId: number, filters: PaymentFilters) {
  const query = new URLSearchParams({ format: 'csv' });
  for (const [k, v] of Object.entries(filters)) if (v !== undefined) query.set(k, String(v));
  return `/api/guilds/${guildId}/payments?${query}`;
}
