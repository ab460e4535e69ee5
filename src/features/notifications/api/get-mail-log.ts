import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { MailLogDto, MailLogQuery } from '@shared/schemas/notifications';
import { api } from '@/lib/api-client';
import { notificationKeys } from './notification-keys';

export const getMailLog = (guildId: number, query: MailLogQuery) =>
  api.get<MailLogDto>(`/guilds/${guildId}/mail-messages`, { query: { ...query, q: query.q || undefined } });
export const mailLogQueryOptions = (guildId: number, query: MailLogQuery) =>
  queryOptions({
    queryKey: notificationKeys.log(guildId, query),
    queryFn: () => getMailLog(guildId, query),
    placeholderData: keepPreviousData,
  });
export const useMailLog = (guildId: number, query: MailLogQuery) => useQuery(mailLogQueryOptions(guildId, query));
