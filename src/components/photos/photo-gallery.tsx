import { useEffect, useRef, useState, type KeyboardEvent } from 'react';
import { Button, buttonClass } from '@/components/ui/button';

/** What the gallery needs of a photo: PhotoDto fits, and so does a bare `{ id, url, thumbUrl }`. */
export interface GalleryPhoto {
  id: number;
  url: string;
  thumbUrl: string;
  width?: number;
  height?: number;
  thumbWidth?: number;
  thumbHeight?: number;
  uploadedBy?: { id: number; displayName: string } | null;
  createdAt?: string;
}

interface PhotoGalleryProps<P extends GalleryPhoto> {
  photos: readonly P[];
  /** Names what the photos show, for alt text: "Block 3 by Priya Raman". */
  subject?: string;
  /** Offered in the large view when it returns true. */
  canRemove?: (photo: P) => boolean;
  onRemove?: (photo: P) => void;
  removing?: boolean;
}

function altText(subject: string, index: number, count: number, photo: GalleryPhoto) {
  const by = photo.uploadedBy ? `, posted by ${photo.uploadedBy.displayName}` : '';
  return count === 1 ? `${subject}${by}` : `${subject}, photo ${index + 1} of ${count}${by}`;
}

function postedOn(iso?: string) {
  if (!iso) return null;
  return new Date(iso).toLocaleDateString(undefined, { day: 'numeric', month: 'long', year: 'numeric' });
}

/** Thumbnails that open a large view (a modal dialog with previous / next, Esc to close). */
export function PhotoGallery<P extends GalleryPhoto>({
  photos,
  subject = 'Photo',
  canRemove,
  onRemove,
  removing,
}: PhotoGalleryProps<P>) {
  const [open, setOpen] = useState<number | null>(null);
  const dialog = useRef<HTMLDialogElement>(null);
  const count = photos.length;
  const current = open !== null ? photos[open] : undefined;

  useEffect(() => {
    const el = dialog.current;
    if (!el) return;
    if (current && !el.open) el.showModal();
    if (!current && el.open) el.close();
  }, [current]);

  if (count === 0) return null;

  const step = (by: number) => setOpen((i) => (i === null ? i : (i + by + count) % count));
  const onKeyDown = (e: KeyboardEvent) => {
    if (e.key === 'ArrowRight') step(1);
    if (e.key === 'ArrowLeft') step(-1);
  };

  return (
    <>
      <ul
        className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4"
        aria-label={`${subject}: ${count === 1 ? '1 photo' : `${count} photos`}`}
      >
        {photos.map((photo, i) => (
          <li key={photo.id}>
            <button
              type="button"
              onClick={() => setOpen(i)}
              className="block w-full overflow-hidden rounded-lg bg-linen-deep ring-1 ring-walnut/15 hover:ring-2 hover:ring-indigo"
            >
              <span className="sr-only">Open large: </span>
              <img
                src={photo.thumbUrl}
                alt={altText(subject, i, count, photo)}
                width={photo.thumbWidth}
                height={photo.thumbHeight}
                loading="lazy"
                className="aspect-square w-full object-cover"
              />
            </button>
          </li>
        ))}
      </ul>

      <dialog
        ref={dialog}
        onClose={() => setOpen(null)}
        onKeyDown={onKeyDown}
        aria-label={current ? altText(subject, open!, count, current) : subject}
        className="m-auto w-[min(96vw,72rem)] max-w-none rounded-card bg-card p-0 text-walnut shadow-xl backdrop:bg-walnut/75"
      >
        {current && (
          <div className="flex max-h-[95vh] flex-col">
            <div className="flex items-center justify-between gap-3 border-b border-walnut/10 px-4 py-2">
              <p className="font-semibold">{count > 1 ? `Photo ${open! + 1} of ${count}` : subject}</p>
              <Button variant="secondary" onClick={() => setOpen(null)} autoFocus>
                Close
              </Button>
            </div>
            <img
              src={current.url}
              alt={altText(subject, open!, count, current)}
              width={current.width}
              height={current.height}
              className="min-h-0 w-full flex-1 bg-walnut/5 object-contain"
            />
            <div className="flex flex-wrap items-center gap-3 border-t border-walnut/10 px-4 py-3">
              <p className="mr-auto text-walnut-soft">
                {[current.uploadedBy && `Posted by ${current.uploadedBy.displayName}`, postedOn(current.createdAt)]
                  .filter(Boolean)
                  .join(', ')}
              </p>
              {count > 1 && (
                <>
                  <Button variant="secondary" onClick={() => step(-1)}>
                    ← Previous
                  </Button>
                  <Button variant="secondary" onClick={() => step(1)}>
                    Next →
                  </Button>
                </>
              )}
              <a href={current.url} target="_blank" rel="noopener" className={buttonClass('quiet')}>
                Full size
              </a>
              {onRemove && canRemove?.(current) && (
                <Button variant="danger" pending={removing} pendingLabel="Removing…" onClick={() => onRemove(current)}>
                  Remove photo
                </Button>
              )}
            </div>
          </div>
        )}
      </dialog>
    </>
  );
}
