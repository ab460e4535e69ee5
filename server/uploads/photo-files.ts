/**
 * Photo files on disk: generated names only, written through a temporary file and a rename so a
 * reader never sees half a file, removed when their rows go, and swept when a crash left them
 * without a row.
 */
import { randomBytes } from 'node:crypto';
import { mkdir, open, readdir, rename, stat, unlink } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import type { Sequelize } from 'sequelize';
import { QueryTypes } from 'sequelize';

/** Stored names look like `Zk3…Q.jpg`: 22 url-safe base64 characters (128 random bits) and an extension. */
const STORED_NAME = /^[A-Za-z0-9_-]{22}\.(jpg|webp)$/;
const TEMP_PREFIX = '.partial-';

export function photoDir(uploadDir: string): string {
  return resolve(uploadDir, 'photos');
}

export function newStoredName(extension: 'jpg' | 'webp'): string {
  return `${randomBytes(16).toString('base64url')}.${extension}`;
}

/** The absolute path of a stored file; refuses anything that is not a name we generated. */
export function storedPath(uploadDir: string, name: string): string {
  if (!STORED_NAME.test(name)) throw new Error(`Refusing an unexpected stored photo name: ${JSON.stringify(name)}`);
  return join(photoDir(uploadDir), name);
}

/**
 * Writes data under a new name atomically: into a temporary file in the same folder, flushed to
 * disk, then renamed. On any failure the temporary file is removed.
 */
export async function writeStoredFile(uploadDir: string, name: string, data: Buffer): Promise<void> {
  const dir = photoDir(uploadDir);
  await mkdir(dir, { recursive: true });
  const target = storedPath(uploadDir, name);
  const temp = join(dir, `${TEMP_PREFIX}${randomBytes(8).toString('hex')}`);
  try {
    // 'wx' fails rather than follows an existing path.
    const handle = await open(temp, 'wx', 0o640);
    try {
      await handle.writeFile(data);
      await handle.sync();
    } finally {
      await handle.close();
    }
    await rename(temp, target);
  } catch (error) {
    await unlink(temp).catch(() => undefined);
    throw error;
  }
}

/** Removes stored files, ignoring ones already gone. */
export async function removeStoredFiles(uploadDir: string, names: readonly string[]): Promise<void> {
  await Promise.all(
    names.map((name) =>
      unlink(storedPath(uploadDir, name)).catch((error: NodeJS.ErrnoException) => {
        if (error.code !== 'ENOENT') throw error;
      }),
    ),
  );
}

export interface SweepResult {
  removed: string[];
}

/**
 * Removes files in the photo folder that no photo row names (left by a crash between writing and
 * committing, or by a caller's transaction that rolled back) and temporary files, once they are
 * older than `graceMs` — younger ones may belong to an upload still in flight on another node.
 */
export async function sweepOrphanPhotoFiles(sequelize: Sequelize, uploadDir: string, graceMs = 60 * 60 * 1000): Promise<SweepResult> {
  const dir = photoDir(uploadDir);
  let entries: string[];
  try {
    entries = await readdir(dir);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return { removed: [] };
    throw error;
  }
  const cutoff = Date.now() - graceMs;
  const old: string[] = [];
  for (const name of entries) {
    const info = await stat(join(dir, name)).catch(() => null);
    if (info?.isFile() && info.mtimeMs <= cutoff) old.push(name);
  }
  if (old.length === 0) return { removed: [] };
  const rows = await sequelize.query<{ name: string }>(
    `SELECT file_name AS name FROM photos WHERE file_name IN (:names)
     UNION SELECT thumb_file_name FROM photos WHERE thumb_file_name IN (:names)`,
    { replacements: { names: old }, type: QueryTypes.SELECT },
  );
  const known = new Set(rows.map((r) => r.name));
  const removed = old.filter((name) => !known.has(name) && (STORED_NAME.test(name) || name.startsWith(TEMP_PREFIX)));
  for (const name of removed) await unlink(join(dir, name)).catch(() => undefined);
  return { removed };
}
