import { queryOptions, useQuery } from '@tanstack/react-query';
import type { UnsubscribeInfoDto } from '@shared/schemas/notifications';
import { api } from '@/lib/api-client';
import { notificationKeys } from './notification-keys';

export const getUnsubscribeInfo = (token: string) =>
  api.get<UnsubscribeInfoDto>('/unsubscribe/info', { query: { token }, allowUnauthenticated: true });
export const unsubscribeInfoQueryOptions = (token: string) =>
  queryOptions({ queryKey: notificationKeys.unsubscribe(token), queryFn: () => getUnsubscribeInfo(token), retry: false });
export const useUnsubscribeInfo = (token: string) =>
  useQuery({ ...unsubscribeInfoQueryOptions(token), enabled: token.length > 0 });
