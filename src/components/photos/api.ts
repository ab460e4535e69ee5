/**
 * Photo calls shared by swaps (block photos) and chat (photo messages): the list of a block's
 * photos, removal, and a multipart upload that reports progress (fetch cannot report upload
 * progress, so the upload goes through XMLHttpRequest).
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ApiErrorBody } from '@shared/schemas/errors';
import { PHOTO_FIELD, type BlockPhotosUploadDto, type PhotoDto } from '@shared/schemas/photos';
import { api, ApiError } from '@/lib/api-client';

export const photoKeys = {
  all: ['photos'] as const,
  blocks: () => [...photoKeys.all, 'block'] as const,
  block: (blockId: number) => [...photoKeys.blocks(), blockId] as const,
};

export function blockPhotosUrl(blockId: number) {
  return `/api/blocks/${blockId}/photos`;
}

export const fetchBlockPhotos = (blockId: number, signal?: AbortSignal) =>
  api.get<PhotoDto[]>(`/blocks/${blockId}/photos`, { signal });

export const blockPhotosQueryOptions = (blockId: number) =>
  queryOptions({ queryKey: photoKeys.block(blockId), queryFn: ({ signal }) => fetchBlockPhotos(blockId, signal) });

export function useBlockPhotos(blockId: number) {
  return useQuery(blockPhotosQueryOptions(blockId));
}

export const deletePhoto = (photoId: number) => api.delete<void>(`/photos/${photoId}`);

/** Removes a photo, then refreshes every photo list (the caller's feature may refresh its own too). */
export function useDeletePhoto() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deletePhoto,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: photoKeys.all }),
  });
}

export interface UploadProgress {
  loaded: number;
  total: number;
}

/**
 * Sends files as multipart field `photos` to a same-origin URL with the session cookie and the
 * CSRF header. Resolves with the JSON answer; rejects with ApiError carrying the server's message
 * (or an AbortError when `signal` aborts).
 */
export function uploadPhotos<T = BlockPhotosUploadDto>(
  url: string,
  files: readonly File[],
  opts: { onProgress?: (p: UploadProgress) => void; signal?: AbortSignal } = {},
): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const form = new FormData();
    for (const file of files) form.append(PHOTO_FIELD, file, file.name);
    const xhr = new XMLHttpRequest();
    xhr.open('POST', url);
    xhr.withCredentials = true;
    xhr.responseType = 'json';
    xhr.setRequestHeader('X-Requested-With', 'blockpost');
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) opts.onProgress?.({ loaded: e.loaded, total: e.total });
    };
    xhr.onload = () => {
      if (xhr.status >= 200 && xhr.status < 300) return resolve(xhr.response as T);
      const err = (xhr.response as ApiErrorBody | null)?.error;
      const message =
        err?.message ??
        (xhr.status === 413
          ? 'The photos are too large to send. Choose fewer or smaller photos.'
          : `The server answered ${xhr.status}.`);
      reject(new ApiError(xhr.status, err?.code ?? 'http_error', message, err?.fields));
    };
    xhr.onerror = () =>
      reject(
        new ApiError(
          0,
          'network',
          'Blockpost cannot be reached. Check your connection; your photos are still chosen, so try again.',
        ),
      );
    xhr.onabort = () => reject(new DOMException('The upload was stopped.', 'AbortError'));
    if (opts.signal?.aborted) return reject(new DOMException('The upload was stopped.', 'AbortError'));
    opts.signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    xhr.send(form);
  });
}
