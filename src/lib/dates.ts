const relative = new Intl.RelativeTimeFormat('en', { numeric: 'auto' });

/** "in 5 days", "yesterday", "in 3 hours". */
export function relativeTime(date: Date | string, now = new Date()): string {
  const ms = new Date(date).getTime() - now.getTime();
  const minutes = Math.round(ms / 60_000);
  if (Math.abs(minutes) < 60) return relative.format(minutes, 'minute');
  const hours = Math.round(minutes / 60);
  if (Math.abs(hours) < 36) return relative.format(hours, 'hour');
  const days = Math.round(hours / 24);
  if (Math.abs(days) < 60) return relative.format(days, 'day');
  return relative.format(Math.round(days / 30), 'month');
}

/** A date in the guild's time zone, e.g. "Tue 5 Apr 2027, 18:00". */
export function formatInZone(date: Date | string, timeZone: string, withTime = true): string {
  return new Intl.DateTimeFormat('en-GB', {
    timeZone,
    weekday: 'short',
    day: 'numeric',
    month: 'short',
    year: 'numeric',
    ...(withTime ? { hour: '2-digit', minute: '2-digit' } : {}),
  }).format(new Date(date));
}
