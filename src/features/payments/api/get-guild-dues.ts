import { queryOptions, useQuery } from '@tanstack/react-query';
import type { GuildDuesDto } from '@shared/schemas/payments';
import { api } from '@/lib/api-client';
import { paymentKeys } from '@/entities/payment/api/payment-keys';

export const getGuildDues = (guildId: number) => api.get<GuildDuesDto>(`/guilds/${guildId}/dues`);
export const guildDuesQueryOptions = (guildId: number) =>
  queryOptions({ queryKey: paymentKeys.dues(guildId), queryFn: () => getGuildDues(guildId) });
export const useGuildDues = (guildId: number) => useQuery(guildDuesQueryOptions(guildId));
