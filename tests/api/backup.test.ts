import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles, signedInUser } from '../helpers/factories';
import { restore, type BackupManifest } from '../../scripts/lib/backup';
import { storageOf, storePhotos } from '../../server/uploads/photo-store';
import { readAll } from '../../server/uploads/storage/photo-storage';
import { picture } from '../fixtures/photos';
import { swapWithBlock } from '../fixtures/photo-blocks';
import { driverEnv } from './photos-support';

/** Runs `npm run backup` / `npm run restore`'s script against this app's database and photo store. */
function runScript(app: TestApp, script: 'backup' | 'restore', folder: string, storeEnv: Record<string, string>) {
  try {
    return execFileSync(process.execPath, ['node_modules/tsx/dist/cli.mjs', `scripts/${script}.ts`, folder], {
      env: { ...process.env, DATABASE_URL: app.databaseUrl, UPLOAD_DIR: app.deps.config.UPLOAD_DIR, ...storeEnv },
      encoding: 'utf8',
      stdio: 'pipe',
    });
  } catch (error) {
    const { stderr, stdout } = error as { stderr: string; stdout: string };
    throw new Error(`${stdout}${stderr}`, { cause: error });
  }
}

const emails = async (app: TestApp) =>
  (await app.deps.pool.query<{ email: string }>('SELECT email FROM users ORDER BY id')).rows.map((r) => r.email);
const manifestOf = (folder: string) => JSON.parse(readFileSync(join(folder, 'manifest.json'), 'utf8')) as BackupManifest;
const newTarget = () => join(mkdtempSync(join(tmpdir(), 'blockpost-backup-')), 'snapshot');

describe('with the uploads folder', () => {
  let app: TestApp;
  beforeAll(async () => {
    app = await createTestApp();
  });
  afterAll(() => app.close());

  it('round-trips the database and the uploads, listing every file with its size and checksum', async () => {
    const kept = await signedInUser(app, { displayName: 'Kept Before Backup' });
    const uploadDir = app.deps.config.UPLOAD_DIR;
    writeFileSync(join(uploadDir, 'photo-kept.jpg'), 'pretend image bytes');
    mkdirSync(join(uploadDir, 'photos'), { recursive: true }); // where the app keeps block photos
    writeFileSync(join(uploadDir, 'photos', 'block-kept.jpg'), 'nested image bytes');
    const target = newTarget();

    expect(runScript(app, 'backup', target, {})).toMatch(/and 2 uploaded files/);
    // The checksum agrees with coreutils' sha256sum, an implementation independent of ours.
    expect(manifestOf(target).objects).toEqual([
      { path: 'photo-kept.jpg', bytes: 19, sha256: expect.stringMatching(/^[0-9a-f]{64}$/) },
      {
        path: 'photos/block-kept.jpg',
        bytes: 18,
        sha256: execFileSync('sha256sum', [join(uploadDir, 'photos', 'block-kept.jpg')], { encoding: 'utf8' }).slice(0, 64),
      },
    ]);

    // Things change after the backup: a new account, a deleted file, a new file.
    const later = await signedInUser(app, { displayName: 'Added After Backup' });
    rmSync(join(uploadDir, 'photo-kept.jpg'));
    writeFileSync(join(uploadDir, 'photo-later.jpg'), 'later bytes');

    await app.deps.pool.query('SELECT 1'); // the app's pool survives the restore below
    expect(runScript(app, 'restore', target, {})).toMatch(/Restored the backup .*checksums verified/);

    expect(await emails(app)).toContain(kept.email);
    expect(await emails(app)).not.toContain(later.email);
    expect(
      readdirSync(uploadDir)
        .filter((f) => !f.startsWith('.'))
        .sort(),
    ).toEqual(['photo-kept.jpg', 'photos']);
    expect(readFileSync(join(uploadDir, 'photo-kept.jpg'), 'utf8')).toBe('pretend image bytes');
    expect(readFileSync(join(uploadDir, 'photos', 'block-kept.jpg'), 'utf8')).toBe('nested image bytes');
  });

  it('refuses a backup whose files do not match their checksums, and changes nothing', async () => {
    const target = newTarget();
    runScript(app, 'backup', target, {});
    const manifest = manifestOf(target);
    manifest.objects[0]!.sha256 = '0'.repeat(64);
    writeFileSync(join(target, 'manifest.json'), JSON.stringify(manifest));
    const later = await signedInUser(app, { displayName: 'Added After The Bad Backup' });
    writeFileSync(join(app.deps.config.UPLOAD_DIR, 'photo-after.jpg'), 'after');

    expect(() => runScript(app, 'restore', target, {})).toThrow(
      /does not match its manifest \(1 problem: photo-kept\.jpg does not match its checksum\)\. Nothing was restored/,
    );
    expect(await emails(app)).toContain(later.email);
    expect(readFileSync(join(app.deps.config.UPLOAD_DIR, 'photo-after.jpg'), 'utf8')).toBe('after');
  });

  it('refuses a folder that is not a backup', async () => {
    const empty = mkdtempSync(join(tmpdir(), 'not-a-backup-'));
    await expect(restore({ databaseUrl: app.databaseUrl, store: { UPLOAD_DIR: empty }, source: empty })).rejects.toThrow(
      /not a Blockpost backup/,
    );
  });
});

describe('with a bucket', () => {
  let app: TestApp;
  const storeEnv = driverEnv('s3');
  beforeAll(async () => {
    app = await createTestApp(storeEnv);
  });
  afterAll(() => app.close());

  it('copies every object into the backup with its checksum, puts lost objects back, and refuses a damaged copy', async () => {
    const roles = await guildWithRoles(app);
    const { blockId } = await swapWithBlock(app, roles.guildId, roles.member.id);
    const [photo] = await storePhotos(app.deps, {
      files: [{ originalname: 'bucket.jpg', buffer: await picture('jpeg', 800, 600) }],
      guildId: roles.guildId,
      uploadedBy: roles.member.id,
      owner: { blockId },
    });
    const storage = storageOf(app.deps);
    const original = await readAll((await storage.get(photo!.fileName))!.body);
    const target = newTarget();

    expect(runScript(app, 'backup', target, storeEnv)).toMatch(/and 2 objects from the bucket/);
    const manifest = manifestOf(target);
    expect(manifest.store).toBe('s3');
    expect(manifest.objects.map((o) => o.path).sort()).toEqual(
      [`photos/${photo!.fileName}`, `photos/${photo!.thumbFileName}`].sort(),
    );
    const full = manifest.objects.find((o) => o.path === `photos/${photo!.fileName}`)!;
    expect(full.bytes).toBe(original.length);
    expect(readFileSync(join(target, 'objects', full.path)).equals(original)).toBe(true);

    // The bucket loses the photo; an account is added.
    await storage.remove(photo!.fileName);
    const later = await signedInUser(app, { displayName: 'Added After Bucket Backup' });

    // A damaged copy is refused before anything changes.
    const damaged = newTarget();
    execFileSync('cp', ['-r', target, damaged]);
    writeFileSync(
      join(damaged, 'objects', full.path),
      Buffer.concat([original.subarray(0, 100), Buffer.from('x'), original.subarray(101)]),
    );
    expect(() => runScript(app, 'restore', damaged, storeEnv)).toThrow(/does not match its checksum\)\. Nothing was restored/);
    expect(await storage.get(photo!.fileName)).toBeNull();
    expect(await emails(app)).toContain(later.email);

    expect(runScript(app, 'restore', target, storeEnv)).toMatch(/Restored the backup .*2 objects, checksums verified/);
    expect((await readAll((await storage.get(photo!.fileName))!.body)).equals(original)).toBe(true);
    expect(await emails(app)).not.toContain(later.email);
  });
});
