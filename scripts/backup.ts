/**
 * `npm run backup [folder]`: the database and every photo (the uploads folder, or the bucket's objects
 * with PHOTO_STORE=s3) into backups/<time>/ (or the folder given), with a manifest of sizes and checksums.
 */
import { join } from 'node:path';
import { backup } from './lib/backup';
import { repoRoot, startLocalDatabase } from './lib/local-services';
import { withPhotoStore } from './lib/photo-store-env';

const database = await startLocalDatabase(() => {});
try {
  const target = process.argv[2] ?? join(repoRoot, 'backups', new Date().toISOString().replace(/[:.]/g, '-'));
  const manifest = await withPhotoStore(process.env, (store) => backup({ databaseUrl: database.url, store, target }));
  const where = manifest.store === 's3' ? 'objects from the bucket' : 'uploaded files';
  console.log(`Backed up database "${manifest.database}" and ${manifest.uploads} ${where} to ${target}`);
} finally {
  database.stop();
}
