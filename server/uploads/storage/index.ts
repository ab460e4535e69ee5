/** The photo store a configuration names; one instance per distinct setting, shared by every caller. */
import { localStorage } from './local';
import { s3Storage } from './s3';
import type { PhotoStorage, StorageConfig } from './photo-storage';

export type { PhotoStorage, StorageConfig } from './photo-storage';
export { STORED_NAME, assertStoredName, MARKER_NAME } from './photo-storage';
export { photoDir } from './local';

const stores = new Map<string, PhotoStorage>();

function storageKey(config: StorageConfig): string {
  if ((config.PHOTO_STORE ?? 'local') === 'local') return `local:${config.UPLOAD_DIR}`;
  return JSON.stringify([config.S3_ENDPOINT, config.S3_REGION, config.S3_BUCKET, config.S3_PREFIX, config.S3_ACCESS_KEY_ID, config.S3_FORCE_PATH_STYLE]);
}

/** The store for this configuration: the UPLOAD_DIR folder, or the S3 bucket when PHOTO_STORE=s3. */
export function photoStorage(config: StorageConfig): PhotoStorage {
  const key = storageKey(config);
  let store = stores.get(key);
  if (!store) {
    store = (config.PHOTO_STORE ?? 'local') === 's3' ? s3Storage(config) : localStorage(config.UPLOAD_DIR);
    stores.set(key, store);
  }
  return store;
}
