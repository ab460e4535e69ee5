import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ChatMessageDto } from '@shared/schemas/chat';
import { PHOTO_FIELD } from '@shared/schemas/photos';
import { api } from '@/lib/api-client';
import { emitWithAck, getSocket } from '@/lib/socket';
import { upsertMessage } from './message-cache';

export interface NewMessage {
  body: string;
  photos: File[];
}

/** Text goes over the live connection when it is up; photos (and text while offline) go over REST. */
export function sendMessage(roomId: number, { body, photos }: NewMessage): Promise<ChatMessageDto> {
  if (photos.length) {
    const form = new FormData();
    form.append('body', body);
    for (const photo of photos) form.append(PHOTO_FIELD, photo, photo.name);
    return api.post<ChatMessageDto>(`/chat/rooms/${roomId}/messages`, form);
  }
  if (getSocket().connected) return emitWithAck<ChatMessageDto>('message:send', { roomId, body });
  return api.post<ChatMessageDto>(`/chat/rooms/${roomId}/messages`, { body });
}

export function useSendMessage(roomId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: NewMessage) => sendMessage(roomId, input),
    onSuccess: (message) => upsertMessage(queryClient, message),
  });
}
