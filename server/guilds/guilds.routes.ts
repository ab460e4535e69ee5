import { Router, type Request } from 'express';
import {
  createGuildSchema,
  createInvitationSchema,
  guildParamsSchema,
  idParam,
  invitationTokenParams,
  memberParamsSchema,
  updateGuildSchema,
  updateMemberSchema,
} from '@shared/schemas/guilds';
import { route } from '../http/route';
import { currentUser, requireUser } from '../auth/require-user';
import { authorizeGuild, type GuildAction } from './guilds.policy';
import * as guilds from './guilds.service';
import type { AppDeps } from '../deps';

const invitationParamsSchema = guildParamsSchema.extend({ invitationId: idParam });

export function guildsRouter(deps: AppDeps) {
  /** Authorises `action` in the guild named by the path, before any body is read. */
  const may =
    (action: GuildAction) =>
    (req: Request, { params }: { params: { guildId: number } }) =>
      authorizeGuild(deps, currentUser(req).id, params.guildId, action);
  const router = Router();
  router.use(requireUser);

  router.get('/', async (req, res) => {
    res.json(await guilds.listMyGuilds(deps, currentUser(req).id));
  });

  router.post(
    '/',
    route({ body: createGuildSchema }, async ({ body }, req, res) => {
      res.status(201).json(await guilds.createGuild(deps, currentUser(req).id, body));
    }),
  );

  router.get(
    '/:guildId',
    route({ params: guildParamsSchema, authorize: may('guild:read') }, async ({ params, access }, _req, res) => {
      res.json(await guilds.getGuild(deps, params.guildId, access.role));
    }),
  );

  router.patch(
    '/:guildId',
    route(
      { params: guildParamsSchema, body: updateGuildSchema, authorize: may('guild:update') },
      async ({ params, body, access }, _req, res) => {
        res.json(await guilds.updateGuild(deps, params.guildId, access.role, body));
      },
    ),
  );

  router.get(
    '/:guildId/members',
    route({ params: guildParamsSchema, authorize: may('members:read') }, async ({ params }, _req, res) => {
      res.json(await guilds.listMembers(deps, params.guildId));
    }),
  );

  router.patch(
    '/:guildId/members/:userId',
    route(
      { params: memberParamsSchema, body: updateMemberSchema, authorize: may('members:manage') },
      async ({ params, body }, _req, res) => {
        res.json(await guilds.changeRole(deps, params.guildId, params.userId, body.role));
      },
    ),
  );

  router.delete(
    '/:guildId/members/:userId',
    route({ params: memberParamsSchema, authorize: may('members:manage') }, async ({ params }, _req, res) => {
      await guilds.removeMember(deps, params.guildId, params.userId);
      res.status(204).end();
    }),
  );

  router.get(
    '/:guildId/invitations',
    route({ params: guildParamsSchema, authorize: may('invitations:read') }, async ({ params }, _req, res) => {
      res.json(await guilds.listInvitations(params.guildId));
    }),
  );

  router.post(
    '/:guildId/invitations',
    route(
      { params: guildParamsSchema, body: createInvitationSchema, authorize: may('invitations:create') },
      async ({ params, body, access }, req, res) => {
        const invitation = await guilds.invite(deps, {
          guildId: params.guildId,
          inviter: currentUser(req),
          inviterRole: access.role,
          email: body.email,
          role: body.role,
          open: body.open,
        });
        res.status(201).json(invitation);
      },
    ),
  );

  router.get(
    '/:guildId/invitations/limits',
    route({ params: guildParamsSchema, authorize: may('invitations:create') }, async ({ params }, req, res) => {
      res.json(await guilds.invitationLimits(deps, params.guildId, currentUser(req).id));
    }),
  );

  router.delete(
    '/:guildId/invitations/:invitationId',
    route({ params: invitationParamsSchema, authorize: may('invitations:create') }, async ({ params }, _req, res) => {
      await guilds.revokeInvitation(params.guildId, params.invitationId);
      res.status(204).end();
    }),
  );

  return router;
}

/** Invitation links: the preview is public (the token is the secret); accepting needs an account. */
export function invitationsRouter(deps: AppDeps) {
  const router = Router();
  router.get(
    '/invitations/:token',
    route({ params: invitationTokenParams }, async ({ params }, _req, res) => {
      res.json(await guilds.previewInvitation(params.token));
    }),
  );
  router.post(
    '/invitations/:token/accept',
    requireUser,
    route({ params: invitationTokenParams }, async ({ params }, req, res) => {
      res.json(await guilds.acceptInvitation(deps, params.token, currentUser(req)));
    }),
  );
  return router;
}
