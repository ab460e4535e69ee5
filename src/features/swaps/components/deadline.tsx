import { formatInZone, relativeTime } from '@/lib/dates';

/** A date in the guild's time zone with "in 5 days" beside it. */
export function Deadline({ label, iso, timeZone }: { label: string; iso: string; timeZone: string }) {
  const text = relativeTime(iso);
  // relativeTime says "… ago" for the past; those are shown quieter.
  const past = text.endsWith('ago') || text === 'yesterday' || text.startsWith('last');
  return (
    <p>
      <span className="font-semibold">{label}:</span> <time dateTime={iso}>{formatInZone(iso, timeZone)}</time>{' '}
      <span className={past ? 'text-walnut-soft' : 'text-indigo-deep'}>({text})</span>
    </p>
  );
}
