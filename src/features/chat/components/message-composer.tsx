import { useId, useRef, useState } from 'react';
import { CHAT_MESSAGE_MAX, CHAT_PHOTOS_MAX, messageBodySchema } from '@shared/schemas/chat';
import { acceptedUploadTypes, checkChosenFiles } from '@shared/schemas/photos';
import { Button } from '@/components/ui/button';
import { ApiError } from '@/lib/api-client';
import { useSendMessage } from '../api/send-message';

// A caption travels as a form field beside the photos, and the upload takes fields up to 1 KB.
const CAPTION_BYTES_MAX = 1000;

/** Writes and sends a message; on a refusal the text and photos stay, with the reason beside them. */
export function MessageComposer({ roomId, onTyping }: { roomId: number; onTyping: () => void }) {
  const id = useId();
  const send = useSendMessage(roomId);
  const [body, setBody] = useState('');
  const [photos, setPhotos] = useState<File[]>([]);
  const [problem, setProblem] = useState('');
  const fileInput = useRef<HTMLInputElement>(null);

  const submit = () => {
    setProblem('');
    let text = '';
    if (photos.length === 0 || body.trim()) {
      const parsed = messageBodySchema.safeParse(body);
      if (!parsed.success) return setProblem(parsed.error.issues[0]?.message ?? 'Check the message.');
      text = parsed.data;
    }
    if (photos.length && new TextEncoder().encode(text).length > CAPTION_BYTES_MAX) {
      return setProblem('With photos, keep the words short (about 250 characters), or send the photos and the text separately.');
    }
    send.mutate(
      { body: text, photos },
      {
        onSuccess: () => {
          setBody('');
          setPhotos([]);
          if (fileInput.current) fileInput.current.value = '';
        },
        onError: (e) => setProblem(e instanceof ApiError ? e.message : 'Your message did not go. It is still here; try again.'),
      },
    );
  };

  return (
    <form
      className="space-y-2"
      onSubmit={(e) => {
        e.preventDefault();
        submit();
      }}
    >
      <label htmlFor={`${id}-body`} className="block font-semibold">
        Your message
      </label>
      <textarea
        id={`${id}-body`}
        className="block min-h-24 w-full rounded-lg border-2 border-walnut/30 bg-white px-3 py-2 focus:border-indigo"
        value={body}
        maxLength={CHAT_MESSAGE_MAX}
        aria-describedby={`${id}-hint`}
        onChange={(e) => {
          setBody(e.target.value);
          onTyping();
        }}
        onKeyDown={(e) => {
          if (e.key === 'Enter' && (e.ctrlKey || e.metaKey)) {
            e.preventDefault();
            submit();
          }
        }}
      />
      <p id={`${id}-hint`} className="text-base text-walnut-soft">
        {body.length.toLocaleString('en')} of {CHAT_MESSAGE_MAX.toLocaleString('en')} characters · Ctrl+Enter sends
      </p>
      <div className="flex flex-wrap items-center gap-3">
        <label className="inline-flex min-h-11 cursor-pointer items-center rounded-lg border-2 border-indigo px-4 font-semibold text-indigo hover:bg-linen-deep">
          Add photos
          <input
            ref={fileInput}
            type="file"
            className="sr-only"
            accept={acceptedUploadTypes.join(',')}
            multiple
            onChange={(e) => {
              const chosen = [...(e.target.files ?? [])];
              const issues = checkChosenFiles(chosen);
              if (chosen.length > CHAT_PHOTOS_MAX) issues.push(`Send at most ${CHAT_PHOTOS_MAX} photos in one message.`);
              setProblem(issues.join(' '));
              setPhotos(issues.length ? [] : chosen);
            }}
          />
        </label>
        {photos.length > 0 && (
          <span>
            {photos.length} photo{photos.length === 1 ? '' : 's'} ready
          </span>
        )}
        <Button type="submit" pending={send.isPending} pendingLabel="Sending…" className="ml-auto">
          Send
        </Button>
      </div>
      {problem && (
        <p role="alert" className="font-semibold text-madder-deep">
          {problem}
        </p>
      )}
    </form>
  );
}
