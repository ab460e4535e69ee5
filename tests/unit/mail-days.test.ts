/** Days until a deadline are counted on the guild's calendar, and past deadlines read in the past. */
import { describe, expect, it } from 'vitest';
import { daysUntil, inDays } from '../../server/mail/format';

describe('daysUntil in the guild zone', () => {
  // America/Chicago is six hours behind UTC in early March, before the clocks change (from memory).
  const now = new Date('2027-03-01T23:00:00Z');
  const deadline = new Date('2027-03-02T03:00:00Z');

  it('counts calendar days where the guild is, not 24-hour periods in UTC', () => {
    expect(daysUntil(deadline, now, 'UTC')).toBe(1);
    expect(daysUntil(deadline, now, 'America/Chicago')).toBe(0);
    expect(inDays(daysUntil(deadline, now, 'America/Chicago'))).toBe('today');
  });

  it('reads a passed deadline in the past', () => {
    expect(inDays(daysUntil('2027-02-27T12:00:00Z', now, 'UTC'))).toBe('2 days ago');
    expect(inDays(daysUntil('2027-02-28T12:00:00Z', now, 'UTC'))).toBe('yesterday');
    expect(inDays(daysUntil('2027-03-09T12:00:00Z', now, 'UTC'))).toBe('in 8 days');
  });
});
