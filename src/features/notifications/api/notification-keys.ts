import type { MailLogQuery } from '@shared/schemas/notifications';

export const notificationKeys = {
  all: ['notifications'] as const,
  preferences: () => [...notificationKeys.all, 'preferences'] as const,
  unsubscribe: (token: string) => [...notificationKeys.all, 'unsubscribe', token] as const,
  logs: (guildId: number) => [...notificationKeys.all, 'log', guildId] as const,
  log: (guildId: number, query: MailLogQuery) => [...notificationKeys.logs(guildId), query] as const,
  message: (guildId: number, messageId: number) => [...notificationKeys.logs(guildId), 'message', messageId] as const,
};
