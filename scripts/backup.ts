/** `npm run backup [folder]`: the database and the uploads into backups/<time>/ (or the folder given). */
import { join } from 'node:path';
import { backup } from './lib/backup';
import { repoRoot, startLocalDatabase } from './lib/local-services';

const database = await startLocalDatabase(() => {});
try {
  const target = process.argv[2] ?? join(repoRoot, 'backups', new Date().toISOString().replace(/[:.]/g, '-'));
  const manifest = backup({ databaseUrl: database.url, uploadDir: process.env.UPLOAD_DIR ?? join(repoRoot, 'uploads'), target });
  console.log(`Backed up database "${manifest.database}" and ${manifest.uploads} uploaded files to ${target}`);
} finally {
  database.stop();
}
