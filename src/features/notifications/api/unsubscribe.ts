import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UnsubscribeInfoDto } from '@shared/schemas/notifications';
import { api } from '@/lib/api-client';
import { notificationKeys } from './notification-keys';

/** Switches off the link's kind of mail; the signed token is the authority, no sign-in needed. */
export const unsubscribe = (token: string) =>
  api.post<UnsubscribeInfoDto>('/unsubscribe', undefined, { query: { token }, allowUnauthenticated: true });

export function useUnsubscribe(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => unsubscribe(token),
    onSuccess: (info) => {
      queryClient.setQueryData(notificationKeys.unsubscribe(token), info);
      return queryClient.invalidateQueries({ queryKey: notificationKeys.preferences() });
    },
  });
}
