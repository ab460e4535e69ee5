import { Op, QueryTypes } from 'sequelize';
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
import { ChatRoom, Guild, Rsvp, SewDay, User } from '../db/models';
import { ConflictError, NotFoundError, ValidationError } from '../http/errors';
import type { AppDeps } from '../deps';
import { RSVP_COUNTS, UPSERT_RSVP } from './sewdays.queries';

type Deps = Pick<AppDeps, 'sequelize'>;
type Events = Pick<AppDeps, 'events' | 'sequelize'>;

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

/** Builds the answers for several sew days with three queries, whatever their number. */
async function toDtos(deps: Deps, sewDays: SewDay[], timeZone: string, viewer: Viewer): Promise<SewDayDto[]> {
  if (sewDays.length === 0) return [];
  const ids = sewDays.map((s) => s.id);
  const counts = await deps.sequelize.query<{ sew_day_id: number; answer: RsvpAnswer; n: string }>(RSVP_COUNTS, {
    bind: { ids },
    type: QueryTypes.SELECT,
  });
  const mine = await Rsvp.findAll({ where: { sewDayId: ids, userId: viewer.userId } });
  const rooms = await ChatRoom.findAll({ where: { sewDayId: ids }, attributes: ['id', 'sewDayId'] });
  return sewDays.map((s) => {
    const rsvpCounts = Object.fromEntries(rsvpAnswers.map((a) => [a, 0])) as Record<RsvpAnswer, number>;
    for (const c of counts) if (c.sew_day_id === s.id) rsvpCounts[c.answer] = Number(c.n);
    return {
      id: s.id,
      guildId: s.guildId,
      title: s.title,
      startsAt: s.startsAt.toISOString(),
      endsAt: s.endsAt.toISOString(),
      startsAtLocal: instantToWallTime(s.startsAt, timeZone),
      endsAtLocal: instantToWallTime(s.endsAt, timeZone),
      timeZone,
      place: s.place,
      videoUrl: s.videoUrl,
      notes: s.notes,
      cancelledAt: s.cancelledAt?.toISOString() ?? null,
      createdBy: s.createdBy ? { id: s.createdBy.id, displayName: s.createdBy.displayName } : null,
      rsvpCounts,
      myRsvp: mine.find((r) => r.sewDayId === s.id)?.answer ?? null,
      chatRoomId: rooms.find((r) => r.sewDayId === s.id)?.id ?? null,
      canManage: viewer.canManage,
    };
  });
}

const withCreator = [{ model: User, as: 'createdBy', attributes: ['id', 'displayName'] }];

/** Upcoming (not yet ended, soonest first) or past (most recent first) sew days of a guild. */
export async function listSewDays(deps: Deps, guildId: number, viewer: Viewer, query: SewDayListQuery): Promise<SewDayListDto> {
  const guild = await guildZone(guildId);
  const now = new Date();
  const sewDays = await SewDay.findAll({
    where: { guildId, endsAt: query.when === 'upcoming' ? { [Op.gte]: now } : { [Op.lt]: now } },
    include: withCreator,
    order: [['startsAt', query.when === 'upcoming' ? 'ASC' : 'DESC']],
    limit: 100,
  });
  return { timeZone: guild.timeZone, canManage: viewer.canManage, sewDays: await toDtos(deps, sewDays, guild.timeZone, viewer) };
}

/** One sew day with everyone's answers, grouped for the page. */
export async function getSewDay(deps: Deps, sewDayId: number, viewer: Viewer): Promise<SewDayDetailDto> {
  const sewDay = await SewDay.findByPk(sewDayId, { include: withCreator });
  if (!sewDay) throw new NotFoundError('That sew day does not exist.');
  const guild = await guildZone(sewDay.guildId);
  const [dto] = await toDtos(deps, [sewDay], guild.timeZone, viewer);
  const rsvps = await Rsvp.findAll({
    where: { sewDayId },
    include: [{ model: User, as: 'user', attributes: ['id', 'displayName'] }],
    order: [[{ model: User, as: 'user' }, 'displayName', 'ASC']],
  });
  return { ...dto!, rsvps: rsvps.map((r) => ({ userId: r.userId, displayName: r.user!.displayName, answer: r.answer })) };
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
