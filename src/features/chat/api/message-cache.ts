import type { InfiniteData, QueryClient } from '@tanstack/react-query';
import type { ChatMessageDto, ChatPageDto } from '@shared/schemas/chat';
import { chatKeys } from './chat-keys';

/**
 * Puts a message into the cached history: replaces it where it already is (an edit, a removal, or
 * the broadcast of one's own message), otherwise adds it at the top as the newest.
 */
export function upsertMessage(queryClient: QueryClient, message: ChatMessageDto) {
  queryClient.setQueryData<InfiniteData<ChatPageDto, number | undefined>>(chatKeys.messages(message.roomId), (data) => {
    if (!data) return data;
    const found = data.pages.some((p) => p.messages.some((m) => m.id === message.id));
    if (found) {
      return {
        ...data,
        pages: data.pages.map((p) => ({ ...p, messages: p.messages.map((m) => (m.id === message.id ? message : m)) })),
      };
    }
    const [first, ...rest] = data.pages;
    if (!first) return data;
    return { ...data, pages: [{ ...first, messages: [message, ...first.messages] }, ...rest] };
  });
}
