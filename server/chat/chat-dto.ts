import type { ChatMessageDto, ChatPhotoDto } from '@shared/schemas/chat';
import { type ChatMessage, Photo, User } from '../db/models';

export const authorInclude = [{ model: User, as: 'author', attributes: ['id', 'displayName'] }];

export function photoDto(photo: Pick<Photo, 'id' | 'width' | 'height'>): ChatPhotoDto {
  return {
    id: photo.id,
    url: `/api/photos/${photo.id}`,
    thumbnailUrl: `/api/photos/${photo.id}?size=thumb`,
    width: photo.width,
    height: photo.height,
  };
}

/** A message as the history's statement reads it (chat.queries.ts MESSAGE_ROW), or as built from a model. */
export interface MessageRow {
  id: number;
  roomId: number;
  authorId: number;
  authorName: string | null;
  body: string;
  createdAt: Date;
  editedAt: Date | null;
  deletedAt: Date | null;
  deletedById: number | null;
  /** the message's photos in order; null for none (or for a removed message) */
  photos: Pick<Photo, 'id' | 'width' | 'height'>[] | null;
}

/** A message as the client sees it: a removed message keeps its place but loses its text and photos. */
export function messageRowDto(m: MessageRow): ChatMessageDto {
  return {
    id: m.id,
    roomId: m.roomId,
    author: { id: m.authorId, displayName: m.authorName ?? 'Former member' },
    body: m.deletedAt ? '' : m.body,
    photos: m.deletedAt ? [] : (m.photos ?? []).map(photoDto),
    createdAt: m.createdAt.toISOString(),
    editedAt: m.editedAt?.toISOString() ?? null,
    removed: !m.deletedAt ? null : m.deletedById === m.authorId ? 'author' : 'moderator',
  };
}

/** Messages read as models (with their authors) as the client sees them, their photos in one more query. */
export async function messageDtos(messages: ChatMessage[]): Promise<ChatMessageDto[]> {
  const live = messages.filter((m) => !m.deletedAt).map((m) => m.id);
  const photos = live.length ? await Photo.findAll({ where: { chatMessageId: live }, order: [['id', 'ASC']] }) : [];
  return messages.map((m) =>
    messageRowDto({
      ...m.get({ plain: true }),
      authorName: m.author?.displayName ?? null,
      photos: photos.filter((p) => p.chatMessageId === m.id),
    }),
  );
}

export async function messageDto(message: ChatMessage): Promise<ChatMessageDto> {
  if (!message.author) await message.reload({ include: authorInclude });
  const [dto] = await messageDtos([message]);
  return dto!;
}
