import { formatInZone, relativeTime } from '@/lib/dates';

/**
 * A date in the guild's time zone with "in 5 days" beside it. Once the step it announces is over
 * (`over`), it reads in the past tense (`overLabel`) without counting days, so a closed swap never
 * says "closes in 18 days".
 */
export function Deadline({
  label,
  iso,
  timeZone,
  over,
  overLabel,
}: {
  label: string;
  iso: string;
  timeZone: string;
  over?: boolean;
  overLabel?: string;
}) {
  const text = relativeTime(iso);
  // relativeTime says "… ago" for the past; those are shown quieter.
  const past = text.endsWith('ago') || text === 'yesterday' || text.startsWith('last');
  return (
    <p>
      <span className="font-semibold">{over ? (overLabel ?? label) : label}:</span>{' '}
      <time dateTime={iso}>{formatInZone(iso, timeZone)}</time>
      {!over && (
        <>
          {' '}
          <span className={past ? 'text-walnut-soft' : 'text-indigo-deep'}>({text})</span>
        </>
      )}
    </p>
  );
}
