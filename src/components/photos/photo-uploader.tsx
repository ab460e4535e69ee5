import { useId, useRef, useState, type ChangeEvent, type ReactNode } from 'react';
import { formatBytes, type BlockPhotosUploadDto } from '@shared/schemas/photos';
import { ApiError } from '@/lib/api-client';
import { Alert } from '@/components/ui/alert';
import { Button, buttonClass } from '@/components/ui/button';
import { uploadPhotos, type UploadProgress } from './api';
import { usePhotoChoice, type ChosenPhoto } from './use-photo-choice';

interface PhotoUploaderProps<T> {
  /** Same-origin URL taking multipart field `photos`, e.g. blockPhotosUrl(blockId). */
  uploadUrl: string;
  label?: ReactNode;
  hint?: ReactNode;
  /** Offer a second button that opens the camera on phones and tablets. */
  offerCamera?: boolean;
  disabled?: boolean;
  onUploaded?: (result: T) => void;
}

type Status =
  | { kind: 'idle' }
  | { kind: 'sending'; progress: UploadProgress | null }
  | { kind: 'failed'; message: string }
  | { kind: 'sent'; count: number };

const ACCEPT = 'image/*,.heic,.heif';
const pickerClass = (extra = '') =>
  buttonClass(
    'secondary',
    `cursor-pointer has-focus-visible:outline-[3px] has-focus-visible:outline-weld has-focus-visible:outline-offset-2 ${extra}`,
  );

/**
 * Choose several photos (or take one on a phone), see them listed with any problem explained, and
 * send them with a progress bar. On failure the chosen photos stay listed with the server's reason,
 * so the person can fix the one at fault and resend without choosing again.
 */
export function PhotoUploader<T = BlockPhotosUploadDto>({
  uploadUrl,
  label = 'Add photos',
  hint = 'JPEG, PNG, WebP or HEIC photos, up to 15 MB each and 10 at a time. Location and camera details are removed before the photos are saved.',
  offerCamera = true,
  disabled = false,
  onUploaded,
}: PhotoUploaderProps<T>) {
  const id = useId();
  const { chosen, notices, add, remove, clear } = usePhotoChoice();
  const [status, setStatus] = useState<Status>({ kind: 'idle' });
  const abort = useRef<AbortController | null>(null);
  const sending = status.kind === 'sending';

  const onPick = (e: ChangeEvent<HTMLInputElement>) => {
    add(Array.from(e.target.files ?? []));
    e.target.value = ''; // so choosing the same file again after removing it still registers
    if (status.kind !== 'sending') setStatus({ kind: 'idle' });
  };

  async function send() {
    const controller = new AbortController();
    abort.current = controller;
    setStatus({ kind: 'sending', progress: null });
    try {
      const result = await uploadPhotos<T>(
        uploadUrl,
        chosen.map((c) => c.file),
        {
          signal: controller.signal,
          onProgress: (progress) => setStatus({ kind: 'sending', progress }),
        },
      );
      const count = chosen.length;
      clear();
      setStatus({ kind: 'sent', count });
      onUploaded?.(result);
    } catch (error) {
      if ((error as Error).name === 'AbortError')
        return setStatus({ kind: 'failed', message: 'You stopped the upload. Nothing was saved; your photos are still chosen.' });
      setStatus({
        kind: 'failed',
        message: error instanceof ApiError ? error.message : 'The photos could not be sent. Please try again.',
      });
    } finally {
      abort.current = null;
    }
  }

  const percent =
    status.kind === 'sending' && status.progress
      ? Math.round((100 * status.progress.loaded) / Math.max(1, status.progress.total))
      : null;
  const count = chosen.length;

  return (
    <div className="space-y-4" aria-labelledby={`${id}-label`} role="group">
      <div>
        <p id={`${id}-label`} className="font-semibold">
          {label}
        </p>
        {hint && <p className="text-walnut-soft">{hint}</p>}
      </div>

      <div className="flex flex-wrap gap-3">
        <label className={pickerClass(disabled || sending ? 'pointer-events-none opacity-50' : '')}>
          Choose photos
          <input type="file" multiple accept={ACCEPT} className="sr-only" onChange={onPick} disabled={disabled || sending} />
        </label>
        {offerCamera && (
          <label className={pickerClass(`sm:hidden ${disabled || sending ? 'pointer-events-none opacity-50' : ''}`)}>
            Take a picture
            <input
              type="file"
              accept="image/*"
              capture="environment"
              className="sr-only"
              onChange={onPick}
              disabled={disabled || sending}
            />
          </label>
        )}
      </div>

      {notices.length > 0 && (
        <Alert tone="warning" title={notices.length === 1 ? 'One file was left out' : `${notices.length} files were left out`}>
          <ul className="list-disc pl-5">
            {notices.map((n) => (
              <li key={n}>{n}</li>
            ))}
          </ul>
        </Alert>
      )}

      {count > 0 && (
        <ul className="divide-y divide-walnut/10 rounded-lg ring-1 ring-walnut/15" aria-label="Chosen photos">
          {chosen.map((c) => (
            <ChosenRow
              key={c.key}
              photo={c}
              onRemove={() => remove(c.key)}
              disabled={sending}
              atFault={status.kind === 'failed' && status.message.includes(`“${c.file.name}”`)}
            />
          ))}
        </ul>
      )}

      {status.kind === 'sending' && (
        <div className="space-y-2">
          <label htmlFor={`${id}-progress`} className="block font-semibold">
            {percent === null
              ? `Sending ${count === 1 ? 'the photo' : `${count} photos`}…`
              : percent < 100
                ? `Sending… ${percent}%`
                : 'Sent. Preparing the photos…'}
          </label>
          <progress
            id={`${id}-progress`}
            className="h-4 w-full appearance-none overflow-hidden rounded-full bg-linen-deep [&::-moz-progress-bar]:bg-indigo [&::-webkit-progress-bar]:bg-linen-deep [&::-webkit-progress-value]:bg-indigo"
            max={100}
            {...(percent === null ? {} : { value: percent })}
          />
          <Button variant="quiet" onClick={() => abort.current?.abort()}>
            Stop sending
          </Button>
        </div>
      )}

      {status.kind === 'failed' && (
        <Alert tone="error" title="The photos were not saved">
          <p>{status.message}</p>
          {count > 0 && <p className="mt-1">Your photos are still listed above, ready to send again.</p>}
        </Alert>
      )}
      {status.kind === 'sent' && (
        <Alert tone="success">{status.count === 1 ? 'The photo was added.' : `${status.count} photos were added.`}</Alert>
      )}

      {count > 0 && (
        <Button onClick={send} pending={sending} pendingLabel="Sending…" disabled={disabled}>
          {status.kind === 'failed' ? 'Try again' : count === 1 ? 'Upload 1 photo' : `Upload ${count} photos`}
        </Button>
      )}
    </div>
  );
}

function ChosenRow({
  photo,
  onRemove,
  disabled,
  atFault,
}: {
  photo: ChosenPhoto;
  onRemove: () => void;
  disabled: boolean;
  atFault: boolean;
}) {
  return (
    <li className={`flex items-center gap-3 p-3 ${atFault ? 'bg-madder/8 ring-2 ring-madder ring-inset' : ''}`}>
      <span className="size-14 shrink-0 overflow-hidden rounded bg-linen-deep">
        <img
          alt=""
          className="size-14 object-cover"
          // A blob URL made for this row and released when the row goes (React 19 ref clean-up).
          ref={(img) => {
            if (!img) return;
            const url = URL.createObjectURL(photo.file);
            img.src = url;
            return () => URL.revokeObjectURL(url);
          }}
          // Browsers that cannot show HEIC keep the plain square instead of a broken-image mark.
          onError={(e) => e.currentTarget.classList.add('invisible')}
        />
      </span>
      <div className="min-w-0 flex-1 sm:flex sm:items-center sm:gap-3">
        <div className="min-w-0 flex-1">
          <p className="font-semibold wrap-anywhere">{photo.file.name}</p>
          <p className="text-walnut-soft">{formatBytes(photo.file.size)}</p>
          {atFault && <p className="font-semibold text-madder-deep">Refused: see the message below</p>}
        </div>
        {/* Under the name on a phone, so long names keep the width; the negative margin lines the word up with them. */}
        <Button
          variant="quiet"
          onClick={onRemove}
          disabled={disabled}
          aria-label={`Remove ${photo.file.name}`}
          className="-ml-5 sm:ml-0"
        >
          Remove
        </Button>
      </div>
    </li>
  );
}
