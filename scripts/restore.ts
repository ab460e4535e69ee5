/**
 * `npm run restore <folder>`: checks every file of the backup against its manifest, then replaces the
 * database and the photos with the backup's. Stop the app first.
 */
import { restore } from './lib/backup';
import { startLocalDatabase } from './lib/local-services';
import { withPhotoStore } from './lib/photo-store-env';

const source = process.argv[2];
if (!source) {
  console.error('Say which backup to restore: npm run restore -- backups/<folder>');
  process.exit(2);
}
const database = await startLocalDatabase(() => {});
try {
  const manifest = await withPhotoStore(process.env, (store) => restore({ databaseUrl: database.url, store, source }));
  console.log(
    `Restored the backup of ${manifest.createdAt} (${manifest.uploads} ${manifest.store === 's3' ? 'objects' : 'uploaded files'}, checksums verified).`,
  );
} catch (error) {
  console.error((error as Error).message);
  process.exitCode = 1;
} finally {
  database.stop();
}
