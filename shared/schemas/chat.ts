import { z } from 'zod';
import { socketId } from './live';
import { idParam } from './ids';

export const CHAT_MESSAGE_MAX = 2000;
/** At most this many messages per person in CHAT_RATE_WINDOW_MS, across every room and node. */
export const CHAT_RATE_LIMIT = 10;
export const CHAT_RATE_WINDOW_MS = 10_000;
export const CHAT_PHOTOS_MAX = 4;

// Control characters other than line breaks and tabs carry no meaning in a chat line.
// eslint-disable-next-line no-control-regex
const controlChars = /[\u0000-\u0008\v\f\u000E-\u001F\u007F]/g;

/** A message's text: trimmed, control characters dropped, 1 to 2,000 characters. */
export const messageBodySchema = z
  .string({ error: 'Write a message first.' })
  .max(2 * CHAT_MESSAGE_MAX, `Keep a message under ${CHAT_MESSAGE_MAX.toLocaleString('en')} characters.`)
  .transform((s) => s.replace(controlChars, '').trim())
  .pipe(
    z
      .string()
      .min(1, 'Write a message first.')
      .max(CHAT_MESSAGE_MAX, `Keep a message under ${CHAT_MESSAGE_MAX.toLocaleString('en')} characters.`),
  );

/** Socket `message:send`. */
export const sendMessageSchema = z.object({ roomId: socketId, body: messageBodySchema }).strict();
export type SendMessageInput = z.infer<typeof sendMessageSchema>;

/** REST body of a new message; with photos attached the text may be empty. */
export const postMessageSchema = z.object({
  body: z
    .string()
    .max(2 * CHAT_MESSAGE_MAX, `Keep a message under ${CHAT_MESSAGE_MAX.toLocaleString('en')} characters.`)
    .optional()
    .transform((s) => (s ?? '').replace(controlChars, '').trim())
    .pipe(z.string().max(CHAT_MESSAGE_MAX, `Keep a message under ${CHAT_MESSAGE_MAX.toLocaleString('en')} characters.`)),
});
export type PostMessageInput = z.infer<typeof postMessageSchema>;

export const editMessageSchema = z.object({ body: messageBodySchema }).strict();
export type EditMessageInput = z.infer<typeof editMessageSchema>;

const restId = idParam;
export const roomParamsSchema = z.object({ roomId: restId });
export const messageParamsSchema = z.object({ messageId: restId });

/** History, newest first: `before` is the id of the oldest message already shown. */
export const historyQuerySchema = z.object({
  before: restId.optional(),
  limit: z.coerce
    .number({ error: 'Expected a number.' })
    .int()
    .min(1)
    .max(50, 'Ask for at most 50 messages at a time.')
    .default(30),
});
export type HistoryQuery = z.infer<typeof historyQuerySchema>;

export interface ChatAuthorDto {
  id: number;
  displayName: string;
}

export interface ChatPhotoDto {
  id: number;
  url: string;
  thumbnailUrl: string;
  width: number | null;
  height: number | null;
}

export interface ChatMessageDto {
  id: number;
  roomId: number;
  author: ChatAuthorDto;
  /** Empty once the message is deleted or removed. */
  body: string;
  photos: ChatPhotoDto[];
  createdAt: string;
  editedAt: string | null;
  /** Who took it down: its author, or a moderator. */
  removed: null | 'author' | 'moderator';
}

export interface ChatPageDto {
  messages: ChatMessageDto[];
  /** Pass as `before` for the next (older) page; null when the start is reached. */
  nextCursor: number | null;
}

export type ChatRoomKind = 'sewday' | 'swap';

export interface ChatRoomDto {
  id: number;
  guildId: number;
  kind: ChatRoomKind;
  title: string;
  sewDayId: number | null;
  swapId: number | null;
  canPost: boolean;
  canModerate: boolean;
  /** The caller, so the client knows which messages are theirs to edit. */
  viewerId: number;
}
