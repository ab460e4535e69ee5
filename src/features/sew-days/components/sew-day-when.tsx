import type { SewDayDto } from '@shared/schemas/sewdays';
import { formatInZone, relativeTime } from '@/lib/dates';

/** "Sat 16 Jan 2027, 10:00 – 15:30 (in 5 days)", in the guild's time zone. */
export function SewDayWhen({
  sewDay,
}: {
  sewDay: Pick<SewDayDto, 'startsAt' | 'endsAt' | 'timeZone' | 'startsAtLocal' | 'endsAtLocal'>;
}) {
  const sameDay = sewDay.startsAtLocal.slice(0, 10) === sewDay.endsAtLocal.slice(0, 10);
  const end = sameDay ? sewDay.endsAtLocal.slice(11, 16) : formatInZone(sewDay.endsAt, sewDay.timeZone);
  return (
    <span>
      <time dateTime={sewDay.startsAt}>{formatInZone(sewDay.startsAt, sewDay.timeZone)}</time> –{' '}
      <time dateTime={sewDay.endsAt}>{end}</time> <span className="text-walnut-soft">({relativeTime(sewDay.startsAt)})</span>
    </span>
  );
}
