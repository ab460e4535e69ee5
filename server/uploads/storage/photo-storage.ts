/**
 * Where photo files live, behind one small interface with two drivers: a local folder (the default)
 * and an S3-compatible bucket. Callers never list a store to decide what to delete: deletions come
 * only from the database's records (see photo-ledger.ts). `list` exists for backups and moves.
 */
import type { Readable } from 'node:stream';
import type { Config } from '../../config';

/** Stored names look like `Zk3…Q.jpg`: 22 url-safe base64 characters (128 random bits) and an extension. */
export const STORED_NAME = /^[\w-]{22}\.(?:jpg|webp)$/;

export function assertStoredName(name: string): void {
  if (!STORED_NAME.test(name)) throw new Error(`Refusing an unexpected stored photo name: ${JSON.stringify(name)}`);
}

export interface StoredObject {
  body: Readable;
  bytes: number;
}

export interface PhotoStorage {
  readonly kind: 'local' | 's3';
  /** Where this store is, for messages to a person ("the folder /srv/uploads/photos"). */
  readonly description: string;
  /** Writes a photo under a new name; a reader never sees half of it. */
  put(name: string, data: Buffer): Promise<void>;
  /** The photo's bytes as a stream, or null when there is no such file. */
  get(name: string): Promise<StoredObject | null>;
  /** Removes a photo (and any half-written copy of it); a name already gone is not an error. */
  remove(name: string): Promise<void>;
  /** Every stored photo name with its size. For backups, moves and checks; never to decide deletions. */
  list(): AsyncIterable<{ name: string; bytes: number }>;
  /** The owner marker: which install this store belongs to (null before first use). */
  readMarker(): Promise<string | null>;
  writeMarker(content: string): Promise<void>;
}

export type StorageConfig = Pick<Config, 'UPLOAD_DIR'> &
  Partial<
    Pick<
      Config,
      | 'PHOTO_STORE'
      | 'S3_ENDPOINT'
      | 'S3_REGION'
      | 'S3_BUCKET'
      | 'S3_ACCESS_KEY_ID'
      | 'S3_SECRET_ACCESS_KEY'
      | 'S3_FORCE_PATH_STYLE'
      | 'S3_PREFIX'
    >
  >;

/** The name of the owner marker inside a store (a dotfile in the folder, an object beside the photos). */
export const MARKER_NAME = '.blockpost-store.json';

export async function readAll(stream: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(Buffer.isBuffer(chunk) ? chunk : Buffer.from(chunk as Uint8Array));
  return Buffer.concat(chunks);
}
