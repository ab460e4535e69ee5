import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MailPreferencesDto, UpdateMailPreferencesInput } from '@shared/schemas/notifications';
import { api } from '@/lib/api-client';
import { notificationKeys } from './notification-keys';

export const updateMailPreferences = (changes: UpdateMailPreferencesInput) =>
  api.patch<MailPreferencesDto>('/me/mail-preferences', changes);

export function useUpdateMailPreferences() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateMailPreferences,
    onSuccess: (prefs) => queryClient.setQueryData(notificationKeys.preferences(), prefs),
  });
}
