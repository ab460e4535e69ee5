import { pipeline } from 'node:stream/promises';
import { Router, type Request, type Response } from 'express';
import { blockPhotosParams, photoParams, photoQuery, type PhotoSize } from '@shared/schemas/photos';
import { currentUser, requireUser } from '../auth/require-user';
import { route } from '../http/route';
import { NotFoundError } from '../http/errors';
import type { AppDeps } from '../deps';
import { photoUploadMiddleware, receivedFiles } from './photo-pipeline';
import { photoQueue } from './photo-queue';
import { canAddBlockPhotos, canRemovePhoto, canSeeBlockPhotos, canSeePhoto } from './photos.policy';
import { listBlockPhotos, openPhotoFile, removePhoto, uploadBlockPhotos } from './photos.service';

/** Block photos: upload (multipart field `photos`), list, serve to guild members only, remove. */
export function photosRouter(deps: AppDeps) {
  const router = Router();
  const upload = photoUploadMiddleware();

  router.get(
    '/blocks/:blockId/photos',
    requireUser,
    route(
      { params: blockPhotosParams, authorize: (req, { params }) => canSeeBlockPhotos(deps, currentUser(req).id, params.blockId) },
      async ({ params }, _req, res) => {
        res.json(await listBlockPhotos(deps, params.blockId));
      },
    ),
  );

  // Who may upload is settled before the body is read, so a stranger's megabytes are never parsed.
  router.post(
    '/blocks/:blockId/photos',
    requireUser,
    route(
      {
        params: blockPhotosParams,
        authorize: async (req, { params }) => {
          const access = await canAddBlockPhotos(deps, currentUser(req).id, params.blockId);
          // A full photo queue refuses before the body is read, so a busy server spends nothing on it.
          photoQueue(deps.config).assertRoom();
          return access;
        },
        receive: upload,
      },
      async ({ access }, req, res) => {
        res.status(201).json(await uploadBlockPhotos(deps, access, currentUser(req).id, receivedFiles(req)));
      },
    ),
  );

  router.get(
    '/photos/:photoId',
    requireUser,
    route(
      { params: photoParams, query: photoQuery, authorize: (req, { params }) => canSeePhoto(deps, currentUser(req).id, params.photoId) },
      async ({ query: { size }, access: photo }, req, res) => {
        const extension = photo.mime === 'image/webp' ? 'webp' : 'jpg';
        await sendPhoto(req, res, deps, photo, size, {
          'Content-Type': photo.mime,
          // Only the member's own browser may keep it; never a shared cache.
          'Cache-Control': 'private, max-age=3600',
          'X-Content-Type-Options': 'nosniff',
          'Content-Disposition': `inline; filename="photo-${photo.id}${size === 'thumb' ? '-thumb' : ''}.${extension}"`,
          'Content-Security-Policy': "default-src 'none'; sandbox",
        });
      },
    ),
  );

  router.delete(
    '/photos/:photoId',
    requireUser,
    route(
      { params: photoParams, authorize: (req, { params }) => canRemovePhoto(deps, currentUser(req).id, params.photoId) },
      async ({ access: photo }, _req, res) => {
        await removePhoto(deps, photo);
        res.status(204).end();
      },
    ),
  );

  return router;
}

/**
 * Streams a photo from the store (folder or bucket) after the permission check. A stored name never
 * changes its bytes, so it serves as the ETag and a revalidation costs no read of the store.
 */
async function sendPhoto(
  req: Request,
  res: Response,
  deps: AppDeps,
  photo: Awaited<ReturnType<typeof canSeePhoto>>,
  size: PhotoSize,
  headers: Record<string, string>,
): Promise<void> {
  const etag = `"${size === 'thumb' ? photo.thumbFileName : photo.fileName}"`;
  if (req.headers['if-none-match'] === etag) {
    res.set({ ...headers, ETag: etag }).status(304).end();
    return;
  }
  const file = await openPhotoFile(deps, photo, size);
  if (!file) throw new NotFoundError('The file of this photo is missing on the server.');
  res.set({ ...headers, ETag: etag, 'Content-Length': String(file.bytes) });
  if (req.method === 'HEAD') {
    file.body.destroy();
    res.end();
    return;
  }
  // A person leaving mid-photo ends the stream; that is not a server failure.
  await pipeline(file.body, res).catch(() => undefined);
}
