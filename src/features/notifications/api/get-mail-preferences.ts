import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MailPreferencesDto } from '@shared/schemas/notifications';
import { api } from '@/lib/api-client';
import { notificationKeys } from './notification-keys';

export const getMailPreferences = () => api.get<MailPreferencesDto>('/me/mail-preferences');
export const mailPreferencesQueryOptions = () =>
  queryOptions({ queryKey: notificationKeys.preferences(), queryFn: getMailPreferences });
export const useMailPreferences = () => useQuery(mailPreferencesQueryOptions());
