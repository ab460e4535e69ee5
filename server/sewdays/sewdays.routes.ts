import { Router, type Request } from 'express';
import { z } from 'zod';
import { guildParamsSchema } from '@shared/schemas/guilds';
import { rsvpInputSchema, sewDayInputSchema, sewDayListQuerySchema, sewDayParamsSchema } from '@shared/schemas/sewdays';
import { route } from '../http/route';
import { currentUser, requireUser } from '../auth/require-user';
import { authorizeGuild, can } from '../guilds/guilds.policy';
import { Guild } from '../db/models';
import { authorizeSewDay, canManageSewDays } from './sewdays.policy';
import { sewDayIcs } from './sewdays.ics';
import * as sewDays from './sewdays.service';
import type { AppDeps } from '../deps';

type SewDayInput = { params: { sewDayId: number } };

// The fields of a sew day, any subset; the service checks the merged whole.
const sewDayChangesSchema = z
  .strictObject(
    {
      title: z.unknown(),
      startsAt: z.unknown(),
      endsAt: z.unknown(),
      place: z.unknown(),
      videoUrl: z.unknown(),
      notes: z.unknown(),
    },
    { error: 'Only title, startsAt, endsAt, place, videoUrl and notes can be changed.' },
  )
  .partial();

/** Sew days: the guild's calendar, RSVPs and a calendar file per day. */
export function sewDaysRouter(deps: AppDeps) {
  const readSewDay = (req: Request, { params }: SewDayInput) =>
    authorizeSewDay(deps, currentUser(req).id, params.sewDayId, 'sewdays:read');
  const manageSewDay = (req: Request, { params }: SewDayInput) =>
    authorizeSewDay(deps, currentUser(req).id, params.sewDayId, 'sewdays:manage');
  const router = Router();

  router.get(
    '/guilds/:guildId/sew-days',
    requireUser,
    route(
      {
        params: guildParamsSchema,
        query: sewDayListQuerySchema,
        authorize: (req, { params }) => authorizeGuild(deps, currentUser(req).id, params.guildId, 'sewdays:read'),
      },
      async ({ params, query, access: membership }, req, res) => {
        const viewer = { userId: currentUser(req).id, canManage: can(membership.role, 'sewdays:manage') };
        res.json(await sewDays.listSewDays(deps, params.guildId, viewer, query));
      },
    ),
  );

  router.post(
    '/guilds/:guildId/sew-days',
    requireUser,
    route(
      {
        params: guildParamsSchema,
        body: sewDayInputSchema,
        authorize: (req, { params }) => authorizeGuild(deps, currentUser(req).id, params.guildId, 'sewdays:manage'),
      },
      async ({ params, body }, req, res) => {
        res.status(201).json(await sewDays.scheduleSewDay(deps, params.guildId, currentUser(req).id, body));
      },
    ),
  );

  router.get(
    '/sew-days/:sewDayId',
    requireUser,
    route({ params: sewDayParamsSchema, authorize: readSewDay }, async ({ params, access: { membership } }, req, res) => {
      res.json(
        await sewDays.getSewDay(deps, params.sewDayId, { userId: currentUser(req).id, canManage: canManageSewDays(membership) }),
      );
    }),
  );

  router.patch(
    '/sew-days/:sewDayId',
    requireUser,
    route(
      { params: sewDayParamsSchema, body: sewDayChangesSchema, authorize: manageSewDay },
      async ({ body, access: { sewDay } }, req, res) => {
        res.json(await sewDays.updateSewDay(deps, sewDay, currentUser(req).id, body));
      },
    ),
  );

  router.post(
    '/sew-days/:sewDayId/cancel',
    requireUser,
    route({ params: sewDayParamsSchema, authorize: manageSewDay }, async ({ access: { sewDay } }, req, res) => {
      res.json(await sewDays.cancelSewDay(deps, sewDay, currentUser(req).id));
    }),
  );

  router.put(
    '/sew-days/:sewDayId/rsvp',
    requireUser,
    route(
      { params: sewDayParamsSchema, body: rsvpInputSchema, authorize: readSewDay },
      async ({ body, access: { sewDay, membership } }, req, res) => {
        res.json(
          await sewDays.answerRsvp(
            deps,
            sewDay,
            { userId: currentUser(req).id, canManage: canManageSewDays(membership) },
            body.answer,
          ),
        );
      },
    ),
  );

  router.get(
    '/sew-days/:sewDayId/calendar.ics',
    requireUser,
    route({ params: sewDayParamsSchema, authorize: readSewDay }, async ({ access: { sewDay } }, _req, res) => {
      const guild = await Guild.findByPk(sewDay.guildId);
      const ics = sewDayIcs(sewDay, { guildName: guild?.name ?? 'Guild', publicUrl: deps.config.PUBLIC_URL });
      res
        .type('text/calendar; charset=utf-8')
        .set('Content-Disposition', `attachment; filename="sew-day-${sewDay.id}.ics"`)
        .set('Cache-Control', 'private, no-store')
        .send(ics);
    }),
  );

  return router;
}
