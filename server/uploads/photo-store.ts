/**
 * Storing photos for any owner (a block or a chat message): check and re-encode the batch, write
 * the files, insert the rows in a transaction, and take the files back out if the rows do not
 * make it. Swaps and chat both call storePhotos.
 */
import type { Sequelize, Transaction } from 'sequelize';
import type { Config } from '../config';
import { Photo } from '../db/models';
import { preparePhotos, type EncodedPhoto, type IncomingPhotoFile } from './photo-pipeline';
import { newStoredName, removeStoredFiles, writeStoredFile } from './photo-files';

export type PhotoOwner = { blockId: number } | { chatMessageId: number };

export interface StorePhotosInput {
  files: readonly IncomingPhotoFile[];
  guildId: number;
  uploadedBy: number;
  owner: PhotoOwner;
  /**
   * Join the caller's transaction (e.g. the one that creates the chat message). The files are
   * removed if it rolls back; a crash before commit leaves files the orphan sweep removes.
   */
  transaction?: Transaction;
}

export interface PhotoStoreDeps {
  sequelize: Sequelize;
  config: Pick<Config, 'UPLOAD_DIR' | 'PHOTO_FORMAT'>;
}

/**
 * Checks, re-encodes and stores a batch of photos for one owner. A bad file refuses the whole batch
 * (PhotoRejectedError, 4xx, naming the file) before anything is written. Returns the new rows.
 * With a caller's transaction, consider preparePhotos + storePreparedPhotos instead, so the
 * transaction is not held open while images are encoded.
 */
export async function storePhotos(deps: PhotoStoreDeps, input: StorePhotosInput): Promise<Photo[]> {
  const { files, ...rest } = input;
  return storePreparedPhotos(deps, { ...rest, photos: await preparePhotos(files, deps.config.PHOTO_FORMAT) });
}

export interface StorePreparedInput extends Omit<StorePhotosInput, 'files'> {
  photos: readonly EncodedPhoto[];
}

/** Writes already prepared photos (from preparePhotos) and inserts their rows. */
export async function storePreparedPhotos(deps: PhotoStoreDeps, input: StorePreparedInput): Promise<Photo[]> {
  const uploadDir = deps.config.UPLOAD_DIR;
  const written: string[] = [];
  const discard = () => removeStoredFiles(uploadDir, written);
  try {
    const named: { photo: EncodedPhoto; fileName: string; thumbFileName: string }[] = [];
    for (const photo of input.photos) named.push(await writePair(uploadDir, photo, written));
    const insert = (transaction: Transaction) =>
      Photo.bulkCreate(
        named.map(({ photo, fileName, thumbFileName }) => ({
          guildId: input.guildId,
          blockId: 'blockId' in input.owner ? input.owner.blockId : null,
          chatMessageId: 'chatMessageId' in input.owner ? input.owner.chatMessageId : null,
          uploadedById: input.uploadedBy,
          fileName,
          thumbFileName,
          mime: photo.mime,
          width: photo.full.width,
          height: photo.full.height,
          thumbWidth: photo.thumb.width,
          thumbHeight: photo.thumb.height,
          bytes: photo.full.data.length,
          originalBytes: photo.originalBytes,
        })),
        { transaction, returning: true },
      );
    if (!input.transaction) return await deps.sequelize.transaction(insert);
    // A savepoint, so a failed insert can be undone here while the caller's transaction goes on.
    const rows = await deps.sequelize.transaction({ transaction: input.transaction }, insert);
    onRollback(input.transaction, discard);
    return rows;
  } catch (error) {
    await discard().catch(() => undefined);
    throw error;
  }
}

async function writePair(uploadDir: string, photo: EncodedPhoto, written: string[]) {
  const fileName = newStoredName(photo.extension);
  const thumbFileName = newStoredName(photo.extension);
  await writeStoredFile(uploadDir, fileName, photo.full.data);
  written.push(fileName);
  await writeStoredFile(uploadDir, thumbFileName, photo.thumb.data);
  written.push(thumbFileName);
  return { photo, fileName, thumbFileName };
}

/**
 * Runs `undo` after the transaction rolls back. Sequelize 6 has afterCommit but no rollback hook,
 * and both its managed and unmanaged transactions end a failure through `rollback()`.
 */
function onRollback(transaction: Transaction, undo: () => Promise<void>) {
  const rollback = transaction.rollback.bind(transaction);
  transaction.rollback = async () => {
    try {
      await rollback();
    } finally {
      await undo().catch(() => undefined);
    }
  };
}

/** Deletes photo rows and then their files (a file without a row is harmless; a row without its file is not). */
export async function deletePhotos(deps: PhotoStoreDeps, photos: readonly Photo[], transaction?: Transaction): Promise<void> {
  if (photos.length === 0) return;
  const ids = photos.map((p) => p.id);
  if (transaction) {
    await Photo.destroy({ where: { id: ids }, transaction });
    transaction.afterCommit(() => removeFilesOf(deps, photos));
    return;
  }
  await Photo.destroy({ where: { id: ids } });
  await removeFilesOf(deps, photos);
}

async function removeFilesOf(deps: PhotoStoreDeps, photos: readonly Photo[]) {
  // Failing to unlink leaves an orphan for the sweep; the rows are already gone.
  await removeStoredFiles(deps.config.UPLOAD_DIR, photos.flatMap((p) => [p.fileName, p.thumbFileName])).catch(() => undefined);
}
