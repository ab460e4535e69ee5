import { describe, expect, it } from 'vitest';
import sharp from 'sharp';
import exifReader from 'exif-reader';
import {
  encodePhoto,
  heicReadable,
  inspectPhoto,
  isSafeFileName,
  preparePhotos,
  type IncomingPhotoFile,
} from '../../server/uploads/photo-pipeline';
import { MulterError } from 'multer';
import { acceptedKindsText, fromMulterError, PhotoRejectedError } from '../../server/uploads/photo-errors';
import { PHOTO_LONG_SIDE, THUMB_LONG_SIDE } from '../../shared/schemas/photos';
import {
  elfExecutable,
  heicHeader,
  htmlPolyglot,
  jpegWithGps,
  jpegWithTrailingHtml,
  oversizedFile,
  picture,
  pixelBombPng,
  pngWithAlpha,
  svgWithScript,
  TEST_GPS,
  truncatedJpeg,
  windowsExecutable,
} from '../fixtures/photos';

const file = (originalname: string, buffer: Buffer): IncomingPhotoFile => ({ originalname, buffer });

async function refusal(run: Promise<unknown>): Promise<PhotoRejectedError> {
  const error = await run.then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(PhotoRejectedError);
  return error as PhotoRejectedError;
}

describe('re-encoding', () => {
  it('removes EXIF with the GPS position, camera and orientation from both files', async () => {
    const input = await jpegWithGps();
    // The fixture really carries a position, so the check below is not vacuous.
    const before = exifReader((await sharp(input).metadata()).exif!);
    expect(before.GPSInfo?.GPSLatitude).toEqual(TEST_GPS.latitude);
    expect(before.Image?.Make).toBe('Test Camera');

    const [photo] = await preparePhotos([file('garden.jpg', input)]);
    for (const image of [photo!.full, photo!.thumb]) {
      const meta = await sharp(image.data).metadata();
      expect(meta.format).toBe('jpeg');
      expect(meta.exif).toBeUndefined();
      expect(meta.xmp).toBeUndefined();
      expect(meta.iptc).toBeUndefined();
      expect(meta.orientation).toBeUndefined();
      expect(image.data.includes(Buffer.from('Test Camera'))).toBe(false);
    }
  });

  it('turns a photo upright by its EXIF orientation before dropping the flag', async () => {
    const input = await jpegWithGps(800, 600, 6);
    const [photo] = await preparePhotos([file('sideways.jpg', input)]);
    expect([photo!.full.width, photo!.full.height]).toEqual([600, 800]);
  });

  it('fits large photos inside the long side and makes a thumbnail, never enlarging small ones', async () => {
    const [big] = await preparePhotos([file('big.png', await picture('png', 3000, 2000))]);
    expect([big!.full.width, big!.full.height]).toEqual([PHOTO_LONG_SIDE, 1600]);
    expect([big!.thumb.width, big!.thumb.height]).toEqual([THUMB_LONG_SIDE, 320]);
    const [small] = await preparePhotos([file('small.webp', await picture('webp', 300, 200))]);
    expect([small!.full.width, small!.full.height]).toEqual([300, 200]);
    expect([small!.thumb.width, small!.thumb.height]).toEqual([300, 200]);
    expect(small!.originalBytes).toBeGreaterThan(0);
  });

  it('flattens transparency onto white for JPEG and can write WebP instead', async () => {
    const [flat] = await preparePhotos([file('cutout.png', await pngWithAlpha())]);
    const meta = await sharp(flat!.full.data).metadata();
    expect(meta.hasAlpha).toBe(false);
    const { data } = await sharp(flat!.full.data).raw().toBuffer({ resolveWithObject: true });
    expect([...data.subarray(0, 3)].every((v) => v > 250)).toBe(true);

    const [webp] = await preparePhotos([file('a.jpg', await picture('jpeg'))], 'webp');
    expect(webp!.mime).toBe('image/webp');
    expect(webp!.extension).toBe('webp');
    expect((await sharp(webp!.thumb.data).metadata()).format).toBe('webp');
  });

  it('keeps no byte of a payload appended after a real JPEG', async () => {
    const [photo] = await preparePhotos([file('trailing.jpg', await jpegWithTrailingHtml())]);
    expect(photo!.full.data.includes(Buffer.from('<script'))).toBe(false);
    expect(photo!.thumb.data.includes(Buffer.from('<script'))).toBe(false);
  });
});

describe('refusals, each naming the file', () => {
  it('refuses a Linux and a Windows executable renamed to .jpg', async () => {
    for (const [name, bytes] of [
      ['notes.jpg', elfExecutable()],
      ['setup.jpg', windowsExecutable()],
    ] as const) {
      const error = await refusal(inspectPhoto(file(name, bytes)));
      expect(error.status).toBe(415);
      expect(error.message).toBe(`“${name}” is not a photo. Upload ${acceptedKindsText(heicReadable())} pictures.`);
    }
  });

  it('refuses an SVG drawing with a script, saying what it is', async () => {
    const error = await refusal(inspectPhoto(file('block.svg', svgWithScript())));
    expect(error.status).toBe(415);
    expect(error.message).toMatch(/^“block\.svg” is a drawing \(SVG\), not a photo\./);
  });

  it('refuses JPEG magic bytes followed by HTML, and a JPEG cut in half', async () => {
    const poly = await refusal(preparePhotos([file('invite.jpg', htmlPolyglot())]));
    expect(poly.code).toBe('unreadable_photo');
    expect(poly.message).toMatch(/^“invite\.jpg” starts like a JPEG picture but cannot be read/);
    const cut = await refusal(preparePhotos([file('half.jpg', await truncatedJpeg())]));
    expect(cut.code).toBe('unreadable_photo');
  });

  it('refuses empty and oversized files and path-like names', async () => {
    expect((await refusal(inspectPhoto(file('empty.jpg', Buffer.alloc(0))))).message).toBe(
      '“empty.jpg” is empty (0 bytes). Choose the photo again.',
    );
    const big = await refusal(inspectPhoto(file('huge.jpg', oversizedFile())));
    expect(big.status).toBe(413);
    expect(big.message).toMatch(/^“huge\.jpg” is larger than 15 MB/);
    const jpeg = await picture('jpeg');
    for (const name of ['../../etc/cron.d/x.jpg', '..\\..\\boot.jpg', 'a/b.jpg', '..', 'bell\u0007.jpg']) {
      const error = await refusal(inspectPhoto(file(name, jpeg)));
      expect(error.code).toBe('bad_file_name');
    }
    expect(isSafeFileName('Quilt block — final (2).JPG')).toBe(true);
    expect(isSafeFileName('..hidden.jpg')).toBe(true);
  });

  it('refuses a picture whose header claims more pixels than we decode', async () => {
    const error = await refusal(inspectPhoto(file('bomb.png', pixelBombPng())));
    expect(error.status).toBe(413);
    expect(error.message).toMatch(/^“bomb\.png” is 20000 × 20000 pixels, more than the 100 megapixels/);
  });

  it('says plainly when this server cannot read HEIC', async () => {
    const run = inspectPhoto(file('IMG_0042.HEIC', heicHeader()));
    if (heicReadable()) {
      // A header alone is not a decodable picture even where HEIC is supported.
      expect((await refusal(run)).code).toBe('unreadable_photo');
    } else {
      const error = await refusal(run);
      expect(error.code).toBe('heic_unsupported');
      expect(error.message).toMatch(/^“IMG_0042\.HEIC” is a HEIC photo, which this server cannot read\. Send it as JPEG/);
    }
  });

  it('refuses the whole batch for one bad file, naming it, and refuses too many or none', async () => {
    const good = await picture('jpeg');
    const error = await refusal(
      preparePhotos([file('one.jpg', good), file('two.jpg', elfExecutable()), file('three.jpg', good)]),
    );
    expect(error.message).toMatch(/^“two\.jpg” is not a photo\..* None of the 3 photos were saved/);
    expect(error.fields).toEqual({ photos: error.message });

    const many = Array.from({ length: 11 }, (_, i) => file(`p${i}.jpg`, good));
    expect((await refusal(preparePhotos(many))).code).toBe('too_many_files');
    expect((await refusal(preparePhotos([]))).code).toBe('no_photos');
  });

  it('refuses a file whose magic bytes and body disagree at decode time', async () => {
    // A WebP container header glued onto JPEG data: file-type says WebP, the decoder finds no WebP.
    const jpeg = await picture('jpeg');
    const header = Buffer.alloc(12);
    header.write('RIFF', 0, 'latin1');
    header.writeUInt32LE(jpeg.length + 4, 4);
    header.write('WEBP', 8, 'latin1');
    const mixed = Buffer.concat([header, jpeg]);
    const error = await refusal(inspectPhoto(file('mixed.webp', mixed)));
    expect(error.message).toMatch(/^“mixed\.webp” starts like a WebP picture but cannot be read/);
    await expect(encodePhoto(file('mixed.webp', mixed), 'WebP')).rejects.toBeInstanceOf(PhotoRejectedError);
  });
});

describe('multer and busboy errors in plain words', () => {
  it('maps size, count, field and interrupted uploads to 4xx refusals', () => {
    const size = fromMulterError(
      Object.assign(new MulterError('LIMIT_FILE_SIZE', 'photos'), { filename: 'quilt-top.jpg' }),
    ) as PhotoRejectedError;
    expect([size.status, size.code, size.message]).toEqual([
      413,
      'file_too_large',
      expect.stringMatching(/^“quilt-top\.jpg” is larger than 15 MB/),
    ]);
    expect((fromMulterError(new MulterError('LIMIT_FILE_COUNT')) as PhotoRejectedError).code).toBe('too_many_files');
    expect((fromMulterError(new MulterError('LIMIT_UNEXPECTED_FILE', 'photos')) as PhotoRejectedError).code).toBe(
      'too_many_files',
    );
    expect((fromMulterError(new MulterError('LIMIT_UNEXPECTED_FILE', 'avatar')) as PhotoRejectedError).message).toMatch(
      /not “avatar”/,
    );
    const stopped = fromMulterError(new Error('Request aborted')) as PhotoRejectedError;
    expect([stopped.status, stopped.code]).toEqual([400, 'upload_interrupted']);
    const other = new Error('disk on fire');
    expect(fromMulterError(other)).toBe(other);
  });
});
