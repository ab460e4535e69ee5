import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ChatRoomDto } from '@shared/schemas/chat';
import { api } from '@/lib/api-client';
import { chatKeys } from './chat-keys';

/** The swap's room (opened on first visit). */
export const getSwapChatRoom = (swapId: number) => api.get<ChatRoomDto>(`/swaps/${swapId}/chat`);
export const swapChatRoomQueryOptions = (swapId: number) =>
  queryOptions({ queryKey: chatKeys.swapRoom(swapId), queryFn: () => getSwapChatRoom(swapId), staleTime: 5 * 60_000 });
export const useSwapChatRoom = (swapId: number) => useQuery(swapChatRoomQueryOptions(swapId));
