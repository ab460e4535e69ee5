/**
 * Dates typed in the guild's time zone. A datetime-local field gives "2027-03-01T18:00" with no
 * zone; these helpers turn it into an instant in the guild's zone and back.
 */

/** Milliseconds the zone is ahead of UTC at that instant. */
function zoneOffset(instant: number, timeZone: string): number {
  const parts = new Intl.DateTimeFormat('en-US', {
    timeZone,
    hourCycle: 'h23',
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
    hour: '2-digit',
    minute: '2-digit',
    second: '2-digit',
  }).formatToParts(new Date(instant));
  const get = (type: string) => Number(parts.find((p) => p.type === type)?.value);
  return (
    Date.UTC(get('year'), get('month') - 1, get('day'), get('hour'), get('minute'), get('second')) -
    Math.floor(instant / 1000) * 1000
  );
}

/** "2027-03-01T18:00" in `timeZone` → ISO 8601 instant, or '' when the text is incomplete. */
export function zonedLocalToIso(local: string, timeZone: string): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})$/.exec(local);
  if (!m) return '';
  const [, y, mo, d, h, mi] = m.map(Number) as number[];
  const wall = Date.UTC(y!, mo! - 1, d!, h!, mi!);
  // Two passes settle the offset across a daylight-saving change.
  let instant = wall - zoneOffset(wall, timeZone);
  instant = wall - zoneOffset(instant, timeZone);
  return new Date(instant).toISOString();
}

/** ISO instant → "2027-03-01T18:00" as the wall clock reads in `timeZone`. */
export function isoToZonedLocal(iso: string, timeZone: string): string {
  const t = new Date(iso).getTime();
  if (Number.isNaN(t)) return '';
  const wall = new Date(t + zoneOffset(t, timeZone));
  return wall.toISOString().slice(0, 16);
}
