import { createEvent, type EventAttributes } from 'ics';
import type { SewDay } from '../db/models';
import { sewDayCautions } from '@shared/schemas/sewdays';

/**
 * One sew day as an iCalendar file (RFC 5545). The UID stays the same across edits and SEQUENCE
 * counts them, so a calendar program updates its copy; a cancelled day is sent with STATUS:CANCELLED.
 */
export function sewDayIcs(sewDay: SewDay, opts: { guildName: string; publicUrl: string }): string {
  const host = new URL(opts.publicUrl).hostname;
  const pageUrl = `${opts.publicUrl}/guilds/${sewDay.guildId}/sew-days/${sewDay.id}`;
  const description = [
    sewDay.notes,
    sewDay.videoUrl ? `Video call: ${sewDay.videoUrl}` : null,
    `Details and chat: ${pageUrl}`,
    `Take care: ${sewDayCautions.map((c) => c.text).join(' ')}`,
  ]
    .filter(Boolean)
    .join('\n\n');
  const attributes: EventAttributes = {
    uid: `sew-day-${sewDay.id}@${host}`,
    productId: 'blockpost/sew-days',
    method: 'PUBLISH',
    title: `${sewDay.title} (${opts.guildName})`,
    start: sewDay.startsAt.getTime(),
    startInputType: 'utc',
    startOutputType: 'utc',
    end: sewDay.endsAt.getTime(),
    endInputType: 'utc',
    endOutputType: 'utc',
    location: sewDay.place ?? sewDay.videoUrl ?? undefined,
    url: sewDay.videoUrl ?? pageUrl,
    description,
    status: sewDay.cancelledAt ? 'CANCELLED' : 'CONFIRMED',
    sequence: sewDay.revision,
    created: sewDay.createdAt.getTime(),
    lastModified: sewDay.updatedAt.getTime(),
    busyStatus: 'BUSY',
  };
  const { error, value } = createEvent(attributes);
  if (error || !value) throw error ?? new Error('The calendar file could not be made.');
  return value;
}
