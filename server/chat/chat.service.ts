import {
  CHAT_PHOTOS_MAX,
  CHAT_RATE_LIMIT,
  CHAT_RATE_WINDOW_MS,
  type ChatMessageDto,
  type ChatPageDto,
  type HistoryQuery,
} from '@shared/schemas/chat';
import { ChatMessage, Photo } from '../db/models';
import { AppError, ConflictError, ForbiddenError, NotFoundError, ValidationError } from '../http/errors';
import { commitStagedPhotos, deletePhotos, discardStaged, preparePhotosQueued, stagePhotos } from '../uploads/photo-store';
import type { IncomingPhotoFile } from '../uploads/photo-pipeline';
import type { AppDeps } from '../deps';
import { authorInclude, messageDto, messageRowDto, photoDto, type MessageRow } from './chat-dto';
import { preparedPoolQuery, transactionQuery, tripStatement } from '../db/prepared';
import { oneTripTransaction } from '../db/one-trip';
import { HISTORY_PAGE, LOCK_SENDER, POST_WITHIN_LIMIT } from './chat.queries';
import { authorizeRoom, type RoomAccess } from './chat.policy';

type ChatDeps = Pick<AppDeps, 'events' | 'sequelize' | 'pool' | 'config'>;

/** What POST_WITHIN_LIMIT answers: the new message's id, or null and when the oldest counted one was sent. */
interface PostedRow {
  id: number | null;
  oldestRecent: Date | string | null;
}

const FOREIGN_KEY_VIOLATION = '23503';

export class RateLimitedError extends AppError {
  constructor(
    readonly retryAfterSeconds: number,
    what: 'sending' | 'editing' = 'sending',
  ) {
    const wait = `Wait ${retryAfterSeconds} second${retryAfterSeconds === 1 ? '' : 's'}`;
    super(
      429,
      'rate_limited',
      what === 'sending'
        ? `You are sending messages faster than the room allows (${CHAT_RATE_LIMIT} in ${CHAT_RATE_WINDOW_MS / 1000} seconds). ` +
            `${wait} and send it again; your message is still in the box.`
        : `You are editing messages faster than the room allows (${CHAT_RATE_LIMIT} in ${CHAT_RATE_WINDOW_MS / 1000} seconds). ` +
            `${wait} and save it again; your change is still in the box.`,
      { retryAfterSeconds: String(retryAfterSeconds) },
    );
  }
}

/** A page of a room's history, newest first; `before` is the id of the oldest message already shown. */
export async function history(deps: Pick<AppDeps, 'pool'>, roomId: number, query: HistoryQuery): Promise<ChatPageDto> {
  // One more than the page, to know whether an older page follows.
  const bind = { roomId, limit: query.limit + 1, ...(query.before ? { before: query.before } : {}) };
  const rows = await preparedPoolQuery<MessageRow>(deps.pool, HISTORY_PAGE[query.before ? 'before' : 'newest'], bind);
  const more = rows.length > query.limit;
  const page = more ? rows.slice(0, query.limit) : rows;
  return { messages: page.map(messageRowDto), nextCursor: more ? page.at(-1)!.id : null };
}

/**
 * Posts a message (text, photos, or both). The per-person rate limit is counted in PostgreSQL under
 * an advisory lock, so it holds across every app node and two quick posts cannot both slip through.
 */
export async function postMessage(
  deps: ChatDeps,
  access: RoomAccess,
  author: { id: number; displayName: string },
  input: { body: string; files?: readonly IncomingPhotoFile[] },
): Promise<ChatMessageDto> {
  const authorId = author.id;
  const files = input.files ?? [];
  if (!access.canPost) throw new ForbiddenError('Your role in this guild does not allow posting here.');
  if (!input.body && files.length === 0)
    throw new ValidationError('Write a message or add a photo first.', { body: 'Write a message or add a photo first.' });
  if (files.length > CHAT_PHOTOS_MAX)
    throw new ValidationError(`Send at most ${CHAT_PHOTOS_MAX} photos in one message.`, {
      photos: `At most ${CHAT_PHOTOS_MAX} photos.`,
    });
  const { room } = access;
  // Photos are re-encoded (in the bounded queue) and written before the transaction and its lock.
  const staged = files.length ? await stagePhotos(deps, await preparePhotosQueued(deps, files)) : [];
  const at = new Date();
  const post = {
    roomId: room.id,
    authorId,
    body: input.body,
    at,
    since: new Date(at.getTime() - CHAT_RATE_WINDOW_MS),
    limit: CHAT_RATE_LIMIT,
  };
  const refusedOrPosted = (row: PostedRow | undefined): number => {
    if (!row) throw new Error('the message was neither written nor refused');
    if (row.id !== null) return row.id;
    const freeAt = new Date(row.oldestRecent!).getTime() + CHAT_RATE_WINDOW_MS;
    throw new RateLimitedError(Math.max(1, Math.ceil((freeAt - Date.now()) / 1000)));
  };
  const message = await (
    staged.length
      ? deps.sequelize.transaction(async (transaction) => {
          await transactionQuery(transaction, LOCK_SENDER, { authorId });
          const [row] = await transactionQuery<PostedRow>(transaction, POST_WITHIN_LIMIT, post);
          const id = refusedOrPosted(row);
          const photos = await commitStagedPhotos(deps, {
            staged,
            guildId: room.guildId,
            uploadedBy: authorId,
            owner: { chatMessageId: id },
            transaction,
          });
          return { id, photos };
        })
      : // Text alone, the most of a sew day's messages: the lock and the write in one round trip.
        oneTripTransaction(deps.pool, [tripStatement(LOCK_SENDER, { authorId }), tripStatement(POST_WITHIN_LIMIT, post)]).then(
          (answered) => ({ id: refusedOrPosted(answered[1]![0] as PostedRow | undefined), photos: [] as Photo[] }),
        )
  ).catch(async (error: unknown) => {
    await discardStaged(deps, staged);
    // pg's own error, or Sequelize's around it.
    const { code, parent } = error as { code?: string; parent?: { code?: string } };
    if ((code ?? parent?.code) === FOREIGN_KEY_VIOLATION)
      throw new NotFoundError('This chat room was removed; the message was not sent.');
    throw error;
  });
  // Built from what was just written: a new message needs no second read.
  const dto: ChatMessageDto = {
    id: message.id,
    roomId: room.id,
    author: { id: authorId, displayName: author.displayName },
    body: input.body,
    photos: message.photos.map(photoDto),
    createdAt: at.toISOString(),
    editedAt: null,
    removed: null,
  };
  deps.events.emit('chat.posted', { guildId: room.guildId, roomId: room.id, actorId: authorId, message: dto });
  return dto;
}

async function loadMessage(messageId: number) {
  const message = await ChatMessage.findByPk(messageId, { include: authorInclude });
  if (!message) throw new NotFoundError('That message does not exist.');
  return message;
}

/**
 * Only the author edits, and only a message still standing. Every edit is broadcast, so edits are
 * rate limited like new messages (counted in PostgreSQL under the author's lock, on every node).
 */
export async function editMessage(deps: ChatDeps, userId: number, messageId: number, body: string): Promise<ChatMessageDto> {
  const message = await loadMessage(messageId);
  const access = await authorizeRoom(deps, userId, message.roomId, 'That message does not exist.');
  if (message.authorId !== userId) throw new ForbiddenError('You can edit only your own messages.');
  if (message.deletedAt) throw new ConflictError('That message was deleted, so it cannot be edited.', 'message_deleted');
  await deps.sequelize.transaction(async (transaction) => {
    await deps.sequelize.query('SELECT pg_advisory_xact_lock(7314006, $userId)', { bind: { userId }, transaction });
    const since = new Date(Date.now() - CHAT_RATE_WINDOW_MS);
    await deps.sequelize.query('DELETE FROM chat_edits WHERE author_id = $userId AND created_at <= $since', {
      bind: { userId, since },
      transaction,
    });
    const [recent] = (await deps.sequelize.query(
      'SELECT created_at FROM chat_edits WHERE author_id = $userId ORDER BY created_at',
      {
        bind: { userId },
        transaction,
      },
    )) as [{ created_at: Date }[], unknown];
    if (recent.length >= CHAT_RATE_LIMIT) {
      const freeAt = new Date(recent[recent.length - CHAT_RATE_LIMIT]!.created_at).getTime() + CHAT_RATE_WINDOW_MS;
      throw new RateLimitedError(Math.max(1, Math.ceil((freeAt - Date.now()) / 1000)), 'editing');
    }
    await deps.sequelize.query('INSERT INTO chat_edits (author_id, message_id) VALUES ($userId, $messageId)', {
      bind: { userId, messageId },
      transaction,
    });
    await message.update({ body, editedAt: new Date() }, { transaction });
  });
  const dto = await messageDto(message);
  deps.events.emit('chat.changed', {
    guildId: access.room.guildId,
    roomId: message.roomId,
    actorId: userId,
    change: 'edited',
    message: dto,
  });
  return dto;
}

/**
 * The author deletes their own message; a moderator (guild admin) removes anyone's. Either way the
 * text and photos go and the line stays, saying who took it down.
 */
export async function deleteMessage(deps: ChatDeps, userId: number, messageId: number): Promise<ChatMessageDto> {
  const message = await loadMessage(messageId);
  const access = await authorizeRoom(deps, userId, message.roomId, 'That message does not exist.');
  const own = message.authorId === userId;
  if (!own && !access.canModerate)
    throw new ForbiddenError('You can delete only your own messages; a guild admin can remove others.');
  if (message.deletedAt) throw new ConflictError('That message was already taken down.', 'message_deleted');
  await deps.sequelize.transaction(async (transaction) => {
    await message.update({ body: '', deletedAt: new Date(), deletedById: userId }, { transaction });
    const photos = await Photo.findAll({ where: { chatMessageId: message.id }, transaction });
    await deletePhotos(deps, photos, transaction);
  });
  const dto = await messageDto(message);
  deps.events.emit('chat.changed', {
    guildId: access.room.guildId,
    roomId: message.roomId,
    actorId: userId,
    change: own ? 'deleted' : 'removed',
    message: dto,
  });
  return dto;
}
