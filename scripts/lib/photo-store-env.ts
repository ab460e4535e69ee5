/**
 * The photo store the scripts (backup, restore, moving photos to a bucket) work on, from the same
 * environment variables as the app. With PHOTO_STORE=s3 and no S3_ENDPOINT, that is the local fake
 * object store under .data/s3: reused when `npm start` already runs it, started for the script if not.
 */
import { join } from 'node:path';
import { loadConfig } from '../../server/config';
import type { StorageConfig } from '../../server/uploads/storage';
import { dataDir, repoRoot } from './local-services';
import { startS3Fake, S3_FAKE_KEYS } from './s3-fake';

const STORE_KEYS = [
  'UPLOAD_DIR',
  'PHOTO_STORE',
  'S3_ENDPOINT',
  'S3_REGION',
  'S3_BUCKET',
  'S3_ACCESS_KEY_ID',
  'S3_SECRET_ACCESS_KEY',
  'S3_FORCE_PATH_STYLE',
  'S3_PREFIX',
] as const;

/** The store settings in `env`, validated like the app's (the other settings are not needed here). */
export function storeConfigFrom(env: NodeJS.ProcessEnv): StorageConfig {
  const config = loadConfig({
    DATABASE_URL: 'postgres://unused/unused',
    SESSION_SECRET: 'not-used-by-scripts',
    ...env,
    UPLOAD_DIR: env.UPLOAD_DIR ?? join(repoRoot, 'uploads'),
  });
  return Object.fromEntries(STORE_KEYS.map((k) => [k, config[k]])) as StorageConfig;
}

/** Runs `work` with the store in `env`, starting the local fake object store first when it is the one meant. */
export async function withPhotoStore<T>(env: NodeJS.ProcessEnv, work: (store: StorageConfig) => Promise<T>): Promise<T> {
  if (env.PHOTO_STORE !== 's3' || env.S3_ENDPOINT) return work(storeConfigFrom(env));
  const port = Number(env.S3_FAKE_PORT ?? 4569);
  const endpoint = `http://127.0.0.1:${port}`;
  const fakeEnv = {
    S3_ENDPOINT: endpoint,
    S3_ACCESS_KEY_ID: S3_FAKE_KEYS.accessKeyId,
    S3_SECRET_ACCESS_KEY: S3_FAKE_KEYS.secretAccessKey,
    S3_FORCE_PATH_STYLE: 'true',
  };
  const running = await fetch(endpoint).then(
    () => true,
    () => false,
  );
  const fake = running
    ? null
    : await startS3Fake({ port, directory: join(dataDir, 's3'), buckets: [env.S3_BUCKET ?? 'blockpost-photos'] });
  try {
    return await work(storeConfigFrom({ ...env, ...fakeEnv }));
  } finally {
    await fake?.stop();
  }
}
