import { Router } from 'express';
import { type z } from 'zod';
import {
  createGuildSchema, createInvitationSchema, guildParamsSchema, idParam, invitationTokenParams, memberParamsSchema,
  updateGuildSchema, updateMemberSchema,
} from '@shared/schemas/guilds';
import { validate } from '../http/validate';
import { currentUser, requireUser } from '../auth/require-user';
import { authorizeGuild } from './guilds.policy';
import * as guilds from './guilds.service';
import type { AppDeps } from '../deps';

type GuildParams = z.infer<typeof guildParamsSchema>;
type MemberParams = z.infer<typeof memberParamsSchema>;

export function guildsRouter(deps: AppDeps) {
  const router = Router();
  router.use(requireUser);

  router.get('/', async (req, res) => {
    res.json(await guilds.listMyGuilds(currentUser(req).id));
  });

  router.post('/', validate({ body: createGuildSchema }), async (req, res) => {
    res.status(201).json(await guilds.createGuild(currentUser(req).id, req.body));
  });

  router.get('/:guildId', validate({ params: guildParamsSchema }), async (req, res) => {
    const { guildId } = req.params as unknown as GuildParams;
    const membership = await authorizeGuild(currentUser(req).id, guildId, 'guild:read');
    res.json(await guilds.getGuild(guildId, membership.role));
  });

  router.patch(
    '/:guildId',
    validate({ params: guildParamsSchema, body: updateGuildSchema }),
    async (req, res) => {
      const { guildId } = req.params as unknown as GuildParams;
      const membership = await authorizeGuild(currentUser(req).id, guildId, 'guild:update');
      res.json(await guilds.updateGuild(guildId, membership.role, req.body));
    },
  );

  router.get('/:guildId/members', validate({ params: guildParamsSchema }), async (req, res) => {
    const { guildId } = req.params as unknown as GuildParams;
    await authorizeGuild(currentUser(req).id, guildId, 'members:read');
    res.json(await guilds.listMembers(guildId));
  });

  router.patch(
    '/:guildId/members/:userId',
    validate({ params: memberParamsSchema, body: updateMemberSchema }),
    async (req, res) => {
      const { guildId, userId } = req.params as unknown as MemberParams;
      await authorizeGuild(currentUser(req).id, guildId, 'members:manage');
      res.json(await guilds.changeRole(deps, guildId, userId, req.body.role));
    },
  );

  router.delete('/:guildId/members/:userId', validate({ params: memberParamsSchema }), async (req, res) => {
    const { guildId, userId } = req.params as unknown as MemberParams;
    await authorizeGuild(currentUser(req).id, guildId, 'members:manage');
    await guilds.removeMember(deps, guildId, userId);
    res.status(204).end();
  });

  router.get('/:guildId/invitations', validate({ params: guildParamsSchema }), async (req, res) => {
    const { guildId } = req.params as unknown as GuildParams;
    await authorizeGuild(currentUser(req).id, guildId, 'invitations:read');
    res.json(await guilds.listInvitations(guildId));
  });

  router.post(
    '/:guildId/invitations',
    validate({ params: guildParamsSchema, body: createInvitationSchema }),
    async (req, res) => {
      const { guildId } = req.params as unknown as GuildParams;
      const user = currentUser(req);
      const membership = await authorizeGuild(user.id, guildId, 'invitations:create');
      const invitation = await guilds.invite(deps, {
        guildId, inviter: user, inviterRole: membership.role, email: req.body.email, role: req.body.role, open: req.body.open,
      });
      res.status(201).json(invitation);
    },
  );

  router.get('/:guildId/invitations/limits', validate({ params: guildParamsSchema }), async (req, res) => {
    const { guildId } = req.params as unknown as GuildParams;
    const user = currentUser(req);
    await authorizeGuild(user.id, guildId, 'invitations:create');
    res.json(await guilds.invitationLimits(deps, guildId, user.id));
  });

  router.delete(
    '/:guildId/invitations/:invitationId',
    validate({ params: guildParamsSchema.extend({ invitationId: idParam }) }),
    async (req, res) => {
      const { guildId, invitationId } = req.params as unknown as GuildParams & { invitationId: number };
      await authorizeGuild(currentUser(req).id, guildId, 'invitations:create');
      await guilds.revokeInvitation(guildId, invitationId);
      res.status(204).end();
    },
  );

  return router;
}

/** Invitation links: the preview is public (the token is the secret); accepting needs an account. */
export function invitationsRouter(deps: AppDeps) {
  const router = Router();
  router.get('/invitations/:token', validate({ params: invitationTokenParams }), async (req, res) => {
    res.json(await guilds.previewInvitation(String(req.params.token)));
  });
  router.post('/invitations/:token/accept', requireUser, validate({ params: invitationTokenParams }), async (req, res) => {
    res.json(await guilds.acceptInvitation(deps, String(req.params.token), currentUser(req)));
  });
  return router;
}
