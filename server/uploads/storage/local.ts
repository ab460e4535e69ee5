/** Photos in a local folder: UPLOAD_DIR/photos/<name>, written through a temporary file and a rename. */
import { createReadStream } from 'node:fs';
import { mkdir, open, readdir, readFile, rename, stat, unlink, writeFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { assertStoredName, MARKER_NAME, STORED_NAME, type PhotoStorage, type StoredObject } from './photo-storage';

// A half-written file is named after its target, so removing a name also removes what a crash left mid-write.
const PARTIAL_PREFIX = '.partial-';

export function photoDir(uploadDir: string): string {
  return resolve(uploadDir, 'photos');
}

const ignoreMissing = (error: NodeJS.ErrnoException) => {
  if (error.code !== 'ENOENT') throw error;
};

export function localStorage(uploadDir: string): PhotoStorage {
  const dir = photoDir(uploadDir);
  const path = (name: string) => {
    assertStoredName(name);
    return join(dir, name);
  };
  return {
    kind: 'local',
    description: `the folder ${dir}`,

    async put(name, data) {
      const target = path(name);
      await mkdir(dir, { recursive: true });
      const temp = join(dir, `${PARTIAL_PREFIX}${name}`);
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
    },

    async get(name): Promise<StoredObject | null> {
      const file = path(name);
      try {
        const info = await stat(file);
        return { body: createReadStream(file), bytes: info.size };
      } catch (error) {
        if ((error as NodeJS.ErrnoException).code === 'ENOENT') return null;
        throw error;
      }
    },

    async remove(name) {
      const file = path(name);
      await unlink(file).catch(ignoreMissing);
      await unlink(join(dir, `${PARTIAL_PREFIX}${name}`)).catch(ignoreMissing);
    },

    async *list() {
      let entries: string[];
      try {
        entries = await readdir(dir);
      } catch (error) {
        if ((error as NodeJS.ErrnoException).code === 'ENOENT') return;
        throw error;
      }
      for (const name of entries.sort()) {
        if (!STORED_NAME.test(name)) continue;
        const info = await stat(join(dir, name)).catch(() => null);
        if (info?.isFile()) yield { name, bytes: info.size };
      }
    },

    async readMarker() {
      return readFile(join(dir, MARKER_NAME), 'utf8').catch((error: NodeJS.ErrnoException) => {
        if (error.code === 'ENOENT') return null;
        throw error;
      });
    },

    async writeMarker(content) {
      await mkdir(dir, { recursive: true });
      // 'wx': the first install to claim the folder keeps it, even if two start at once.
      await writeFile(join(dir, MARKER_NAME), content, { flag: 'wx', mode: 0o640 });
    },
  };
}
