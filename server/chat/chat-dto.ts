import type { ChatMessageDto, ChatPhotoDto } from '@shared/schemas/chat';
import { type ChatMessage, Photo, User } from '../db/models';

export const authorInclude = [{ model: User, as: 'author', attributes: ['id', 'displayName'] }];

export function photoDto(photo: Photo): ChatPhotoDto {
  return {
    id: photo.id,
    url: `/api/photos/${photo.id}`,
    thumbnailUrl: `/api/photos/${photo.id}?size=thumb`,
    width: photo.width,
    height: photo.height,
  };
}

/** Messages as the client sees them: a removed message keeps its place but loses its text and photos. */
export async function messageDtos(messages: ChatMessage[]): Promise<ChatMessageDto[]> {
  const live = messages.filter((m) => !m.deletedAt).map((m) => m.id);
  const photos = live.length ? await Photo.findAll({ where: { chatMessageId: live }, order: [['id', 'ASC']] }) : [];
  return messages.map((m) => ({
    id: m.id,
    roomId: m.roomId,
    author: { id: m.authorId, displayName: m.author?.displayName ?? 'Former member' },
    body: m.deletedAt ? '' : m.body,
    photos: m.deletedAt ? [] : photos.filter((p) => p.chatMessageId === m.id).map(photoDto),
    createdAt: m.createdAt.toISOString(),
    editedAt: m.editedAt?.toISOString() ?? null,
    removed: !m.deletedAt ? null : m.deletedById === m.authorId ? 'author' : 'moderator',
  }));
}

export async function messageDto(message: ChatMessage): Promise<ChatMessageDto> {
  if (!message.author) await message.reload({ include: authorInclude });
  const [dto] = await messageDtos([message]);
  return dto!;
}
