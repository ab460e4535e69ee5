import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UnsubscribeInfoDto } from '@shared/schemas/notifications';
import { api } from '@/lib/api-client';
import { notificationKeys } from './notification-keys';

/** Switches the link's kind of mail back on. */
export const undoUnsubscribe = (token: string) =>
  api.post<UnsubscribeInfoDto>('/unsubscribe/undo', undefined, { query: { token }, allowUnauthenticated: true });

export function useUndoUnsubscribe(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => undoUnsubscribe(token),
    onSuccess: (info) => {
      queryClient.setQueryData(notificationKeys.unsubscribe(token), info);
      return queryClient.invalidateQueries({ queryKey: notificationKeys.preferences() });
    },
  });
}
