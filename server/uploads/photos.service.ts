/**
 * Photos of blocks over HTTP: upload (which marks a pledged block sewn), list, serve, remove.
 * The storing itself is photo-store.ts, shared with chat.
 */
import type { BlockPhotosUploadDto, PhotoDto, PhotoSize } from '@shared/schemas/photos';
import type { AppDeps } from '../deps';
import { Photo, User } from '../db/models';
import { lockedBlock, markBlockSewn } from '../blocks/blocks.service';
import type { BlockAccess } from '../blocks/blocks.policy';
import type { IncomingPhotoFile } from './photo-pipeline';
import { commitStagedPhotos, deletePhotos, discardStaged, preparePhotosQueued, stagePhotos, storageOf } from './photo-store';
import type { StoredObject } from './storage/photo-storage';
import { preparedPoolQuery } from '../db/prepared';
import { buildFromRow, modelColumns, personBeside, sqlOnce, type PersonRef } from '../db/model-columns';

const uploader = { model: User, as: 'uploadedBy', attributes: ['id', 'displayName'] };

/** What a photo's answer is made of: a Photo row, with its uploader's id and name when known. */
type PhotoFields = Omit<Photo, 'uploadedBy'> & { uploadedBy?: PersonRef | null };

export function photoDto(photo: PhotoFields): PhotoDto {
  return {
    id: photo.id,
    guildId: photo.guildId,
    blockId: photo.blockId,
    chatMessageId: photo.chatMessageId,
    uploadedBy: photo.uploadedBy ? { id: photo.uploadedBy.id, displayName: photo.uploadedBy.displayName } : null,
    mime: photo.mime,
    width: photo.width,
    height: photo.height,
    thumbWidth: photo.thumbWidth,
    thumbHeight: photo.thumbHeight,
    bytes: photo.bytes,
    createdAt: photo.createdAt.toISOString(),
    url: `/api/photos/${photo.id}`,
    thumbUrl: `/api/photos/${photo.id}?size=thumb`,
  };
}

/**
 * Stores photos of a block and, when the block is still `pledged`, marks it `sewn` in the same
 * transaction. Images are encoded (in the bounded queue) and written before the transaction opens,
 * so no row stays locked meanwhile. Emits `block.changed` and `photo.added` after commit.
 */
export async function uploadBlockPhotos(
  deps: AppDeps,
  access: BlockAccess,
  actorId: number,
  files: readonly IncomingPhotoFile[],
): Promise<BlockPhotosUploadDto> {
  const staged = await stagePhotos(deps, await preparePhotosQueued(deps, files));
  const blockId = access.block.id;
  let outcome;
  try {
    outcome = await deps.sequelize.transaction(async (transaction) => {
      const locked = await lockedBlock(deps, blockId, transaction);
      const { block, swap } = locked;
      const sewn = block.state === 'pledged' ? await markBlockSewn(deps, locked, actorId) : undefined;
      const stored = await commitStagedPhotos(deps, { staged, guildId: swap.guildId, uploadedBy: actorId, owner: { blockId }, transaction });
      return { rows: stored, state: block.state, swapId: swap.id, makerId: block.makerId, guildId: swap.guildId, afterCommit: sewn };
    });
  } catch (error) {
    await discardStaged(deps, staged);
    throw error;
  }
  const { rows, state, swapId, makerId, guildId, afterCommit } = outcome;
  afterCommit?.();
  for (const row of rows) deps.events.emit('photo.added', { swapId, guildId, actorId, blockId, makerId, photoId: row.id });
  const withUploader = await Photo.findAll({ where: { id: rows.map((r) => r.id) }, include: [uploader], order: [['id', 'ASC']] });
  return { photos: withUploader.map(photoDto), block: { id: blockId, state } };
}

/** Block $blockId's photos with who uploaded each, oldest first. */
const BLOCK_PHOTOS = sqlOnce(
  () => `SELECT ${modelColumns(Photo, 'p')}, u.id AS "uploader.id", u.display_name AS "uploader.displayName"
           FROM photos p LEFT JOIN users u ON u.id = p.uploaded_by_id
          WHERE p.block_id = $blockId ORDER BY p.created_at, p.id`,
);

/** A block's photos, oldest first, in one named statement (each block's gallery asks for them). */
export async function listBlockPhotos(deps: Pick<AppDeps, 'pool'>, blockId: number): Promise<PhotoDto[]> {
  const rows = await preparedPoolQuery<Record<string, unknown>>(deps.pool, BLOCK_PHOTOS(), { blockId });
  return rows.map((row) => {
    const { person, values } = personBeside(row, 'uploader');
    return photoDto(Object.assign(buildFromRow(Photo, values), { uploadedBy: person }));
  });
}

/** The requested size of a photo from the store, or null when its file is missing. */
export function openPhotoFile(deps: Pick<AppDeps, 'config'>, photo: Photo, size: PhotoSize): Promise<StoredObject | null> {
  return storageOf(deps).get(size === 'thumb' ? photo.thumbFileName : photo.fileName);
}

/** Removes the row; its files are queued for deletion in the same transaction and removed after it. */
export async function removePhoto(deps: AppDeps, photo: Photo): Promise<void> {
  await deletePhotos(deps, [photo]);
}
