import { z } from 'zod';
import { idParam } from './ids';

export const rsvpAnswers = ['going', 'maybe', 'no'] as const;
export const rsvpAnswerSchema = z.enum(rsvpAnswers, { error: 'Answer going, maybe or no.' });
export type RsvpAnswer = z.infer<typeof rsvpAnswerSchema>;
export const rsvpLabels: Record<RsvpAnswer, string> = { going: 'Going', maybe: 'Maybe', no: 'Not going' };

/** A wall-clock time as a datetime-local input gives it: read in the guild's time zone. */
const wallTime = z
  .string({ error: 'Enter a date and time.' })
  .max(16, 'Enter a date and time like 2027-03-14 10:00.')
  .regex(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/, 'Enter a date and time like 2027-03-14 10:00.')
  .superRefine((s, ctx) => {
    const problem = wallTimeProblem(s);
    if (problem) ctx.addIssue({ code: 'custom', message: problem });
  });

export const SEW_DAY_FIRST_YEAR = 2000;
export const SEW_DAY_LAST_YEAR = 2200;
const MONTHS = [
  'January',
  'February',
  'March',
  'April',
  'May',
  'June',
  'July',
  'August',
  'September',
  'October',
  'November',
  'December',
];

/**
 * Why a `YYYY-MM-DDTHH:mm` is not a real time on the calendar, or null. Read strictly: 30 February
 * is refused, never rolled over into March.
 */
export function wallTimeProblem(s: string): string | null {
  const [year, month, day, hour, minute] = [s.slice(0, 4), s.slice(5, 7), s.slice(8, 10), s.slice(11, 13), s.slice(14, 16)].map(
    Number,
  ) as [number, number, number, number, number];
  if (year < SEW_DAY_FIRST_YEAR || year > SEW_DAY_LAST_YEAR)
    return `Choose a year between ${SEW_DAY_FIRST_YEAR} and ${SEW_DAY_LAST_YEAR}.`;
  if (month < 1 || month > 12) return `There is no month ${month}: use 01 to 12.`;
  const days = new Date(Date.UTC(year, month, 0)).getUTCDate();
  if (day < 1 || day > days) return `${MONTHS[month - 1]} ${year} has ${days} days: there is no day ${day}.`;
  if (hour > 23 || minute > 59) return 'Give a time of day from 00:00 to 23:59.';
  return null;
}

const optionalText = (max: number, message: string) =>
  z
    .string()
    .trim()
    .max(max, message)
    .nullish()
    .transform((s) => (s ? s : null));

const sewDayFields = z.object({
  title: z
    .string({ error: 'Give the sew day a name.' })
    .trim()
    .min(2, 'Give the sew day a name of at least 2 characters.')
    .max(120, 'Keep the name under 120 characters.'),
  startsAt: wallTime,
  endsAt: wallTime,
  place: optionalText(300, 'Keep the place under 300 characters.'),
  videoUrl: z
    .string()
    .max(500, 'That link is too long.')
    .trim()
    .nullish()
    .transform((s) => (s ? s : null))
    .pipe(
      z
        .url({ protocol: /^https$/, error: 'Give a video link starting with https://' })
        .max(500, 'That link is too long.')
        .nullable(),
    ),
  notes: optionalText(4000, 'Keep the notes under 4,000 characters.'),
});

function checkWhenAndWhere(
  value: { startsAt: string; endsAt: string; place: string | null; videoUrl: string | null },
  ctx: z.RefinementCtx,
) {
  if (value.endsAt <= value.startsAt)
    ctx.addIssue({ code: 'custom', path: ['endsAt'], message: 'The end must come after the start.' });
  if (!value.place && !value.videoUrl)
    ctx.addIssue({ code: 'custom', path: ['place'], message: 'Give a place, a video link, or both.' });
}

/** Body of POST /api/guilds/:guildId/sew-days and PATCH /api/sew-days/:sewDayId. Times are in the guild's zone. */
export const sewDayInputSchema = sewDayFields.superRefine(checkWhenAndWhere);
export type SewDayInput = z.infer<typeof sewDayInputSchema>;
export type SewDayFormValues = z.input<typeof sewDayInputSchema>;

export const rsvpInputSchema = z.object({ answer: rsvpAnswerSchema }).strict();
export type RsvpInput = z.infer<typeof rsvpInputSchema>;

export const sewDayListQuerySchema = z.object({
  when: z.enum(['upcoming', 'past'], { error: 'Choose upcoming or past.' }).default('upcoming'),
});
export type SewDayListQuery = z.infer<typeof sewDayListQuerySchema>;

export const sewDayParamsSchema = z.object({
  sewDayId: idParam,
});

export interface SewDayDto {
  id: number;
  guildId: number;
  title: string;
  /** Instants in UTC; show them in `timeZone`. */
  startsAt: string;
  endsAt: string;
  /** The same times as wall-clock values in the guild's zone, for editing. */
  startsAtLocal: string;
  endsAtLocal: string;
  timeZone: string;
  place: string | null;
  videoUrl: string | null;
  notes: string | null;
  cancelledAt: string | null;
  createdBy: { id: number; displayName: string } | null;
  rsvpCounts: Record<RsvpAnswer, number>;
  myRsvp: RsvpAnswer | null;
  chatRoomId: number | null;
  canManage: boolean;
}

/** GET /api/guilds/:guildId/sew-days */
export interface SewDayListDto {
  timeZone: string;
  /** Whether the caller may schedule, edit and cancel. */
  canManage: boolean;
  sewDays: SewDayDto[];
}

export interface SewDayDetailDto extends SewDayDto {
  rsvps: { userId: number; displayName: string; answer: RsvpAnswer }[];
}

// One formatter per zone, kept: making one costs about ten times as much as using it (150 against 15 µs
// here), and a guild's list of sew days asks twice a day. The zones are a short, fixed list.
const zoneFormats = new Map<string, Intl.DateTimeFormat>();

function zoneFormat(timeZone: string): Intl.DateTimeFormat {
  let format = zoneFormats.get(timeZone);
  if (!format) {
    format = new Intl.DateTimeFormat('en-US', {
      timeZone,
      hourCycle: 'h23',
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      second: '2-digit',
    });
    zoneFormats.set(timeZone, format);
  }
  return format;
}

/** The offset of `timeZone` from UTC at `instant`, in minutes (Chicago in winter: -360). */
export function zoneOffsetMinutes(instant: Date, timeZone: string): number {
  const parts = zoneFormat(timeZone).formatToParts(instant);
  const get = (type: string) => Number(parts.find((p) => p.type === type)?.value);
  const asUtc = Date.UTC(get('year'), get('month') - 1, get('day'), get('hour'), get('minute'), get('second'));
  return Math.round((asUtc - Math.floor(instant.getTime() / 1000) * 1000) / 60_000);
}

/**
 * The instant a wall-clock time `YYYY-MM-DDTHH:mm` names in `timeZone`. A time skipped by a
 * daylight-saving change is read with the offset before the change.
 */
export function wallTimeToInstant(wall: string, timeZone: string): Date {
  const naive = Date.parse(`${wall}:00Z`);
  const first = naive - zoneOffsetMinutes(new Date(naive), timeZone) * 60_000;
  const second = naive - zoneOffsetMinutes(new Date(first), timeZone) * 60_000;
  return new Date(second);
}

/** The wall-clock `YYYY-MM-DDTHH:mm` of `instant` in `timeZone`, as a datetime-local input wants it. */
export function instantToWallTime(instant: Date, timeZone: string): string {
  const shifted = new Date(instant.getTime() + zoneOffsetMinutes(instant, timeZone) * 60_000);
  return shifted.toISOString().slice(0, 16);
}

/**
 * Reminders shown on every sew-day page and in its calendar file: our own wording of common workroom
 * safety practice. The maker's own judgement and the host's rules come first.
 */
export const sewDayCautions = [
  {
    topic: 'Irons',
    text: 'Never leave a hot iron face down or unattended: stand it on its heel, and unplug it when you step away or finish.',
  },
  {
    topic: 'Cords',
    text: 'Run extension and iron cords along walls or under tables, not across walkways where someone could catch a foot.',
  },
  {
    topic: 'Rotary cutters',
    text: 'Close or cover the blade every time you put the cutter down, even for a moment, and cut away from yourself.',
  },
  {
    topic: 'Pins and needles',
    text: 'Keep pins in a cushion or dish, never between your lips, and switch the machine off before changing a needle.',
  },
] as const;
