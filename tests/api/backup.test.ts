import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { signedInUser } from '../helpers/factories';
import { execFileSync } from 'node:child_process';
import { restore } from '../../scripts/lib/backup';

/** Runs `npm run backup` / `npm run restore`'s script against this test's database and uploads. */
function runScript(script: 'backup' | 'restore', folder: string, uploadDir: string) {
  return execFileSync(process.execPath, ['node_modules/tsx/dist/cli.mjs', `scripts/${script}.ts`, folder], {
    env: { ...process.env, DATABASE_URL: app.databaseUrl, UPLOAD_DIR: uploadDir },
    encoding: 'utf8',
  });
}

let app: TestApp;
beforeAll(async () => {
  app = await createTestApp();
});
afterAll(() => app.close());

it('round-trips the database and the uploads through backup and restore', async () => {
  const kept = await signedInUser(app, { displayName: 'Kept Before Backup' });
  const uploadDir = app.deps.config.UPLOAD_DIR;
  writeFileSync(join(uploadDir, 'photo-kept.jpg'), 'pretend image bytes');
  mkdirSync(join(uploadDir, 'photos'), { recursive: true }); // where the app keeps block photos
  writeFileSync(join(uploadDir, 'photos', 'block-kept.jpg'), 'nested image bytes');
  const target = join(mkdtempSync(join(tmpdir(), 'blockpost-backup-')), 'snapshot');

  expect(runScript('backup', target, uploadDir)).toMatch(/and 2 uploaded files/);

  // Things change after the backup: a new account, a deleted file, a new file.
  const later = await signedInUser(app, { displayName: 'Added After Backup' });
  rmSync(join(uploadDir, 'photo-kept.jpg'));
  writeFileSync(join(uploadDir, 'photo-later.jpg'), 'later bytes');

  await app.deps.pool.query('SELECT 1'); // the app's pool survives the restore below
  expect(runScript('restore', target, uploadDir)).toMatch(/Restored the backup/);

  const { rows } = await app.deps.pool.query('SELECT email FROM users ORDER BY id');
  const emails = rows.map((r: { email: string }) => r.email);
  expect(emails).toContain(kept.email);
  expect(emails).not.toContain(later.email);
  expect(readdirSync(uploadDir).filter((f) => !f.startsWith('.')).sort()).toEqual(['photo-kept.jpg', 'photos']);
  expect(readFileSync(join(uploadDir, 'photo-kept.jpg'), 'utf8')).toBe('pretend image bytes');
  expect(readFileSync(join(uploadDir, 'photos', 'block-kept.jpg'), 'utf8')).toBe('nested image bytes');
});

it('refuses a folder that is not a backup', () => {
  const empty = mkdtempSync(join(tmpdir(), 'not-a-backup-'));
  expect(() => restore({ databaseUrl: app.databaseUrl, uploadDir: empty, source: empty })).toThrow(/not a Blockpost backup/);
});
