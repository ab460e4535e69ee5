import { Router, type Response } from 'express';
import { type z } from 'zod';
import { blockPhotosParams, photoParams, photoQuery } from '@shared/schemas/photos';
import { currentUser, requireUser } from '../auth/require-user';
import { validate } from '../http/validate';
import { NotFoundError } from '../http/errors';
import type { AppDeps } from '../deps';
import { photoUploadMiddleware, receivedFiles } from './photo-pipeline';
import { canAddBlockPhotos, canRemovePhoto, canSeeBlockPhotos, canSeePhoto } from './photos.policy';
import { listBlockPhotos, photoFile, removePhoto, uploadBlockPhotos } from './photos.service';

type BlockParams = z.infer<typeof blockPhotosParams>;
type PhotoParams = z.infer<typeof photoParams>;
type PhotoQuery = z.infer<typeof photoQuery>;

/** Block photos: upload (multipart field `photos`), list, serve to guild members only, remove. */
export function photosRouter(deps: AppDeps) {
  const router = Router();
  const upload = photoUploadMiddleware();

  router.get('/blocks/:blockId/photos', requireUser, validate({ params: blockPhotosParams }), async (req, res) => {
    const { blockId } = req.params as unknown as BlockParams;
    await canSeeBlockPhotos(currentUser(req).id, blockId);
    res.json(await listBlockPhotos(blockId));
  });

  // Who may upload is settled before the body is read, so a stranger's megabytes are never parsed.
  router.post(
    '/blocks/:blockId/photos',
    requireUser,
    validate({ params: blockPhotosParams }),
    async (req, res, next) => {
      const { blockId } = req.params as unknown as BlockParams;
      res.locals.blockAccess = await canAddBlockPhotos(currentUser(req).id, blockId);
      next();
    },
    upload,
    async (req, res) => {
      const result = await uploadBlockPhotos(deps, res.locals.blockAccess, currentUser(req).id, receivedFiles(req));
      res.status(201).json(result);
    },
  );

  router.get('/photos/:photoId', requireUser, validate({ params: photoParams, query: photoQuery }), async (req, res) => {
    const { photoId } = req.params as unknown as PhotoParams;
    const { size } = req.query as unknown as PhotoQuery;
    const photo = await canSeePhoto(currentUser(req).id, photoId);
    const extension = photo.mime === 'image/webp' ? 'webp' : 'jpg';
    await sendPhoto(res, photoFile(deps, photo, size), {
      'Content-Type': photo.mime,
      // Only the member's own browser may keep it; never a shared cache.
      'Cache-Control': 'private, max-age=3600',
      'X-Content-Type-Options': 'nosniff',
      'Content-Disposition': `inline; filename="photo-${photo.id}${size === 'thumb' ? '-thumb' : ''}.${extension}"`,
      'Content-Security-Policy': "default-src 'none'; sandbox",
    });
  });

  router.delete('/photos/:photoId', requireUser, validate({ params: photoParams }), async (req, res) => {
    const { photoId } = req.params as unknown as PhotoParams;
    const photo = await canRemovePhoto(currentUser(req).id, photoId);
    await removePhoto(deps, photo);
    res.status(204).end();
  });

  return router;
}

function sendPhoto(res: Response, path: string, headers: Record<string, string>): Promise<void> {
  return new Promise((resolve, reject) => {
    res.sendFile(path, { headers, cacheControl: false, dotfiles: 'deny' }, (error?: NodeJS.ErrnoException) => {
      if (!error) return resolve();
      if (res.headersSent) return resolve(); // the client went away mid-file
      reject(error.code === 'ENOENT' ? new NotFoundError('The file of this photo is missing on the server.') : error);
    });
  });
}
