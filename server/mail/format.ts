/** Words and numbers as e-mails show them: dates in the guild's zone, lengths in the reader's units. */
import { formatLength } from '@shared/quilt';
import type { Units } from '@shared/schemas/auth';

/**
 * A formatter per zone, kept: making one costs about ten times as much as using it, and a reminder
 * sweep formats a date for every maker. The zones are a short, fixed list.
 */
function formatIn(cache: Map<string, Intl.DateTimeFormat>, make: (timeZone: string) => Intl.DateTimeFormat, timeZone: string) {
  let format = cache.get(timeZone);
  if (!format) cache.set(timeZone, (format = make(timeZone)));
  return format;
}

const longDates = new Map<string, Intl.DateTimeFormat>();
const dateKeys = new Map<string, Intl.DateTimeFormat>();

/** "Monday 1 March 2027 at 6:00 pm" in the given IANA zone (or without the time). */
export function mailDate(date: Date | string, timeZone: string, withTime = true): string {
  // Built from parts: ICU versions differ on commas in the long English form.
  const longDate = (zone: string) =>
    new Intl.DateTimeFormat('en-GB', {
      timeZone: zone,
      weekday: 'long',
      day: 'numeric',
      month: 'long',
      year: 'numeric',
      hour: 'numeric',
      minute: '2-digit',
      hourCycle: 'h12',
    });
  const parts = formatIn(longDates, longDate, timeZone).formatToParts(new Date(date));
  const part = (type: Intl.DateTimeFormatPartTypes) => parts.find((p) => p.type === type)?.value ?? '';
  const day = `${part('weekday')} ${part('day')} ${part('month')} ${part('year')}`;
  if (!withTime) return day;
  return `${day} at ${part('hour')}:${part('minute')} ${part('dayPeriod').toLowerCase()}`;
}

/** The zone as people read it: "America/Chicago" → "America/Chicago time", UTC stays "UTC". */
export function zoneLabel(timeZone: string): string {
  return timeZone === 'UTC' ? 'UTC' : `${timeZone.replace(/_/g, ' ')} time`;
}

/** The calendar date (YYYY-MM-DD) of an instant in a zone; used in idempotency keys. */
export function localDateKey(date: Date | string, timeZone: string): string {
  const dateKey = (zone: string) =>
    new Intl.DateTimeFormat('en-CA', { timeZone: zone, year: 'numeric', month: '2-digit', day: '2-digit' });
  return formatIn(dateKeys, dateKey, timeZone).format(new Date(date));
}

/**
 * Calendar days from `now` until `date` as the guild's clock reads them: a deadline at 9 am
 * tomorrow is "tomorrow" even at 11 pm today. Negative once the date has passed.
 */
export function daysUntil(date: Date | string, now = new Date(), timeZone = 'UTC'): number {
  const day = (d: Date | string) => Date.parse(`${localDateKey(d, timeZone)}T00:00:00Z`);
  return Math.round((day(date) - day(now)) / 86_400_000);
}

/** "today", "tomorrow", "in 5 days"; past dates read in the past: "yesterday", "3 days ago". */
export function inDays(days: number): string {
  if (days === 0) return 'today';
  if (days === 1) return 'tomorrow';
  if (days === -1) return 'yesterday';
  if (days < 0) return `${-days} days ago`;
  return `in ${days} days`;
}

/** "1 block", "4 blocks". */
export function plural(count: number, singular: string, pluralForm = `${singular}s`): string {
  return `${count} ${count === 1 ? singular : pluralForm}`;
}

/** A length in inches shown in the reader's units: 8½″ or 215.9 mm. */
export function mailLength(inches: number, units: Units = 'in'): string {
  return formatLength(inches, { unit: units });
}

/** "9½″ × 9½″". */
export function mailSize(size: { width: number; height: number }, units: Units = 'in'): string {
  return `${mailLength(size.width, units)} × ${mailLength(size.height, units)}`;
}

/** Yardage already rounded to ⅛ yd: "1⅛ yd", with metres beside it for metric readers. */
export function mailYards(yards: number, units: Units = 'in'): string {
  const text = `${formatLength(yards).replace('″', '')} yd`;
  if (units !== 'mm') return text;
  return `${text} (${(yards * 0.9144).toFixed(2)} m)`; // 1 yd = 0.9144 m exactly (international yard, 1959)
}

/** Week label for digests and their keys: ISO 8601 year and week, e.g. "2027-W14". */
export function isoWeek(date: Date): string {
  const d = new Date(Date.UTC(date.getUTCFullYear(), date.getUTCMonth(), date.getUTCDate()));
  const day = d.getUTCDay() || 7;
  d.setUTCDate(d.getUTCDate() + 4 - day);
  const yearStart = new Date(Date.UTC(d.getUTCFullYear(), 0, 1));
  const week = Math.ceil(((d.getTime() - yearStart.getTime()) / 86_400_000 + 1) / 7);
  return `${d.getUTCFullYear()}-W${String(week).padStart(2, '0')}`;
}
