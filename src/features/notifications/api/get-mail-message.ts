import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MailMessageDto } from '@shared/schemas/notifications';
import { api } from '@/lib/api-client';
import { notificationKeys } from './notification-keys';

export type MailMessageDetail = MailMessageDto & { text: string };

export const getMailMessage = (guildId: number, messageId: number) =>
  api.get<MailMessageDetail>(`/guilds/${guildId}/mail-messages/${messageId}`);
export const mailMessageQueryOptions = (guildId: number, messageId: number) =>
  queryOptions({ queryKey: notificationKeys.message(guildId, messageId), queryFn: () => getMailMessage(guildId, messageId) });
export const useMailMessage = (guildId: number, messageId: number | null) =>
  useQuery({ ...mailMessageQueryOptions(guildId, messageId ?? 0), enabled: messageId !== null });
