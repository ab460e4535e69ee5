import type { QueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { nextForMeKeys } from './get-next-for-me';

/**
 * Notes that the person has read a chat room up to now, so the home screen stops counting its messages.
 * Best effort: a failure here never bothers the person reading the chat.
 */
export async function markRoomSeen(queryClient: QueryClient, roomId: number): Promise<void> {
  try {
    await api.put<{ roomId: number; seenAt: string }>(`/me/rooms/${roomId}/seen`, {}, { allowUnauthenticated: true });
    await queryClient.invalidateQueries({ queryKey: nextForMeKeys.all });
  } catch {
    // Nothing to tell: the count on the home screen is a convenience.
  }
}
