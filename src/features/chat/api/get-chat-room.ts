import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ChatRoomDto } from '@shared/schemas/chat';
import { api } from '@/lib/api-client';
import { chatKeys } from './chat-keys';

export const getChatRoom = (roomId: number) => api.get<ChatRoomDto>(`/chat/rooms/${roomId}`);
export const chatRoomQueryOptions = (roomId: number) =>
  queryOptions({ queryKey: chatKeys.room(roomId), queryFn: () => getChatRoom(roomId), staleTime: 5 * 60_000 });
export const useChatRoom = (roomId: number) => useQuery(chatRoomQueryOptions(roomId));
