import { useState } from 'react';
import type { ChatMessageDto } from '@shared/schemas/chat';
import { messageBodySchema } from '@shared/schemas/chat';
import { Button } from '@/components/ui/button';
import { ApiError } from '@/lib/api-client';
import { relativeTime } from '@/lib/dates';
import { useDeleteMessage } from '../api/delete-message';
import { useEditMessage } from '../api/edit-message';
import { LinkifiedText } from './linkified-text';

const removedText = { author: 'Message deleted by its author.', moderator: 'This message was removed by a moderator.' } as const;

export function ChatMessageItem({
  message,
  mine,
  canModerate,
}: {
  message: ChatMessageDto;
  mine: boolean;
  canModerate: boolean;
}) {
  const edit = useEditMessage();
  const remove = useDeleteMessage();
  const [editing, setEditing] = useState(false);
  const [draft, setDraft] = useState(message.body);
  const [problem, setProblem] = useState('');
  const fail = (e: unknown) => setProblem(e instanceof ApiError ? e.message : 'That did not work. Please try again.');

  const save = () => {
    const parsed = messageBodySchema.safeParse(draft);
    if (!parsed.success) return setProblem(parsed.error.issues[0]?.message ?? 'Check the message.');
    setProblem('');
    edit.mutate({ messageId: message.id, body: parsed.data }, { onSuccess: () => setEditing(false), onError: fail });
  };
  const takeDown = () => {
    const question = mine ? 'Delete your message?' : `Remove this message by ${message.author.displayName} as a moderator?`;
    if (!window.confirm(question)) return;
    setProblem('');
    remove.mutate(message.id, { onError: fail });
  };

  return (
    <li className={`rounded-lg px-4 py-3 ${mine ? 'bg-indigo/8' : 'bg-card ring-1 ring-walnut/10'}`}>
      <p className="flex flex-wrap items-baseline gap-x-2 text-base">
        <span className="font-semibold text-walnut">{mine ? 'You' : message.author.displayName}</span>
        <time className="text-walnut-soft" dateTime={message.createdAt} title={new Date(message.createdAt).toLocaleString()}>
          {relativeTime(message.createdAt)}
        </time>
        {message.editedAt && !message.removed && <span className="text-walnut-soft">(edited)</span>}
      </p>
      {message.removed ? (
        <p className="italic text-walnut-soft">{removedText[message.removed]}</p>
      ) : editing ? (
        <div className="mt-2">
          <label className="sr-only" htmlFor={`edit-${message.id}`}>
            Edit your message
          </label>
          <textarea
            id={`edit-${message.id}`}
            className="block min-h-20 w-full rounded-lg border-2 border-walnut/30 bg-white px-3 py-2"
            value={draft}
            maxLength={2000}
            onChange={(e) => setDraft(e.target.value)}
          />
          <div className="mt-2 flex gap-2">
            <Button onClick={save} pending={edit.isPending} pendingLabel="Saving…">
              Save
            </Button>
            <Button
              variant="quiet"
              onClick={() => {
                setEditing(false);
                setDraft(message.body);
                setProblem('');
              }}
            >
              Keep as it was
            </Button>
          </div>
        </div>
      ) : (
        <>
          {message.body && (
            <p>
              <LinkifiedText text={message.body} />
            </p>
          )}
          {message.photos.length > 0 && (
            <ul className="mt-2 flex flex-wrap gap-2">
              {message.photos.map((p) => (
                <li key={p.id}>
                  <a href={p.url} target="_blank" rel="noopener noreferrer">
                    <img
                      src={p.thumbnailUrl}
                      alt={`Photo from ${message.author.displayName}`}
                      loading="lazy"
                      className="h-32 w-auto rounded-md ring-1 ring-walnut/15"
                    />
                  </a>
                </li>
              ))}
            </ul>
          )}
        </>
      )}
      {!message.removed && !editing && (mine || canModerate) && (
        <div className="mt-1 flex flex-wrap gap-1">
          {mine && message.body && (
            <Button
              variant="quiet"
              className="px-2"
              onClick={() => {
                setDraft(message.body);
                setEditing(true);
              }}
            >
              Edit
            </Button>
          )}
          <Button variant="quiet" className="px-2" onClick={takeDown} pending={remove.isPending} pendingLabel="Removing…">
            {mine ? 'Delete' : 'Remove'}
          </Button>
        </div>
      )}
      {problem && (
        <p role="alert" className="mt-1 font-semibold text-madder-deep">
          {problem}
        </p>
      )}
    </li>
  );
}
