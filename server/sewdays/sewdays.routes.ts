import { Router } from 'express';
import { z } from 'zod';
import { guildParamsSchema } from '@shared/schemas/guilds';
import { rsvpInputSchema, sewDayInputSchema, sewDayListQuerySchema, sewDayParamsSchema, type SewDayListQuery } from '@shared/schemas/sewdays';
import { validate } from '../http/validate';
import { currentUser, requireUser } from '../auth/require-user';
import { authorizeGuild, can } from '../guilds/guilds.policy';
import { Guild } from '../db/models';
import { authorizeSewDay, canManageSewDays } from './sewdays.policy';
import { sewDayIcs } from './sewdays.ics';
import * as sewDays from './sewdays.service';
import type { AppDeps } from '../deps';

type GuildParams = z.infer<typeof guildParamsSchema>;
type SewDayParams = z.infer<typeof sewDayParamsSchema>;

// The fields of a sew day, any subset; the service checks the merged whole.
const sewDayChangesSchema = z.strictObject(
  { title: z.unknown(), startsAt: z.unknown(), endsAt: z.unknown(), place: z.unknown(), videoUrl: z.unknown(), notes: z.unknown() },
  { error: 'Only title, startsAt, endsAt, place, videoUrl and notes can be changed.' },
).partial();

/** Sew days: the guild's calendar, RSVPs and a calendar file per day. */
export function sewDaysRouter(deps: AppDeps) {
  const router = Router();

  router.get('/guilds/:guildId/sew-days', requireUser, validate({ params: guildParamsSchema, query: sewDayListQuerySchema }), async (req, res) => {
    const { guildId } = req.params as unknown as GuildParams;
    const user = currentUser(req);
    const membership = await authorizeGuild(user.id, guildId, 'sewdays:read');
    const viewer = { userId: user.id, canManage: can(membership.role, 'sewdays:manage') };
    res.json(await sewDays.listSewDays(guildId, viewer, req.query as unknown as SewDayListQuery));
  });

  router.post('/guilds/:guildId/sew-days', requireUser, validate({ params: guildParamsSchema, body: sewDayInputSchema }), async (req, res) => {
    const { guildId } = req.params as unknown as GuildParams;
    const user = currentUser(req);
    await authorizeGuild(user.id, guildId, 'sewdays:manage');
    res.status(201).json(await sewDays.scheduleSewDay(deps, guildId, user.id, req.body));
  });

  router.get('/sew-days/:sewDayId', requireUser, validate({ params: sewDayParamsSchema }), async (req, res) => {
    const { sewDayId } = req.params as unknown as SewDayParams;
    const user = currentUser(req);
    const { membership } = await authorizeSewDay(user.id, sewDayId, 'sewdays:read');
    res.json(await sewDays.getSewDay(sewDayId, { userId: user.id, canManage: canManageSewDays(membership) }));
  });

  router.patch('/sew-days/:sewDayId', requireUser, validate({ params: sewDayParamsSchema, body: sewDayChangesSchema }), async (req, res) => {
    const { sewDayId } = req.params as unknown as SewDayParams;
    const user = currentUser(req);
    const { sewDay } = await authorizeSewDay(user.id, sewDayId, 'sewdays:manage');
    res.json(await sewDays.updateSewDay(deps, sewDay, user.id, req.body));
  });

  router.post('/sew-days/:sewDayId/cancel', requireUser, validate({ params: sewDayParamsSchema }), async (req, res) => {
    const { sewDayId } = req.params as unknown as SewDayParams;
    const user = currentUser(req);
    const { sewDay } = await authorizeSewDay(user.id, sewDayId, 'sewdays:manage');
    res.json(await sewDays.cancelSewDay(deps, sewDay, user.id));
  });

  router.put('/sew-days/:sewDayId/rsvp', requireUser, validate({ params: sewDayParamsSchema, body: rsvpInputSchema }), async (req, res) => {
    const { sewDayId } = req.params as unknown as SewDayParams;
    const user = currentUser(req);
    const { sewDay, membership } = await authorizeSewDay(user.id, sewDayId, 'sewdays:read');
    res.json(await sewDays.answerRsvp(deps, sewDay, { userId: user.id, canManage: canManageSewDays(membership) }, req.body.answer));
  });

  router.get('/sew-days/:sewDayId/calendar.ics', requireUser, validate({ params: sewDayParamsSchema }), async (req, res) => {
    const { sewDayId } = req.params as unknown as SewDayParams;
    const { sewDay } = await authorizeSewDay(currentUser(req).id, sewDayId, 'sewdays:read');
    const guild = await Guild.findByPk(sewDay.guildId);
    const ics = sewDayIcs(sewDay, { guildName: guild?.name ?? 'Guild', publicUrl: deps.config.PUBLIC_URL });
    res
      .type('text/calendar; charset=utf-8')
      .set('Content-Disposition', `attachment; filename="sew-day-${sewDay.id}.ics"`)
      .set('Cache-Control', 'private, no-store')
      .send(ics);
  });

  return router;
}
