/**
 * Storing photos for any owner (a block or a chat message) in three steps, so no transaction or lock
 * is held while images are encoded or bytes travel to the store:
 * 1. prepare — check and re-encode through the bounded queue (photo-pipeline.ts, photo-queue.ts);
 * 2. stage — record the new names as pending (committed), then write the files;
 * 3. commit — insert the rows and clear the pending record in one transaction (the caller's, if any).
 * A crash between 2 and 3 leaves a pending record; the sweep removes those files after the grace
 * period. Removing photos queues their files in the deleting transaction (photo-ledger.ts).
 */
import { randomBytes } from 'node:crypto';
import type { Sequelize, Transaction } from 'sequelize';
import type { Config } from '../config';
import { Photo } from '../db/models';
import { preparePhotos, type EncodedPhoto, type IncomingPhotoFile } from './photo-pipeline';
import { photoQueue } from './photo-queue';
import { clearPendingUploads, recordPendingUploads, workDeletionQueue } from './photo-ledger';
import { photoStorage, type PhotoStorage, type StorageConfig } from './storage';
import { recordPhotoColours } from './photo-colour';

export type PhotoOwner = { blockId: number } | { chatMessageId: number };

export interface PhotoStoreDeps {
  sequelize: Sequelize;
  config: StorageConfig & Partial<Pick<Config, 'PHOTO_FORMAT' | 'PHOTO_QUEUE_LIMIT'>>;
}

/** The store this deps' configuration names (folder or bucket). */
export function storageOf(deps: Pick<PhotoStoreDeps, 'config'>): PhotoStorage {
  return photoStorage(deps.config);
}

export function newStoredName(extension: 'jpg' | 'webp'): string {
  return `${randomBytes(16).toString('base64url')}.${extension}`;
}

/** A photo whose files are written but whose row is not yet committed. */
export interface StagedPhoto {
  photo: EncodedPhoto;
  fileName: string;
  thumbFileName: string;
}

const namesOf = (staged: readonly StagedPhoto[]) => staged.flatMap((s) => [s.fileName, s.thumbFileName]);

/** Checks and re-encodes through the process's bounded queue (PhotosBusyError when it is full). */
export function preparePhotosQueued(deps: Pick<PhotoStoreDeps, 'config'>, files: readonly IncomingPhotoFile[]): Promise<EncodedPhoto[]> {
  return preparePhotos(files, deps.config.PHOTO_FORMAT ?? 'jpeg', photoQueue(deps.config));
}

/** Records the new names as pending (committed first), then writes both files of each photo. */
export async function stagePhotos(deps: PhotoStoreDeps, photos: readonly EncodedPhoto[]): Promise<StagedPhoto[]> {
  const staged = photos.map((photo) => ({ photo, fileName: newStoredName(photo.extension), thumbFileName: newStoredName(photo.extension) }));
  await recordPendingUploads(deps.sequelize, namesOf(staged));
  const storage = storageOf(deps);
  try {
    for (const s of staged) {
      await storage.put(s.fileName, s.photo.full.data);
      await storage.put(s.thumbFileName, s.photo.thumb.data);
    }
  } catch (error) {
    await discardStaged(deps, staged);
    throw error;
  }
  return staged;
}

/**
 * Takes staged files back out (the upload failed or was refused before its rows committed). Best
 * effort: whatever is left stays recorded as pending, and the sweep removes it after the grace period.
 */
export async function discardStaged(deps: PhotoStoreDeps, staged: readonly StagedPhoto[]): Promise<void> {
  const names = namesOf(staged);
  try {
    const storage = storageOf(deps);
    for (const name of names) await storage.remove(name);
    await clearPendingUploads(deps.sequelize, names);
  } catch {
    /* the pending record stays for the sweep */
  }
}

export interface CommitInput {
  staged: readonly StagedPhoto[];
  guildId: number;
  uploadedBy: number;
  owner: PhotoOwner;
  /** Join the caller's transaction (e.g. the one that creates the chat message); files go if it rolls back. */
  transaction?: Transaction;
}

/** Inserts the rows of staged photos and clears their pending record, in one transaction. */
export async function commitStagedPhotos(deps: PhotoStoreDeps, input: CommitInput): Promise<Photo[]> {
  const insert = async (transaction: Transaction) => {
    const rows = await Photo.bulkCreate(
      input.staged.map(({ photo, fileName, thumbFileName }) => ({
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
    await clearPendingUploads(deps.sequelize, namesOf(input.staged), transaction);
    await recordPhotoColours(deps.sequelize, rows, input.staged.map((p) => p.photo.full.data), transaction);
    return rows;
  };
  try {
    if (!input.transaction) return await deps.sequelize.transaction(insert);
    // A savepoint, so a failed insert can be undone here while the caller's transaction goes on.
    const rows = await deps.sequelize.transaction({ transaction: input.transaction }, insert);
    onRollback(input.transaction, () => discardStaged(deps, input.staged));
    return rows;
  } catch (error) {
    await discardStaged(deps, input.staged);
    throw error;
  }
}

export interface StorePhotosInput extends Omit<CommitInput, 'staged'> {
  files: readonly IncomingPhotoFile[];
}

/**
 * Checks, re-encodes and stores a batch of photos for one owner. A bad file refuses the whole batch
 * (PhotoRejectedError, 4xx, naming the file) before anything is written. Returns the new rows. With
 * a caller's transaction, prefer preparePhotosQueued + stagePhotos before it opens and
 * commitStagedPhotos inside it, so the transaction is not held open while images are encoded.
 */
export async function storePhotos(deps: PhotoStoreDeps, input: StorePhotosInput): Promise<Photo[]> {
  const { files, ...rest } = input;
  const staged = await stagePhotos(deps, await preparePhotosQueued(deps, files));
  return commitStagedPhotos(deps, { ...rest, staged });
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

/**
 * Deletes photo rows; the database queues their files for deletion in the same transaction (a
 * trigger), and once it commits this node removes them right away. Files a crash or a store outage
 * leaves queued are removed by the periodic job.
 */
export async function deletePhotos(deps: PhotoStoreDeps, photos: readonly Photo[], transaction?: Transaction): Promise<void> {
  if (photos.length === 0) return;
  const ids = photos.map((p) => p.id);
  const names = photos.flatMap((p) => [p.fileName, p.thumbFileName]);
  const removeNow = () => workDeletionQueue({ sequelize: deps.sequelize, storage: storageOf(deps) }, names).then(
    () => undefined,
    () => undefined,
  );
  if (transaction) {
    await Photo.destroy({ where: { id: ids }, transaction });
    transaction.afterCommit(removeNow);
    return;
  }
  await Photo.destroy({ where: { id: ids } });
  await removeNow();
}
