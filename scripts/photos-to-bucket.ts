/**
 * `npm run photos:to-bucket`: moves an install's photos from its uploads folder to an S3-compatible
 * bucket, for running several app nodes. It copies every file the database names, reads each back from
 * the bucket and compares checksums, and only then prints the settings to switch to. The folder is
 * left as it was (a fallback until you delete it yourself). Safe to run again: objects already in the
 * bucket with the right checksum are not copied twice. Run it once while the app runs, then stop the
 * app, run it again (it copies only what was added meanwhile), and restart with the printed settings.
 *
 * The bucket comes from S3_ENDPOINT, S3_REGION, S3_BUCKET, S3_ACCESS_KEY_ID, S3_SECRET_ACCESS_KEY,
 * S3_FORCE_PATH_STYLE and S3_PREFIX; with no S3_ENDPOINT, the local fake object store under .data/s3.
 */
import { createHash } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { createSequelize } from '../server/db/sequelize';
import { localStorage } from '../server/uploads/storage/local';
import { readAll } from '../server/uploads/storage/photo-storage';
import { photoStorage } from '../server/uploads/storage';
import { claimPhotoStore } from '../server/uploads/store-identity';
import { startLocalDatabase } from './lib/local-services';
import { storeConfigFrom, withPhotoStore } from './lib/photo-store-env';

const sha256 = (data: Buffer) => createHash('sha256').update(data).digest('hex');
const log = (msg: string) => console.log(`[photos] ${msg}`);

const database = await startLocalDatabase(() => {});
const sequelize = createSequelize(database.url);
try {
  const folder = localStorage(storeConfigFrom(process.env).UPLOAD_DIR);
  await withPhotoStore({ ...process.env, PHOTO_STORE: 's3' }, async (store) => {
    const bucket = photoStorage(store);
    // The bucket must be this install's (or new): never mix two installs' photos.
    await claimPhotoStore(sequelize, bucket);
    const rows = await sequelize.query<{ f: string; t: string }>(
      'SELECT file_name AS f, thumb_file_name AS t FROM photos ORDER BY id',
      {
        type: QueryTypes.SELECT,
      },
    );
    const names = rows.flatMap((r) => [r.f, r.t]);
    let copied = 0;
    let already = 0;
    const missing: string[] = [];
    for (const name of names) {
      const local = await folder.get(name);
      if (!local) {
        missing.push(name);
        continue;
      }
      const data = await readAll(local.body);
      const existing = await bucket.get(name);
      if (existing && sha256(await readAll(existing.body)) === sha256(data)) {
        already += 1;
        continue;
      }
      await bucket.put(name, data);
      const back = await bucket.get(name);
      if (!back || sha256(await readAll(back.body)) !== sha256(data)) {
        throw new Error(`${name} did not arrive intact in ${bucket.description}. Nothing was switched; run the move again.`);
      }
      copied += 1;
    }
    log(
      `${names.length} photo files named by the database: ${copied} copied and verified, ${already} already in ${bucket.description}.`,
    );
    if (missing.length) {
      log(
        `${missing.length} files named by the database were not in ${folder.description} (already missing before the move): ${missing.slice(0, 5).join(', ')}${missing.length > 5 ? ', …' : ''}`,
      );
    }
    const settings = [
      'PHOTO_STORE=s3',
      ...Object.entries(store)
        .filter(([k, v]) => k.startsWith('S3_') && v !== undefined && v !== '' && k !== 'S3_SECRET_ACCESS_KEY')
        .map(([k, v]) => `${k}=${String(v)}`),
    ];
    log('Every photo is in the bucket and checked. To switch, stop the app and start it with:');
    for (const line of settings) console.log(`  ${line}`);
    if (store.S3_SECRET_ACCESS_KEY) console.log('  S3_SECRET_ACCESS_KEY=(the same secret key you gave this script)');
    log(`${folder.description} is left as it was; delete it yourself once the app runs well from the bucket.`);
  });
} catch (error) {
  console.error(`[photos] ${(error as Error).message}`);
  process.exitCode = 1;
} finally {
  await sequelize.close();
  database.stop();
}
