/** `npm run restore <folder>`: replaces the database and the uploads with a backup's. Stop the app first. */
import { join } from 'node:path';
import { restore } from './lib/backup';
import { repoRoot, startLocalDatabase } from './lib/local-services';

const source = process.argv[2];
if (!source) {
  console.error('Say which backup to restore: npm run restore -- backups/<folder>');
  process.exit(2);
}
const database = await startLocalDatabase(() => {});
try {
  const manifest = restore({ databaseUrl: database.url, uploadDir: process.env.UPLOAD_DIR ?? join(repoRoot, 'uploads'), source });
  console.log(`Restored the backup of ${manifest.createdAt} (${manifest.uploads} uploaded files).`);
} finally {
  database.stop();
}
