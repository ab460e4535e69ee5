import { useState } from 'react';
import { rsvpAnswers, rsvpLabels, type SewDayDetailDto } from '@shared/schemas/sewdays';
import { Alert } from '@/components/ui/alert';
import { ApiError } from '@/lib/api-client';
import { useAnswerRsvp } from '../api/answer-rsvp';

const chosen = 'bg-indigo text-white border-indigo';
const open = 'bg-card text-indigo border-indigo hover:bg-linen-deep';

/** Going / Maybe / Not going, as three large buttons; the chosen one says so in words too. */
export function RsvpPicker({ sewDay }: { sewDay: SewDayDetailDto }) {
  const answer = useAnswerRsvp(sewDay.guildId, sewDay.id);
  const [problem, setProblem] = useState('');
  // The moment the page opened is close enough to tell whether the day is over.
  const [openedAt] = useState(() => Date.now());
  const over = new Date(sewDay.endsAt).getTime() < openedAt;
  if (sewDay.cancelledAt || over) {
    return <p className="text-walnut-soft">{sewDay.cancelledAt ? 'This sew day was cancelled.' : 'This sew day is over.'}</p>;
  }
  return (
    <div>
      <div role="group" aria-label="Will you come?" className="flex flex-wrap gap-2">
        {rsvpAnswers.map((a) => (
          <button
            key={a}
            type="button"
            aria-pressed={sewDay.myRsvp === a}
            disabled={answer.isPending}
            className={`inline-flex min-h-11 items-center gap-2 rounded-lg border-2 px-5 font-semibold disabled:opacity-60 ${sewDay.myRsvp === a ? chosen : open}`}
            onClick={() => {
              setProblem('');
              answer.mutate(a, {
                onError: (e) => setProblem(e instanceof ApiError ? e.message : 'That did not work. Please try again.'),
              });
            }}
          >
            {sewDay.myRsvp === a && <span aria-hidden="true">✓</span>}
            {rsvpLabels[a]}
          </button>
        ))}
      </div>
      {sewDay.myRsvp && (
        <p className="mt-2">
          Your answer: <strong>{rsvpLabels[sewDay.myRsvp]}</strong>. You can change it until the day ends.
        </p>
      )}
      {problem && (
        <div className="mt-3">
          <Alert tone="error">{problem}</Alert>
        </div>
      )}
    </div>
  );
}
