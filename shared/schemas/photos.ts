import { z } from 'zod';
import { idParam } from './guilds';

/** The multipart field every photo upload uses. */
export const PHOTO_FIELD = 'photos';
/** Largest file accepted, before re-encoding: 15 MB. */
export const MAX_PHOTO_BYTES = 15 * 1024 * 1024;
/** Most files in one upload. */
export const MAX_PHOTOS_PER_UPLOAD = 10;
/** Stored photos fit inside this many pixels on their long side. */
export const PHOTO_LONG_SIDE = 2400;
/** Thumbnails fit inside this many pixels on their long side. */
export const THUMB_LONG_SIDE = 480;

export const photoMimes = ['image/jpeg', 'image/webp'] as const;
export type PhotoMime = (typeof photoMimes)[number];

/** What a browser may report for a file we take (HEIC often comes with an empty type). */
export const acceptedUploadTypes = ['image/jpeg', 'image/png', 'image/webp', 'image/heic', 'image/heif'] as const;
const acceptedExtensions = ['.jpg', '.jpeg', '.jpe', '.png', '.webp', '.heic', '.heif'];

export const blockPhotosParams = z.object({ blockId: idParam });
export const photoParams = z.object({ photoId: idParam });
export const photoQuery = z.object({
  size: z.enum(['full', 'thumb'], { error: 'size is “full” or “thumb”.' }).default('full'),
});
export type PhotoSize = z.infer<typeof photoQuery>['size'];

export interface PhotoDto {
  id: number;
  guildId: number;
  blockId: number | null;
  chatMessageId: number | null;
  uploadedBy: { id: number; displayName: string } | null;
  mime: PhotoMime;
  width: number;
  height: number;
  thumbWidth: number;
  thumbHeight: number;
  bytes: number;
  createdAt: string;
  /** Same-origin URLs served only to members of the photo's guild. */
  url: string;
  thumbUrl: string;
}

/** The answer to POST /api/blocks/:blockId/photos: the new photos and the block's state after them. */
export interface BlockPhotosUploadDto {
  photos: PhotoDto[];
  block: { id: number; state: string };
}

/** Size of an image scaled to fit inside a square of `longSide` pixels, never enlarged. */
export function fitInside(width: number, height: number, longSide: number): { width: number; height: number } {
  const scale = Math.min(1, longSide / Math.max(width, height));
  return { width: Math.max(1, Math.round(width * scale)), height: Math.max(1, Math.round(height * scale)) };
}

export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} bytes`;
  if (bytes < 1024 * 1024) return `${Math.round(bytes / 1024)} KB`;
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
}

/**
 * A file name as it is safe to show back to a person: control characters removed, shortened.
 * Names are shown only; storage names are always generated.
 */
export function displayFileName(name: string | undefined | null): string {
  // eslint-disable-next-line no-control-regex -- control characters are exactly what is removed
  const clean = (name ?? '').replace(/[\u0000-\u001f\u007f]/g, '').trim();
  if (!clean) return 'the unnamed file';
  return clean.length > 80 ? `…${clean.slice(-79)}` : clean;
}

/**
 * The first check on a chosen file, run in the browser before sending (the server checks the
 * content again by its bytes). Returns a message for the person, or null when the file may go.
 */
export function checkChosenFile(file: { name: string; size: number; type: string }): string | null {
  const name = `“${displayFileName(file.name)}”`;
  if (file.size === 0) return `${name} is empty (0 bytes). Choose the photo again.`;
  if (file.size > MAX_PHOTO_BYTES) {
    return `${name} is ${formatBytes(file.size)}, more than the 15 MB we take. Choose a smaller size in your camera or photo app and try again.`;
  }
  const lower = file.name.toLowerCase();
  const typeOk = (acceptedUploadTypes as readonly string[]).includes(file.type);
  const extOk = acceptedExtensions.some((ext) => lower.endsWith(ext));
  if (!typeOk && !(file.type === '' && extOk)) return `${name} is not a photo. Upload JPEG, PNG, WebP or HEIC pictures.`;
  return null;
}

/** Checks a whole choice of files: per-file messages plus the count limit. */
export function checkChosenFiles(files: readonly { name: string; size: number; type: string }[]): string[] {
  const messages = files.map(checkChosenFile).filter((m): m is string => m !== null);
  if (files.length > MAX_PHOTOS_PER_UPLOAD) {
    messages.push(`You chose ${files.length} photos; send at most ${MAX_PHOTOS_PER_UPLOAD} at a time.`);
  }
  return messages;
}
