/**
 * Backup and restore of everything Blockpost keeps: the database (pg_dump custom format) and the photo
 * store — the uploads folder (tar) or, with PHOTO_STORE=s3, every object of the bucket (copied into
 * `objects/`) — side by side in one folder with a manifest that lists every file and object with its
 * size and SHA-256. A restore checks every one of them before it changes anything.
 */
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { ensurePostgresBinaries } from './postgres';
import { photoStorage, type PhotoStorage, type StorageConfig } from '../../server/uploads/storage';
import { readAll } from '../../server/uploads/storage/photo-storage';

export interface ManifestObject {
  /** Path inside the uploads folder (`photos/…`), or `photos/<name>` for a bucket's object. */
  path: string;
  bytes: number;
  sha256: string;
}

export interface BackupManifest {
  createdAt: string;
  database: string;
  /** Files or objects backed up, leaving out dotfiles such as .gitkeep and the store's owner marker. */
  uploads: number;
  store: 'local' | 's3';
  objects: ManifestObject[];
  format: 2;
}

export class BackupMismatchError extends Error {}

function pgTool(name: 'pg_dump' | 'pg_restore') {
  return join(ensurePostgresBinaries(), name);
}

const sha256 = (data: Buffer) => createHash('sha256').update(data).digest('hex');

/** Every file under `dir` with its size and checksum, paths with forward slashes. */
function describeFolder(dir: string): ManifestObject[] {
  if (!existsSync(dir)) return [];
  return readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile())
    .map((e) => {
      const full = join(e.parentPath, e.name);
      const data = readFileSync(full);
      return { path: relative(dir, full).split(sep).join('/'), bytes: data.length, sha256: sha256(data) };
    })
    .sort((a, b) => a.path.localeCompare(b.path));
}

const counted = (objects: readonly ManifestObject[]) => objects.filter((o) => !o.path.split('/').pop()!.startsWith('.')).length;

/**
 * Checks that `dir` holds exactly the manifest's files with their sizes and checksums; throws
 * BackupMismatchError listing what differs.
 */
function verifyFolder(dir: string, expected: readonly ManifestObject[]) {
  const found = new Map(describeFolder(dir).map((o) => [o.path, o]));
  const problems: string[] = [];
  for (const want of expected) {
    const got = found.get(want.path);
    if (!got) problems.push(`${want.path} is missing`);
    else if (got.bytes !== want.bytes || got.sha256 !== want.sha256) problems.push(`${want.path} does not match its checksum`);
    found.delete(want.path);
  }
  for (const extra of found.keys()) problems.push(`${extra} is not in the manifest`);
  if (problems.length) {
    const shown = problems.slice(0, 10).join('; ');
    throw new BackupMismatchError(
      `This backup does not match its manifest (${problems.length} problem${problems.length === 1 ? '' : 's'}: ${shown}). ` +
        'Nothing was restored: the database and the photos are as they were. Use another backup, or a good copy of this one.',
    );
  }
}

export interface BackupOptions {
  databaseUrl: string;
  /** The photo store's configuration: UPLOAD_DIR, and the S3 settings when PHOTO_STORE=s3. */
  store: StorageConfig;
  target: string;
}

/** Writes `<target>/database.dump`, the photos (`uploads.tar` or `objects/`) and `<target>/manifest.json`. */
export async function backup(opts: BackupOptions): Promise<BackupManifest> {
  const target = resolve(opts.target);
  mkdirSync(target, { recursive: true });
  execFileSync(pgTool('pg_dump'), ['--format=custom', '--no-owner', '--file', join(target, 'database.dump'), opts.databaseUrl], {
    stdio: 'pipe',
  });
  const kind = opts.store.PHOTO_STORE ?? 'local';
  let objects: ManifestObject[];
  if (kind === 'local') {
    const uploadDir = resolve(opts.store.UPLOAD_DIR);
    mkdirSync(uploadDir, { recursive: true });
    execFileSync('tar', ['-cf', join(target, 'uploads.tar'), '-C', uploadDir, '.'], { stdio: 'pipe' });
    objects = describeFolder(uploadDir);
  } else {
    objects = await copyBucket(photoStorage(opts.store), join(target, 'objects'));
  }
  const manifest: BackupManifest = {
    createdAt: new Date().toISOString(),
    database: new URL(opts.databaseUrl).pathname.slice(1),
    uploads: counted(objects),
    store: kind,
    objects,
    format: 2,
  };
  writeFileSync(join(target, 'manifest.json'), JSON.stringify(manifest, null, 2));
  return manifest;
}

/** Downloads every photo object into `dir/photos/`, hashing each as it arrives. */
async function copyBucket(storage: PhotoStorage, dir: string): Promise<ManifestObject[]> {
  mkdirSync(join(dir, 'photos'), { recursive: true });
  const objects: ManifestObject[] = [];
  for await (const { name } of storage.list()) {
    const file = await storage.get(name);
    if (!file) continue; // removed between the listing and the copy
    const data = await readAll(file.body);
    writeFileSync(join(dir, 'photos', name), data);
    objects.push({ path: `photos/${name}`, bytes: data.length, sha256: sha256(data) });
  }
  return objects.sort((a, b) => a.path.localeCompare(b.path));
}

function readManifest(source: string): BackupManifest {
  const manifestFile = join(source, 'manifest.json');
  if (!existsSync(manifestFile)) throw new Error(`${source} is not a Blockpost backup (no manifest.json).`);
  const manifest = JSON.parse(readFileSync(manifestFile, 'utf8')) as BackupManifest;
  if (manifest.format !== 2 || !Array.isArray(manifest.objects)) {
    throw new Error(`${source} is a backup without checksums (an older format); restore it by hand or make a new backup.`);
  }
  return manifest;
}

/**
 * Replaces the database's contents and the photo store's with a backup's, after checking every
 * file of the backup against the manifest's sizes and checksums (BackupMismatchError changes
 * nothing). The app should be stopped: a restore is a deliberate rewind, not a merge. A bucket
 * gets the backup's objects back; objects added since stay (no name in the database refers to them).
 */
export async function restore(opts: { databaseUrl: string; store: StorageConfig; source: string }): Promise<BackupManifest> {
  const source = resolve(opts.source);
  const manifest = readManifest(source);
  const kind = opts.store.PHOTO_STORE ?? 'local';
  const uploadDir = resolve(opts.store.UPLOAD_DIR);
  let unpacked: string | null = null;
  try {
    // Check everything first.
    if (manifest.store === 'local') {
      mkdirSync(dirname(uploadDir), { recursive: true });
      unpacked = mkdtempSync(join(dirname(uploadDir), '.restore-'));
      execFileSync('tar', ['-xf', join(source, 'uploads.tar'), '-C', unpacked], { stdio: 'pipe' });
      verifyFolder(unpacked, manifest.objects);
    } else {
      verifyFolder(join(source, 'objects'), manifest.objects);
    }
    if (kind !== manifest.store) {
      throw new Error(
        `This backup holds a ${manifest.store === 's3' ? 'bucket' : 'folder'}'s photos but this install keeps them in a ` +
          `${kind === 's3' ? 'bucket' : 'folder'} (PHOTO_STORE=${kind}). Restore with PHOTO_STORE=${manifest.store}, then move the photos.`,
      );
    }

    execFileSync(
      pgTool('pg_restore'),
      [
        '--clean',
        '--if-exists',
        '--no-owner',
        '--single-transaction',
        '--dbname',
        opts.databaseUrl,
        join(source, 'database.dump'),
      ],
      { stdio: 'pipe' },
    );
    if (unpacked) {
      rmSync(uploadDir, { recursive: true, force: true });
      renameSync(unpacked, uploadDir);
      unpacked = null;
    } else {
      const storage = photoStorage(opts.store);
      for (const object of manifest.objects) {
        const name = object.path.slice('photos/'.length);
        await storage.put(name, readFileSync(join(source, 'objects', object.path)));
      }
    }
    return manifest;
  } finally {
    if (unpacked) rmSync(unpacked, { recursive: true, force: true });
  }
}
