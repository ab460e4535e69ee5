import { Link, useParams, useSearchParams } from 'react-router';
import { rsvpLabels, type SewDayDto } from '@shared/schemas/sewdays';
import { buttonClass } from '@/components/ui/button';
import { EmptyState, Loading, QueryError } from '@/components/ui/page';
import { paths } from '@/lib/paths';
import { useSewDays } from '../api/get-sew-days';
import type { SewDayWhen } from '../api/sew-day-keys';
import { SewDayWhen as When } from './sew-day-when';
import { SwapBoards } from './swap-boards';

const tabClass = (active: boolean) =>
  `inline-flex min-h-11 items-center rounded-lg px-4 font-semibold ${active ? 'bg-indigo text-white' : 'text-indigo hover:bg-linen-deep'}`;

function SewDayItem({ sewDay }: { sewDay: SewDayDto }) {
  const { going, maybe } = sewDay.rsvpCounts;
  return (
    <li className="seam rounded-card bg-card p-5 shadow-sm ring-1 ring-walnut/10">
      <div className="relative flex flex-wrap items-start justify-between gap-3">
        <div className="min-w-0">
          <h3 className="text-xl font-semibold">
            <Link className="text-indigo underline underline-offset-4" to={paths.sewDay(sewDay.guildId, sewDay.id)}>
              {sewDay.title}
            </Link>
            {sewDay.cancelledAt && <span className="ml-2 rounded bg-madder px-2 py-0.5 text-base text-white">Cancelled</span>}
          </h3>
          <p>
            <When sewDay={sewDay} />
          </p>
          <p className="break-words text-walnut-soft">
            {[sewDay.place, sewDay.videoUrl ? 'Video call' : null].filter(Boolean).join(' · ')}
          </p>
        </div>
        <p className="sm:text-right">
          {going} going · {maybe} maybe
          {sewDay.myRsvp && <span className="block font-semibold">You: {rsvpLabels[sewDay.myRsvp]}</span>}
        </p>
      </div>
    </li>
  );
}

/** The guild's sew days: upcoming soonest first, or past most recent first. */
export function SewDaysPage() {
  const guildId = Number(useParams().guildId);
  const [search, setSearch] = useSearchParams();
  const when: SewDayWhen = search.get('when') === 'past' ? 'past' : 'upcoming';
  const list = useSewDays(guildId, when);

  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h2 className="text-2xl font-semibold text-indigo-deep">Sew days</h2>
        {list.data?.canManage && (
          <Link className={buttonClass('primary')} to={paths.newSewDay(guildId)}>
            Schedule a sew day
          </Link>
        )}
      </div>
      <div role="group" aria-label="Which sew days" className="flex gap-2">
        {(['upcoming', 'past'] as const).map((w) => (
          <button
            key={w}
            type="button"
            aria-pressed={when === w}
            className={tabClass(when === w)}
            onClick={() => setSearch(w === 'past' ? { when: 'past' } : {})}
          >
            {w === 'upcoming' ? 'Upcoming' : 'Past'}
          </button>
        ))}
      </div>
      {list.isPending && <Loading label="Loading sew days…" />}
      {list.isError && <QueryError error={list.error} what="the sew days" />}
      {list.data && list.data.sewDays.length === 0 && (
        <EmptyState title={when === 'upcoming' ? 'No sew days planned yet' : 'No past sew days'}>
          {when === 'upcoming' &&
            (list.data.canManage
              ? 'Schedule one and the guild can answer and chat.'
              : 'A guild officer will post the next one here.')}
        </EmptyState>
      )}
      {list.data && list.data.sewDays.length > 0 && (
        <>
          <p className="text-walnut-soft">Times are shown in the guild’s time zone, {list.data.timeZone}.</p>
          <ul className="space-y-4">
            {list.data.sewDays.map((s) => (
              <SewDayItem key={s.id} sewDay={s} />
            ))}
          </ul>
        </>
      )}
      <SwapBoards guildId={guildId} />
    </div>
  );
}
