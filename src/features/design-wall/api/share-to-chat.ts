import { useMutation } from '@tanstack/react-query';
import { PHOTO_FIELD } from '@shared/schemas/photos';
import type { ChatRoomDto } from '@shared/schemas/chat';
import { api } from '@/lib/api-client';

/** Posts a picture to the swap's chat room as a photo message, with a line of text. */
export async function shareToSwapChat(swapId: number, picture: Blob, text: string): Promise<void> {
  const room = await api.get<ChatRoomDto>(`/swaps/${swapId}/chat`);
  const form = new FormData();
  form.append('body', text);
  form.append(PHOTO_FIELD, new File([picture], 'design-wall.png', { type: 'image/png' }), 'design-wall.png');
  await api.post(`/chat/rooms/${room.id}/messages`, form);
}

export function useShareToChat(swapId: number) {
  return useMutation({
    mutationFn: ({ picture, text }: { picture: Blob; text: string }) => shareToSwapChat(swapId, picture, text),
  });
}
