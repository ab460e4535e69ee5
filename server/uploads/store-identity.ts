/**
 * Every photo store carries the identity of the install that owns it: a marker written on first use
 * and compared at every start. An install pointed at another install's folder or bucket refuses to
 * start instead of touching anything in it.
 */
import { randomUUID } from 'node:crypto';
import { QueryTypes, type Sequelize } from 'sequelize';
import type { PhotoStorage } from './storage';

interface Marker {
  format: 1;
  install: string;
  claimedAt: string;
}

export class PhotoStoreOwnedElsewhereError extends Error {
  readonly code = 'photo_store_owned_elsewhere';
}

/** This database's install id, created on first call (and kept by backups and restores). */
export async function installId(sequelize: Sequelize): Promise<string> {
  await sequelize.query('INSERT INTO install_identity (id, install_id) VALUES (1, :id) ON CONFLICT (id) DO NOTHING', {
    replacements: { id: randomUUID() },
  });
  const [row] = await sequelize.query<{ install_id: string }>('SELECT install_id FROM install_identity WHERE id = 1', { type: QueryTypes.SELECT });
  return row!.install_id;
}

function parseMarker(text: string): Marker | null {
  try {
    const value = JSON.parse(text) as Partial<Marker>;
    return typeof value.install === 'string' && typeof value.claimedAt === 'string' ? (value as Marker) : null;
  } catch {
    return null;
  }
}

/**
 * Stamps the store with this install's id on first use, or checks the stamp already there. Throws
 * PhotoStoreOwnedElsewhereError, with a message saying how to proceed, when the store is another's.
 */
export async function claimPhotoStore(sequelize: Sequelize, storage: PhotoStorage): Promise<{ install: string; claimed: boolean }> {
  const install = await installId(sequelize);
  let text = await storage.readMarker();
  let claimed = false;
  if (text === null) {
    const marker: Marker = { format: 1, install, claimedAt: new Date().toISOString() };
    try {
      await storage.writeMarker(`${JSON.stringify(marker, null, 2)}\n`);
      claimed = true;
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code !== 'EEXIST') throw error;
    }
    // Read back: when two installs claim at once, the one whose marker stayed owns the store.
    text = await storage.readMarker();
  }
  const marker = text === null ? null : parseMarker(text);
  if (!marker) {
    throw new PhotoStoreOwnedElsewhereError(
      `Blockpost will not start: the photo store (${storage.description}) has an owner marker it cannot read. ` +
        'Nothing was changed. Point UPLOAD_DIR (or S3_BUCKET / S3_PREFIX) at this install’s own photo store, ' +
        'or restore the marker file from a backup.',
    );
  }
  if (marker.install !== install) {
    throw new PhotoStoreOwnedElsewhereError(
      `Blockpost will not start: the photo store (${storage.description}) belongs to another Blockpost install ` +
        `(install ${marker.install}, first used ${marker.claimedAt.slice(0, 10)}); this database is install ${install}. ` +
        'Nothing was changed. To go on, point UPLOAD_DIR (or S3_BUCKET / S3_PREFIX for a bucket) at this install’s own ' +
        'photo store — a new empty folder or prefix is fine — or, if this database should be that install, restore ' +
        'the backup that holds both its database and its photos with `npm run restore`.',
    );
  }
  return { install, claimed };
}
