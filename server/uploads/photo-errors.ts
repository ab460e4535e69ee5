/**
 * Why a photo upload is refused, in words a person can act on. Every refusal names the file and
 * says what to do; the error middleware turns these into `{ error: { code, message, fields } }`.
 */
import { MulterError } from 'multer';
import { displayFileName, MAX_PHOTOS_PER_UPLOAD, PHOTO_FIELD } from '@shared/schemas/photos';
import { AppError } from '../http/errors';

export class PhotoRejectedError extends AppError {
  constructor(status: 400 | 413 | 415, code: string, message: string) {
    super(status, code, message, { [PHOTO_FIELD]: message });
  }
}

const quoted = (name: string | undefined) => `“${displayFileName(name)}”`;

/** The kinds we take, as said to a person; HEIC only where this server's image library reads it. */
export function acceptedKindsText(heicReadable: boolean) {
  return heicReadable ? 'JPEG, PNG, WebP or HEIC' : 'JPEG, PNG or WebP';
}

export const photoRefusals = {
  notAPhoto: (name: string, heicReadable: boolean) =>
    new PhotoRejectedError(415, 'not_a_photo', `${quoted(name)} is not a photo. Upload ${acceptedKindsText(heicReadable)} pictures.`),
  drawing: (name: string, heicReadable: boolean) =>
    new PhotoRejectedError(
      415,
      'not_a_photo',
      `${quoted(name)} is a drawing (SVG), not a photo. Upload ${acceptedKindsText(heicReadable)} pictures.`,
    ),
  heicUnreadable: (name: string) =>
    new PhotoRejectedError(
      415,
      'heic_unsupported',
      `${quoted(name)} is a HEIC photo, which this server cannot read. Send it as JPEG instead: on an iPhone, ` +
        'Settings › Camera › Formats › “Most Compatible” takes JPEG photos, and sharing a photo by mail usually converts it.',
    ),
  unreadable: (name: string, kind: string) =>
    new PhotoRejectedError(
      415,
      'unreadable_photo',
      `${quoted(name)} starts like a ${kind} picture but cannot be read as one — it may be damaged, or not really a photo. ` +
        'Open it on your device, save it again, and send the new copy.',
    ),
  tooManyPixels: (name: string, width: number, height: number, limit: number) =>
    new PhotoRejectedError(
      413,
      'too_many_pixels',
      `${quoted(name)} is ${width} × ${height} pixels, more than the ${Math.round(limit / 1_000_000)} megapixels we take. ` +
        'Save a smaller copy and try again.',
    ),
  empty: (name: string) => new PhotoRejectedError(400, 'empty_file', `${quoted(name)} is empty (0 bytes). Choose the photo again.`),
  tooLarge: (name: string | undefined) =>
    new PhotoRejectedError(
      413,
      'file_too_large',
      `${name ? quoted(name) : 'A file'} is larger than 15 MB. Choose a smaller size in your camera or photo app and try again.`,
    ),
  tooMany: () =>
    new PhotoRejectedError(400, 'too_many_files', `Send at most ${MAX_PHOTOS_PER_UPLOAD} photos at a time; nothing was saved.`),
  badName: (name: string) =>
    new PhotoRejectedError(
      400,
      'bad_file_name',
      `The file name ${quoted(name)} contains folder parts (“/”, “\\” or “..”) or hidden characters. Rename the file and choose it again.`,
    ),
  noFiles: () => new PhotoRejectedError(400, 'no_photos', `Choose at least one photo to upload (in the “${PHOTO_FIELD}” field).`),
  wrongField: (field: string | undefined) =>
    new PhotoRejectedError(
      400,
      'unexpected_field',
      `Photos are sent in the “${PHOTO_FIELD}” field${field ? `, not “${displayFileName(field)}”` : ''}; nothing was saved.`,
    ),
  notMultipart: () =>
    new PhotoRejectedError(400, 'not_multipart', `Send the photos as a multipart form with the field “${PHOTO_FIELD}”.`),
};

/** Adds to a refusal that the rest of the batch was not saved either, so the person resends it. */
export function inBatch(error: PhotoRejectedError, batchSize: number): PhotoRejectedError {
  if (batchSize < 2) return error;
  const message = `${error.message} None of the ${batchSize} photos were saved: remove that file and send the others again.`;
  return new PhotoRejectedError(error.status as 400 | 413 | 415, error.code, message);
}

/** Maps multer's and busboy's errors onto the refusals above; anything else goes on unchanged. */
export function fromMulterError(error: unknown): unknown {
  if (error instanceof PhotoRejectedError) return error;
  if (error instanceof MulterError) {
    const filename = (error as MulterError & { filename?: string }).filename;
    switch (error.code) {
      case 'LIMIT_FILE_SIZE':
        return photoRefusals.tooLarge(filename);
      case 'LIMIT_FILE_COUNT':
        return photoRefusals.tooMany();
      case 'LIMIT_UNEXPECTED_FILE':
        return error.field === PHOTO_FIELD ? photoRefusals.tooMany() : photoRefusals.wrongField(error.field);
      case 'LIMIT_PART_COUNT':
      case 'LIMIT_FIELD_COUNT':
        return new PhotoRejectedError(400, 'too_many_parts', 'The upload has too many parts. Send only the photos.');
      default:
        return new PhotoRejectedError(400, 'bad_upload', 'The upload could not be read. Choose the photos again and resend them.');
    }
  }
  // The person stopped the upload or lost the connection: their mistake to retry, not our failure.
  if (error instanceof Error && /^Request (?:aborted|closed|error)$/.test(error.message)) {
    return new PhotoRejectedError(400, 'upload_interrupted', 'The upload stopped before it finished. Nothing was saved; please send the photos again.');
  }
  // busboy refuses a part header it cannot read, such as a file name holding a NUL character.
  if (error instanceof Error && error.message === 'Malformed part header') {
    return new PhotoRejectedError(
      400,
      'bad_file_name',
      'A photo’s file name holds characters that cannot be read (such as NUL). Rename the photo and send it again.',
    );
  }
  // busboy's own complaints (a malformed multipart body) carry no status.
  if (error instanceof Error && /multipart|boundary|Unexpected end of form/i.test(error.message)) {
    return new PhotoRejectedError(400, 'bad_upload', 'The upload arrived incomplete or malformed. Please send the photos again.');
  }
  return error;
}
