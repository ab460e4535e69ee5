import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ChatMessageDto } from '@shared/schemas/chat';
import { api } from '@/lib/api-client';
import { upsertMessage } from './message-cache';

/** The author deletes their own; a moderator removes anyone's. */
export const deleteMessage = (messageId: number) => api.delete<ChatMessageDto>(`/chat/messages/${messageId}`);

export function useDeleteMessage() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteMessage,
    onSuccess: (message) => upsertMessage(queryClient, message),
  });
}
