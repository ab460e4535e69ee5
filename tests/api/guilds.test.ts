import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles, insertConfirmedAccount, signedInUser, signIn, uniqueEmail } from '../helpers/factories';
import { linkIn, waitForMail } from '../helpers/maildev';

let app: TestApp;
let g: Awaited<ReturnType<typeof guildWithRoles>>;
beforeAll(async () => {
  app = await createTestApp();
  g = await guildWithRoles(app);
});
afterAll(() => app.close());

describe('guilds', () => {
  it('makes the creator admin and lists the guild in /api/me', async () => {
    const { agent } = await signedInUser(app);
    const created = await agent.post('/api/guilds').send({ name: 'Thimble Lane Bee', timeZone: 'Europe/Dublin' }).expect(201);
    expect(created.body).toMatchObject({ name: 'Thimble Lane Bee', myRole: 'admin', memberCount: 1, timeZone: 'Europe/Dublin' });
    const me = await agent.get('/api/me').expect(200);
    expect(me.body.memberships).toEqual([
      { guildId: created.body.id, guildName: 'Thimble Lane Bee', role: 'admin', defaultUnit: 'in' },
    ]);
  });

  it('refuses a guild without a usable name or with an unknown time zone', async () => {
    const res = await g.admin.agent.post('/api/guilds').send({ name: ' ', timeZone: 'Mars/Olympus' }).expect(400);
    expect(res.body.error.fields).toEqual({ name: expect.stringMatching(/name/), timeZone: expect.stringMatching(/time zone/) });
  });

  it('keeps the last admin from leaving or stepping down', async () => {
    const { agent, id } = await signedInUser(app);
    const guild = await agent.post('/api/guilds').send({ name: 'Solo Stitch' }).expect(201);
    const res = await agent.patch(`/api/guilds/${guild.body.id}/members/${id}`).send({ role: 'member' }).expect(409);
    expect(res.body.error.code).toBe('last_admin');
    await agent.delete(`/api/guilds/${guild.body.id}/members/${id}`).expect(409);
  });

  it('lets an admin change a role and remove a member, who then loses access', async () => {
    const extra = await signedInUser(app);
    const { Membership } = await import('../../server/db/models');
    await Membership.create({ guildId: g.guildId, userId: extra.id, role: 'member' });
    const changed = await g.admin.agent
      .patch(`/api/guilds/${g.guildId}/members/${extra.id}`)
      .send({ role: 'coordinator' })
      .expect(200);
    expect(changed.body.role).toBe('coordinator');
    await g.admin.agent.delete(`/api/guilds/${g.guildId}/members/${extra.id}`).expect(204);
    await extra.agent.get(`/api/guilds/${g.guildId}`).expect(404);
  });
});

describe('invitations', () => {
  it('e-mails a link; a new person registers and joins with the invited role', async () => {
    const email = uniqueEmail('invitee');
    const sent = await g.admin.agent
      .post(`/api/guilds/${g.guildId}/invitations`)
      .send({ email, role: 'coordinator' })
      .expect(201);
    expect(sent.body).toMatchObject({ email, role: 'coordinator', acceptedAt: null });

    const mail = await waitForMail(email, (m) => /invitation to a quilt guild/.test(m.subject));
    expect(mail.html).toContain('Accept the invitation');
    const link = linkIn(mail, /http:\/\/127\.0\.0\.1:3000\/invitations\/[\w-]+/);
    const token = link.split('/').pop()!;

    const preview = await app.agent().get(`/api/invitations/${token}`).expect(200);
    expect(preview.body).toMatchObject({ email, role: 'coordinator' });

    const newcomer = app.agent();
    await newcomer.post(`/api/invitations/${token}/accept`).expect(401);
    await insertConfirmedAccount(app.deps.pool, { email, displayName: 'Wren Adeyemi' });
    await signIn(newcomer, email);
    const accepted = await newcomer.post(`/api/invitations/${token}/accept`).expect(200);
    expect(accepted.body).toMatchObject({ guildId: g.guildId, role: 'coordinator' });
    const members = await newcomer.get(`/api/guilds/${g.guildId}/members`).expect(200);
    expect(members.body.find((m: { email: string }) => m.email === email)).toMatchObject({
      role: 'coordinator',
      displayName: 'Wren Adeyemi',
    });

    const again = await newcomer.post(`/api/invitations/${token}/accept`).expect(409);
    expect(again.body.error.message).toMatch(/already accepted/);
  });

  it('lets an existing account accept, and stores only the hash of the token', async () => {
    const existing = await signedInUser(app);
    await g.coordinator.agent.post(`/api/guilds/${g.guildId}/invitations`).send({ email: existing.email }).expect(201);
    const mail = await waitForMail(existing.email);
    const token = linkIn(mail, /\/invitations\/[\w-]+/)
      .split('/')
      .pop()!;
    const { Invitation } = await import('../../server/db/models');
    const rows = await Invitation.findAll({ where: { email: existing.email } });
    expect(rows).toHaveLength(1);
    expect(rows[0]!.tokenHash).not.toContain(token);
    await existing.agent.post(`/api/invitations/${token}/accept`).expect(200);
    await existing.agent.get(`/api/guilds/${g.guildId}`).expect(200);
  });

  it('lets only admins invite officers, and refuses members already in the guild', async () => {
    const res = await g.coordinator.agent
      .post(`/api/guilds/${g.guildId}/invitations`)
      .send({ email: uniqueEmail(), role: 'admin' })
      .expect(403);
    expect(res.body.error.message).toMatch(/Only a guild admin/);
    const dup = await g.admin.agent.post(`/api/guilds/${g.guildId}/invitations`).send({ email: g.member.email }).expect(409);
    expect(dup.body.error.code).toBe('already_member');
  });

  it('refuses an unknown or expired token', async () => {
    await app.agent().get('/api/invitations/this-token-does-not-exist-at-all').expect(404);
    const { Invitation } = await import('../../server/db/models');
    const { newToken } = await import('../../server/auth/tokens');
    const { token, tokenHash } = newToken();
    await Invitation.create({
      guildId: g.guildId,
      email: uniqueEmail(),
      role: 'member',
      tokenHash,
      invitedById: g.admin.id,
      expiresAt: new Date(Date.now() - 1),
    });
    const res = await g.member.agent.post(`/api/invitations/${token}/accept`).expect(400);
    expect(res.body.error.message).toMatch(/expired/);
  });
});

describe('role matrix for guild routes', () => {
  type Who = 'admin' | 'coordinator' | 'member' | 'stranger' | 'signedOut';
  const cases: { name: string; call: (a: ReturnType<TestApp['agent']>) => supertest.Test; expect: Record<Who, number> }[] = [
    {
      name: 'GET guild',
      call: (a) => a.get(`/api/guilds/${g.guildId}`),
      expect: { admin: 200, coordinator: 200, member: 200, stranger: 404, signedOut: 401 },
    },
    {
      name: 'PATCH guild',
      call: (a) => a.patch(`/api/guilds/${g.guildId}`).send({ name: 'Renamed Quilters' }),
      expect: { admin: 200, coordinator: 403, member: 403, stranger: 404, signedOut: 401 },
    },
    {
      name: 'GET members',
      call: (a) => a.get(`/api/guilds/${g.guildId}/members`),
      expect: { admin: 200, coordinator: 200, member: 200, stranger: 404, signedOut: 401 },
    },
    {
      name: 'PATCH member role',
      call: (a) => a.patch(`/api/guilds/${g.guildId}/members/${g.member.id}`).send({ role: 'member' }),
      expect: { admin: 200, coordinator: 403, member: 403, stranger: 404, signedOut: 401 },
    },
    {
      name: 'DELETE member (unknown user)',
      call: (a) => a.delete(`/api/guilds/${g.guildId}/members/999999`),
      expect: { admin: 404, coordinator: 403, member: 403, stranger: 404, signedOut: 401 },
    },
    {
      name: 'GET invitations',
      call: (a) => a.get(`/api/guilds/${g.guildId}/invitations`),
      expect: { admin: 200, coordinator: 200, member: 403, stranger: 404, signedOut: 401 },
    },
    // Who may invite is settled before the body is read: a member or stranger learns nothing from a 400.
    {
      name: 'POST invitation (bad body)',
      call: (a) => a.post(`/api/guilds/${g.guildId}/invitations`).send({ email: 'nope' }),
      expect: { admin: 400, coordinator: 400, member: 403, stranger: 404, signedOut: 401 },
    },
    {
      name: 'DELETE invitation (unknown)',
      call: (a) => a.delete(`/api/guilds/${g.guildId}/invitations/999999`),
      expect: { admin: 404, coordinator: 404, member: 403, stranger: 404, signedOut: 401 },
    },
  ];
  for (const c of cases) {
    it(`${c.name}: each role gets the expected status`, async () => {
      const agents: Record<Who, ReturnType<TestApp['agent']>> = {
        admin: g.admin.agent,
        coordinator: g.coordinator.agent,
        member: g.member.agent,
        stranger: g.stranger.agent,
        signedOut: app.agent(),
      };
      const got: Record<string, number> = {};
      for (const who of Object.keys(c.expect) as Who[]) got[who] = (await c.call(agents[who])).status;
      expect(got).toEqual(c.expect);
    });
  }
});
