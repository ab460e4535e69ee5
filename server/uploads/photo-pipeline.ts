/**
 * The photo pipeline, usable with or without HTTP: receive (multer, in memory, with limits), check
 * each file by its bytes, and re-encode it with sharp to a bounded size plus a thumbnail with every
 * piece of metadata (GPS position, camera, dates) left behind. Writing and database rows are in
 * photo-store.ts.
 */
import type { RequestHandler } from 'express';
import multer from 'multer';
import sharp, { type Metadata, type OutputInfo, type Sharp } from 'sharp';
import { fileTypeFromBuffer } from 'file-type';
import {
  MAX_PHOTO_BYTES, MAX_PHOTOS_PER_UPLOAD, PHOTO_FIELD, PHOTO_LONG_SIDE, THUMB_LONG_SIDE, type PhotoMime,
} from '@shared/schemas/photos';
import { fromMulterError, inBatch, PhotoRejectedError, photoRefusals } from './photo-errors';
import type { PhotoQueue } from './photo-queue';

/** A received file: what multer's memory storage gives, or what a seeder builds. */
export interface IncomingPhotoFile {
  originalname: string;
  buffer: Buffer;
}

export type PhotoFormat = 'jpeg' | 'webp';

export interface EncodedImage {
  data: Buffer;
  width: number;
  height: number;
}

export interface EncodedPhoto {
  originalName: string;
  originalBytes: number;
  mime: PhotoMime;
  extension: 'jpg' | 'webp';
  full: EncodedImage;
  thumb: EncodedImage;
}

/** Larger pictures are refused before decoding: a 15 MB file can still unpack to gigabytes of pixels. */
export const MAX_INPUT_PIXELS = 100_000_000;

type Kind = 'JPEG' | 'PNG' | 'WebP' | 'HEIC';
const kindByMime: Record<string, Kind> = {
  'image/jpeg': 'JPEG',
  'image/png': 'PNG',
  'image/webp': 'WebP',
  'image/heic': 'HEIC',
  'image/heif': 'HEIC',
  'image/heic-sequence': 'HEIC',
  'image/heif-sequence': 'HEIC',
};
// What sharp's metadata() calls each kind, to catch a file whose magic bytes and body disagree.
const sharpFormatByKind: Record<Kind, string> = { JPEG: 'jpeg', PNG: 'png', WebP: 'webp', HEIC: 'heif' };

/**
 * Whether this server's sharp can decode HEIC. The prebuilt sharp binaries read AVIF only (HEVC
 * decoding is patent-encumbered); a libvips built with libde265 lists `.heic` among its suffixes.
 */
export function heicReadable(): boolean {
  const heif = (sharp.format as unknown as Record<string, { input?: { buffer?: boolean; fileSuffix?: string[] } }>).heif;
  return Boolean(heif?.input?.buffer && heif.input.fileSuffix?.includes('.heic'));
}

/** File names are only ever shown, never used for storage; names that try to be paths are refused anyway. */
export function isSafeFileName(name: string): boolean {
  if (!name || name.length > 255) return false;
  // Control characters (U+0000–U+001F, U+007F) hide what a name says when it is shown.
  // eslint-disable-next-line no-control-regex
  if (/[/\\\u0000-\u001f\u007f]/.test(name)) return false;
  return name !== '.' && name !== '..';
}

function looksLikeSvg(buffer: Buffer): boolean {
  const head = buffer.subarray(0, 4096).toString('utf8').toLowerCase();
  return head.includes('<svg') || (head.trimStart().startsWith('<?xml') && head.includes('svg'));
}

/**
 * Checks one file by its content: non-empty, within the size limit, magic bytes of a photo kind
 * we take, and a header sharp can read that agrees with those bytes. Throws a PhotoRejectedError.
 */
export async function inspectPhoto(file: IncomingPhotoFile): Promise<Kind> {
  const name = file.originalname;
  if (!isSafeFileName(name)) throw photoRefusals.badName(name);
  if (file.buffer.length === 0) throw photoRefusals.empty(name);
  if (file.buffer.length > MAX_PHOTO_BYTES) throw photoRefusals.tooLarge(name);
  const heic = heicReadable();
  const detected = await fileTypeFromBuffer(file.buffer);
  const kind = detected ? kindByMime[detected.mime] : undefined;
  if (!kind) throw looksLikeSvg(file.buffer) ? photoRefusals.drawing(name, heic) : photoRefusals.notAPhoto(name, heic);
  if (kind === 'HEIC' && !heic) throw photoRefusals.heicUnreadable(name);
  let meta: Metadata;
  try {
    meta = await sharp(file.buffer, { failOn: 'warning', limitInputPixels: false }).metadata();
  } catch {
    throw photoRefusals.unreadable(name, kind);
  }
  if (meta.format !== sharpFormatByKind[kind] || !meta.width || !meta.height) throw photoRefusals.unreadable(name, kind);
  if (meta.width * meta.height > MAX_INPUT_PIXELS) throw photoRefusals.tooManyPixels(name, meta.width, meta.height, MAX_INPUT_PIXELS);
  return kind;
}

function encoder(image: Sharp, format: PhotoFormat) {
  return format === 'webp' ? image.webp({ quality: 80 }) : image.jpeg({ quality: 82, progressive: true });
}

/**
 * Re-encodes a checked photo: turned upright by its EXIF orientation, flattened on white, converted
 * to sRGB, fitted inside PHOTO_LONG_SIDE (never enlarged), plus a THUMB_LONG_SIDE thumbnail. sharp
 * writes no metadata unless asked (keepExif / withMetadata), so none of the input's EXIF, XMP,
 * IPTC or GPS survives. A full decode happens here, so damaged pixel data is refused too.
 */
export async function encodePhoto(file: IncomingPhotoFile, kind: string, format: PhotoFormat = 'jpeg'): Promise<EncodedPhoto> {
  const fit = (side: number) => ({ width: side, height: side, fit: 'inside' as const, withoutEnlargement: true });
  let full: { data: Buffer; info: OutputInfo };
  let thumb: { data: Buffer; info: OutputInfo };
  try {
    const decoded = sharp(file.buffer, { failOn: 'warning', limitInputPixels: MAX_INPUT_PIXELS, autoOrient: true })
      .resize(fit(PHOTO_LONG_SIDE))
      .flatten({ background: '#ffffff' });
    full = await encoder(decoded, format).toBuffer({ resolveWithObject: true });
    thumb = await encoder(sharp(full.data).resize(fit(THUMB_LONG_SIDE)), format).toBuffer({ resolveWithObject: true });
  } catch {
    throw photoRefusals.unreadable(file.originalname, kind);
  }
  return {
    originalName: file.originalname,
    originalBytes: file.buffer.length,
    mime: format === 'webp' ? 'image/webp' : 'image/jpeg',
    extension: format === 'webp' ? 'webp' : 'jpg',
    full: { data: full.data, width: full.info.width, height: full.info.height },
    thumb: { data: thumb.data, width: thumb.info.width, height: thumb.info.height },
  };
}

/**
 * Checks and re-encodes a whole batch, one file at a time to keep memory bounded. One bad file
 * refuses the batch, naming that file, before anything is written. With a queue (the server's), the
 * encoding waits its turn there and a full queue refuses the batch with PhotosBusyError (503).
 */
export async function preparePhotos(
  files: readonly IncomingPhotoFile[],
  format: PhotoFormat = 'jpeg',
  queue?: PhotoQueue,
): Promise<EncodedPhoto[]> {
  if (files.length === 0) throw photoRefusals.noFiles();
  if (files.length > MAX_PHOTOS_PER_UPLOAD) throw photoRefusals.tooMany();
  try {
    // Check every file first, so a bad last file is reported before time goes into encoding.
    const kinds: Kind[] = [];
    for (const file of files) kinds.push(await inspectPhoto(file));
    const tasks = files.map((file, i) => async () => {
      const photo = await encodePhoto(file, kinds[i]!, format);
      // After re-encoding: `photo.full.data` and `photo.thumb.data` are the stored bytes. Work derived
      // from them (such as colour statistics) belongs here, inside the bounded queue and outside any
      // transaction; the rows are written in commitStagedPhotos (photo-store.ts).
      return photo;
    });
    if (queue) return await queue.runBatch(tasks);
    const encoded: EncodedPhoto[] = [];
    for (const task of tasks) encoded.push(await task());
    return encoded;
  } catch (error) {
    throw error instanceof PhotoRejectedError ? inBatch(error, files.length) : error;
  }
}

/**
 * Multer for one route, never global: memory storage, field `photos` only, at most
 * MAX_PHOTOS_PER_UPLOAD files of MAX_PHOTO_BYTES each, no other fields worth the name. Names are
 * kept as sent (preservePath) so path-like names can be refused rather than silently trimmed.
 * Leaves the files in `req.files`; errors arrive as PhotoRejectedError (JSON 400/413).
 */
export function photoUploadMiddleware(): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    preservePath: true,
    defParamCharset: 'utf8',
    limits: {
      fileSize: MAX_PHOTO_BYTES,
      files: MAX_PHOTOS_PER_UPLOAD,
      fields: 5,
      fieldSize: 1024,
      fieldNameSize: 64,
      parts: MAX_PHOTOS_PER_UPLOAD + 5,
      headerPairs: 50,
    },
    fileFilter: (_req, file, cb) => {
      if (file.fieldname !== PHOTO_FIELD) return cb(photoRefusals.wrongField(file.fieldname));
      if (!isSafeFileName(file.originalname)) return cb(photoRefusals.badName(file.originalname));
      cb(null, true);
    },
  }).array(PHOTO_FIELD, MAX_PHOTOS_PER_UPLOAD);

  return (req, res, next) => {
    if (!req.is('multipart/form-data')) return next(photoRefusals.notMultipart());
    upload(req, res, (error?: unknown) => next(error ? fromMulterError(error) : undefined));
  };
}

/** The files multer left on the request, as pipeline input. */
export function receivedFiles(req: Express.Request): IncomingPhotoFile[] {
  const files = (req as { files?: unknown }).files;
  if (!Array.isArray(files)) return [];
  return (files as Express.Multer.File[]).map((f) => ({ originalname: f.originalname, buffer: f.buffer }));
}
