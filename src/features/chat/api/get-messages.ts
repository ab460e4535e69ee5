import { infiniteQueryOptions, useInfiniteQuery } from '@tanstack/react-query';
import type { ChatPageDto } from '@shared/schemas/chat';
import { api } from '@/lib/api-client';
import { chatKeys } from './chat-keys';

export const PAGE_SIZE = 30;

export const getMessages = (roomId: number, before?: number) =>
  api.get<ChatPageDto>(`/chat/rooms/${roomId}/messages`, { query: { before, limit: PAGE_SIZE } });

/** History newest first; each further page is older. Live messages are put into the first page. */
export const messagesQueryOptions = (roomId: number) =>
  infiniteQueryOptions({
    queryKey: chatKeys.messages(roomId),
    queryFn: ({ pageParam }) => getMessages(roomId, pageParam),
    initialPageParam: undefined as number | undefined,
    getNextPageParam: (last) => last.nextCursor ?? undefined,
    staleTime: Infinity,
  });

export const useMessages = (roomId: number) => useInfiniteQuery(messagesQueryOptions(roomId));
