import {
  instantToWallTime,
  rsvpAnswers,
  sewDayInputSchema,
  wallTimeToInstant,
  type RsvpAnswer,
  type SewDayDetailDto,
  type SewDayDto,
  type SewDayInput,
  type SewDayListDto,
  type SewDayListQuery,
} from '@shared/schemas/sewdays';
import { zodFields } from '@shared/schemas/errors';
import { ChatRoom, Guild, SewDay } from '../db/models';
import { ConflictError, NotFoundError, ValidationError } from '../http/errors';
import type { AppDeps } from '../deps';
import { preparedPoolQuery } from '../db/prepared';
import { SEW_DAY_DETAIL, SEW_DAY_LIST, UPSERT_RSVP } from './sewdays.queries';

type Deps = Pick<AppDeps, 'pool'>;
type Events = Pick<AppDeps, 'events' | 'sequelize' | 'pool'>;

interface Viewer {
  userId: number;
  canManage: boolean;
}

async function guildZone(guildId: number): Promise<Guild> {
  const guild = await Guild.findByPk(guildId);
  if (!guild) throw new NotFoundError('That guild does not exist.');
  return guild;
}

function toColumns(input: SewDayInput, timeZone: string) {
  return {
    title: input.title,
    startsAt: wallTimeToInstant(input.startsAt, timeZone),
    endsAt: wallTimeToInstant(input.endsAt, timeZone),
    place: input.place,
    videoUrl: input.videoUrl,
    notes: input.notes,
  };
}

/** A sew day's row as SEW_DAY_ROW reads it; instants are strings where it came inside JSON. */
interface SewDayRow {
  id: number;
  guildId: number;
  title: string;
  startsAt: Date | string;
  endsAt: Date | string;
  place: string | null;
  videoUrl: string | null;
  notes: string | null;
  cancelledAt: Date | string | null;
  creatorId: number | null;
  creatorName: string | null;
  rsvpCounts: Partial<Record<RsvpAnswer, number>> | null;
  myRsvp: RsvpAnswer | null;
  chatRoomId: number | null;
}

function toDto(row: SewDayRow, timeZone: string, viewer: Viewer): SewDayDto {
  const startsAt = new Date(row.startsAt);
  const endsAt = new Date(row.endsAt);
  return {
    id: row.id,
    guildId: row.guildId,
    title: row.title,
    startsAt: startsAt.toISOString(),
    endsAt: endsAt.toISOString(),
    startsAtLocal: instantToWallTime(startsAt, timeZone),
    endsAtLocal: instantToWallTime(endsAt, timeZone),
    timeZone,
    place: row.place,
    videoUrl: row.videoUrl,
    notes: row.notes,
    cancelledAt: row.cancelledAt === null ? null : new Date(row.cancelledAt).toISOString(),
    createdBy: row.creatorId === null ? null : { id: row.creatorId, displayName: row.creatorName! },
    rsvpCounts: Object.fromEntries(rsvpAnswers.map((a) => [a, row.rsvpCounts?.[a] ?? 0])) as Record<RsvpAnswer, number>,
    myRsvp: row.myRsvp,
    chatRoomId: row.chatRoomId,
    canManage: viewer.canManage,
  };
}

/**
 * Upcoming (not yet ended, soonest first) or past (most recent first) sew days of a guild, in one
 * statement with their answers counted, the caller's answer and their chat rooms.
 */
export async function listSewDays(deps: Deps, guildId: number, viewer: Viewer, query: SewDayListQuery): Promise<SewDayListDto> {
  const [list] = await preparedPoolQuery<{ timeZone: string; sewDays: SewDayRow[] }>(deps.pool, SEW_DAY_LIST[query.when], {
    guildId,
    userId: viewer.userId,
    now: new Date(),
  });
  if (!list) throw new NotFoundError('That guild does not exist.');
  const { timeZone } = list;
  return { timeZone, canManage: viewer.canManage, sewDays: list.sewDays.map((row) => toDto(row, timeZone, viewer)) };
}

/** One sew day with everyone's answers, grouped for the page, in one statement. */
export async function getSewDay(deps: Deps, sewDayId: number, viewer: Viewer): Promise<SewDayDetailDto> {
  const [row] = await preparedPoolQuery<SewDayRow & { timeZone: string; rsvps: SewDayDetailDto['rsvps'] }>(
    deps.pool,
    SEW_DAY_DETAIL,
    { sewDayId, userId: viewer.userId },
  );
  if (!row) throw new NotFoundError('That sew day does not exist.');
  return { ...toDto(row, row.timeZone, viewer), rsvps: row.rsvps };
}

/** Schedules a sew day and opens its chat room in the same transaction. */
export async function scheduleSewDay(
  deps: Events,
  guildId: number,
  actorId: number,
  input: SewDayInput,
): Promise<SewDayDetailDto> {
  const guild = await guildZone(guildId);
  const sewDay = await deps.sequelize.transaction(async (transaction) => {
    const created = await SewDay.create({ guildId, createdById: actorId, ...toColumns(input, guild.timeZone) }, { transaction });
    await ChatRoom.create({ guildId, kind: 'sewday', sewDayId: created.id, swapId: null }, { transaction });
    return created;
  });
  deps.events.emit('sewday.changed', { guildId, sewDayId: sewDay.id, actorId, change: 'scheduled' });
  return getSewDay(deps, sewDay.id, { userId: actorId, canManage: true });
}

/** Changes some fields; the result must still be a whole, valid sew day. A cancelled day stays as it was. */
export async function updateSewDay(
  deps: Events,
  sewDay: SewDay,
  actorId: number,
  changes: Record<string, unknown>,
): Promise<SewDayDetailDto> {
  if (sewDay.cancelledAt) throw new ConflictError('This sew day was cancelled; schedule a new one instead.', 'sew_day_cancelled');
  const guild = await guildZone(sewDay.guildId);
  const current = {
    title: sewDay.title,
    startsAt: instantToWallTime(sewDay.startsAt, guild.timeZone),
    endsAt: instantToWallTime(sewDay.endsAt, guild.timeZone),
    place: sewDay.place,
    videoUrl: sewDay.videoUrl,
    notes: sewDay.notes,
  };
  const merged = sewDayInputSchema.safeParse({ ...current, ...changes });
  if (!merged.success) {
    const fields = zodFields(merged.error);
    throw new ValidationError(Object.values(fields)[0] ?? 'Some fields need another look.', fields);
  }
  await sewDay.update({ ...toColumns(merged.data, guild.timeZone), revision: sewDay.revision + 1 });
  deps.events.emit('sewday.changed', { guildId: sewDay.guildId, sewDayId: sewDay.id, actorId, change: 'updated' });
  return getSewDay(deps, sewDay.id, { userId: actorId, canManage: true });
}

/** Cancels without deleting: people who planned to come still see it, marked cancelled. */
export async function cancelSewDay(deps: Events, sewDay: SewDay, actorId: number): Promise<SewDayDetailDto> {
  if (sewDay.cancelledAt) throw new ConflictError('This sew day is already cancelled.', 'sew_day_cancelled');
  await sewDay.update({ cancelledAt: new Date(), revision: sewDay.revision + 1 });
  deps.events.emit('sewday.changed', { guildId: sewDay.guildId, sewDayId: sewDay.id, actorId, change: 'cancelled' });
  return getSewDay(deps, sewDay.id, { userId: actorId, canManage: true });
}

/** Records or replaces the caller's answer; not for a cancelled or finished sew day. */
export async function answerRsvp(deps: Events, sewDay: SewDay, viewer: Viewer, answer: RsvpAnswer): Promise<SewDayDetailDto> {
  if (sewDay.cancelledAt) throw new ConflictError('This sew day was cancelled, so it takes no answers.', 'sew_day_cancelled');
  if (sewDay.endsAt.getTime() < Date.now())
    throw new ConflictError('This sew day is over, so it takes no answers.', 'sew_day_over');
  await deps.sequelize.query(UPSERT_RSVP, { bind: { sewDayId: sewDay.id, userId: viewer.userId, answer } });
  deps.events.emit('rsvp.changed', { guildId: sewDay.guildId, sewDayId: sewDay.id, userId: viewer.userId, answer });
  return getSewDay(deps, sewDay.id, viewer);
}
