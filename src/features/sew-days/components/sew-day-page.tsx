import { useEffect, useState, type ReactNode } from 'react';
import { Link, useLocation, useParams } from 'react-router';
import { rsvpAnswers, rsvpLabels } from '@shared/schemas/sewdays';
import { Card } from '@/components/ui/card';
import { Alert } from '@/components/ui/alert';
import { Button, buttonClass } from '@/components/ui/button';
import { Loading, QueryError } from '@/components/ui/page';
import { ApiError } from '@/lib/api-client';
import { paths } from '@/lib/paths';
import { sewDayCalendarUrl, useSewDay } from '../api/get-sew-day';
import { useCancelSewDay } from '../api/cancel-sew-day';
import { RsvpPicker } from './rsvp-picker';
import { SewDayCautions } from './sew-day-cautions';
import { SewDayWhen } from './sew-day-when';
import { SwapBoards } from './swap-boards';

interface SewDayPageProps {
  /** The chat of the sew day, composed in by the app (features do not import each other). */
  renderChat?: (roomId: number) => ReactNode;
}

export function SewDayPage({ renderChat }: SewDayPageProps) {
  const params = useParams();
  const guildId = Number(params.guildId);
  const sewDayId = Number(params.sewDayId);
  const sewDay = useSewDay(sewDayId);
  const cancel = useCancelSewDay(guildId, sewDayId);
  const [problem, setProblem] = useState('');
  const { hash } = useLocation();
  const ready = sewDay.isSuccess;
  // A link to "#chat" (from the home screen) lands on the chat once the page has drawn it.
  useEffect(() => {
    if (ready && hash === '#chat') document.getElementById('chat')?.scrollIntoView();
  }, [ready, hash]);
  if (sewDay.isPending) return <Loading label="Loading the sew day…" />;
  if (sewDay.isError) return <QueryError error={sewDay.error} what="the sew day" />;
  const s = sewDay.data;

  return (
    <div className="space-y-6">
      <p className="flex flex-wrap justify-between gap-x-4">
        <Link className="inline-flex min-h-11 items-center font-semibold text-indigo underline" to={paths.sewDays(guildId)}>
          ← All sew days
        </Link>
        {s.chatRoomId && renderChat && (
          <a className="inline-flex min-h-11 items-center font-semibold text-indigo underline" href="#chat">
            Go to the chat ↓
          </a>
        )}
      </p>
      {s.cancelledAt && (
        <Alert tone="warning" title="Cancelled">
          This sew day was cancelled. It stays here so nobody turns up by mistake.
        </Alert>
      )}
      <Card
        title={s.title}
        actions={
          s.canManage && !s.cancelledAt ? (
            <div className="flex flex-wrap gap-2">
              <Link className={buttonClass('secondary')} to={paths.editSewDay(guildId, sewDayId)}>
                Change
              </Link>
              <Button
                variant="danger"
                pending={cancel.isPending}
                pendingLabel="Cancelling…"
                onClick={() => {
                  if (!window.confirm(`Cancel “${s.title}”? Everyone will see it as cancelled.`)) return;
                  setProblem('');
                  cancel.mutate(undefined, {
                    onError: (e) => setProblem(e instanceof ApiError ? e.message : 'That did not work.'),
                  });
                }}
              >
                Cancel sew day
              </Button>
            </div>
          ) : undefined
        }
      >
        {problem && (
          <div className="mb-4">
            <Alert tone="error">{problem}</Alert>
          </div>
        )}
        <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-[auto_1fr]">
          <dt className="font-semibold">When</dt>
          <dd>
            <SewDayWhen sewDay={s} />
          </dd>
          {s.place && (
            <>
              <dt className="font-semibold">Where</dt>
              <dd className="break-words">{s.place}</dd>
            </>
          )}
          {s.videoUrl && (
            <>
              <dt className="font-semibold">Video call</dt>
              <dd className="break-all">
                <a className="text-indigo underline" href={s.videoUrl} target="_blank" rel="noopener noreferrer nofollow">
                  {s.videoUrl}
                </a>
              </dd>
            </>
          )}
          {s.createdBy && (
            <>
              <dt className="font-semibold">Posted by</dt>
              <dd>{s.createdBy.displayName}</dd>
            </>
          )}
        </dl>
        {s.notes && <p className="mt-4 whitespace-pre-wrap break-words">{s.notes}</p>}
        <p className="mt-4">
          <a className={buttonClass('secondary')} href={sewDayCalendarUrl(s.id)} download>
            Add to my calendar (.ics)
          </a>
        </p>
      </Card>

      <Card title="Will you come?">
        <RsvpPicker sewDay={s} />
        <div className="mt-5 grid gap-4 sm:grid-cols-3">
          {rsvpAnswers.map((a) => {
            const people = s.rsvps.filter((r) => r.answer === a);
            return (
              <div key={a}>
                <h3 className="font-semibold">
                  {rsvpLabels[a]} ({s.rsvpCounts[a]})
                </h3>
                <p className="text-walnut-soft">{people.length ? people.map((p) => p.displayName).join(', ') : 'Nobody yet'}</p>
              </div>
            );
          })}
        </div>
      </Card>

      <SewDayCautions />
      <SwapBoards guildId={guildId} />
      {s.chatRoomId && renderChat && (
        <div id="chat" className="scroll-mt-4">
          {renderChat(s.chatRoomId)}
        </div>
      )}
    </div>
  );
}
