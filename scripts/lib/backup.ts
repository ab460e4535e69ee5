/**
 * Backup and restore of everything Blockpost keeps: the database (pg_dump custom format) and the
 * uploads folder (tar), side by side in one folder with a manifest.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync, readdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { ensurePostgresBinaries } from './postgres';

export interface BackupManifest {
  createdAt: string;
  database: string;
  uploads: number;
  format: 1;
}

function pgTool(name: 'pg_dump' | 'pg_restore') {
  return join(ensurePostgresBinaries(), name);
}

/** Files anywhere under `dir` (photos live in subfolders), leaving out dotfiles such as .gitkeep. */
function countFiles(dir: string) {
  if (!existsSync(dir)) return 0;
  return readdirSync(dir, { recursive: true, withFileTypes: true }).filter((e) => e.isFile() && !e.name.startsWith('.')).length;
}

/** Writes `<target>/database.dump`, `<target>/uploads.tar` and `<target>/manifest.json`. */
export function backup(opts: { databaseUrl: string; uploadDir: string; target: string }): BackupManifest {
  const target = resolve(opts.target);
  mkdirSync(target, { recursive: true });
  execFileSync(pgTool('pg_dump'), ['--format=custom', '--no-owner', '--file', join(target, 'database.dump'), opts.databaseUrl], { stdio: 'pipe' });
  const uploadDir = resolve(opts.uploadDir);
  mkdirSync(uploadDir, { recursive: true });
  execFileSync('tar', ['-cf', join(target, 'uploads.tar'), '-C', uploadDir, '.'], { stdio: 'pipe' });
  const manifest: BackupManifest = {
    createdAt: new Date().toISOString(),
    database: new URL(opts.databaseUrl).pathname.slice(1),
    uploads: countFiles(uploadDir),
    format: 1,
  };
  writeFileSync(join(target, 'manifest.json'), JSON.stringify(manifest, null, 2));
  return manifest;
}

/**
 * Replaces the database's contents and the uploads folder with a backup's. The app should be stopped:
 * a restore is a deliberate rewind, not a merge.
 */
export function restore(opts: { databaseUrl: string; uploadDir: string; source: string }): BackupManifest {
  const source = resolve(opts.source);
  const manifestFile = join(source, 'manifest.json');
  if (!existsSync(manifestFile)) throw new Error(`${source} is not a Blockpost backup (no manifest.json).`);
  const manifest = JSON.parse(readFileSync(manifestFile, 'utf8')) as BackupManifest;
  execFileSync(
    pgTool('pg_restore'),
    ['--clean', '--if-exists', '--no-owner', '--single-transaction', '--dbname', opts.databaseUrl, join(source, 'database.dump')],
    { stdio: 'pipe' },
  );
  const uploadDir = resolve(opts.uploadDir);
  rmSync(uploadDir, { recursive: true, force: true });
  mkdirSync(uploadDir, { recursive: true });
  execFileSync('tar', ['-xf', join(source, 'uploads.tar'), '-C', uploadDir], { stdio: 'pipe' });
  return manifest;
}
