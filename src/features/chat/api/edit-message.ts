import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ChatMessageDto } from '@shared/schemas/chat';
import { api } from '@/lib/api-client';
import { upsertMessage } from './message-cache';

export const editMessage = (messageId: number, body: string) =>
  api.patch<ChatMessageDto>(`/chat/messages/${messageId}`, { body });

export function useEditMessage() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ messageId, body }: { messageId: number; body: string }) => editMessage(messageId, body),
    onSuccess: (message) => upsertMessage(queryClient, message),
  });
}
