/**
 * Invitations cannot be turned into a way of sending mail in bulk, and a link works only for the
 * address it was sent to: daily allowances per inviter and per guild, no second invitation while one
 * waits, names kept out of the subject, and accepting bound to the invited address unless an admin
 * made the link open on purpose.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles, joinGuild, signedInUser, uniqueEmail } from '../helpers/factories';
import { linkIn, waitForMail } from '../helpers/maildev';

let app: TestApp;
beforeAll(async () => {
  app = await createTestApp({ INVITES_PER_INVITER_DAY: '3', INVITES_PER_GUILD_DAY: '5' });
});
afterAll(() => app.close());

type Agent = ReturnType<TestApp['agent']>;
const invite = (agent: Agent, guildId: number, body: Record<string, unknown>) =>
  agent.post(`/api/guilds/${guildId}/invitations`).send(body);

async function tokenFor(email: string) {
  const mail = await waitForMail(email, (m) => /invitation/i.test(m.subject));
  return {
    mail,
    token: linkIn(mail, /\/invitations\/[\w-]+/)
      .split('/')
      .pop()!,
  };
}

describe('allowances', () => {
  it('lets one inviter send a few a day, across guilds, and shows what is left', async () => {
    const g = await guildWithRoles(app);
    const limits = await g.coordinator.agent.get(`/api/guilds/${g.guildId}/invitations/limits`).expect(200);
    expect(limits.body).toEqual({
      perInviterDay: 3,
      perGuildDay: 5,
      sentByYouToday: 0,
      sentByGuildToday: 0,
      remaining: 3,
      validDays: 14,
    });
    for (let i = 0; i < 3; i += 1) await invite(g.coordinator.agent, g.guildId, { email: uniqueEmail(`day${i}`) }).expect(201);
    const refused = await invite(g.coordinator.agent, g.guildId, { email: uniqueEmail('fourth') }).expect(429);
    expect(refused.body.error).toMatchObject({
      code: 'invitation_limit',
      message: expect.stringMatching(/You have sent 3 invitations in the last 24 hours/),
    });
    // A second guild of the same person does not reset the count.
    const own = await g.coordinator.agent.post('/api/guilds').send({ name: 'Second Circle' }).expect(201);
    await invite(g.coordinator.agent, own.body.id, { email: uniqueEmail('elsewhere') }).expect(429);
    const after = await g.coordinator.agent.get(`/api/guilds/${g.guildId}/invitations/limits`).expect(200);
    expect(after.body).toMatchObject({ sentByYouToday: 3, sentByGuildToday: 3, remaining: 0 });
  });

  it('caps a guild’s invitations a day whoever sends them', async () => {
    const g = await guildWithRoles(app);
    for (let i = 0; i < 3; i += 1) await invite(g.admin.agent, g.guildId, { email: uniqueEmail(`a${i}`) }).expect(201);
    for (let i = 0; i < 2; i += 1) await invite(g.coordinator.agent, g.guildId, { email: uniqueEmail(`c${i}`) }).expect(201);
    const second = await joinGuild(app, g.guildId, 'coordinator');
    const refused = await invite(second.agent, g.guildId, { email: uniqueEmail('sixth') }).expect(429);
    expect(refused.body.error.message).toMatch(/This guild has sent 5 invitations in the last 24 hours/);
  });

  it('sends no second invitation to an address while one is waiting', async () => {
    const g = await guildWithRoles(app);
    const email = uniqueEmail('twice');
    await invite(g.admin.agent, g.guildId, { email }).expect(201);
    const again = await invite(g.admin.agent, g.guildId, { email: ` ${email.toUpperCase()} ` }).expect(409);
    expect(again.body.error).toMatchObject({
      code: 'invitation_pending',
      message: expect.stringMatching(/already has an invitation waiting/),
    });
    const { Invitation } = await import('../../server/db/models');
    expect(await Invitation.count({ where: { email } })).toBe(1);
  });
});

describe('the e-mail', () => {
  it('keeps the guild’s and inviter’s names out of the subject and quotes them in the text', async () => {
    const admin = await signedInUser(app, { displayName: 'Cheap Pills Here' });
    const guild = await admin.agent.post('/api/guilds').send({ name: 'WIN A PRIZE: visit example.invalid now' }).expect(201);
    const email = uniqueEmail('spam');
    await invite(admin.agent, guild.body.id, { email }).expect(201);
    const { mail } = await tokenFor(email);
    expect(mail.subject).toBe('An invitation to a quilt guild on Blockpost');
    expect(mail.text).toContain('“Cheap Pills Here”');
    expect(mail.text).toContain('“WIN A PRIZE: visit example.invalid now”');
  });
});

describe('accepting', () => {
  it('is for the account with the invited address only', async () => {
    const g = await guildWithRoles(app);
    const invitee = await signedInUser(app);
    const someoneElse = await signedInUser(app);
    const sent = await invite(g.admin.agent, g.guildId, { email: invitee.email }).expect(201);
    expect(sent.body.open).toBe(false);
    const { token } = await tokenFor(invitee.email);
    const refused = await someoneElse.agent.post(`/api/invitations/${token}/accept`).expect(403);
    expect(refused.body.error).toMatchObject({
      code: 'invitation_other_address',
      message: expect.stringContaining(invitee.email),
    });
    await someoneElse.agent.get(`/api/guilds/${g.guildId}`).expect(404);
    await invitee.agent.post(`/api/invitations/${token}/accept`).expect(200);
  });

  it('is for anyone with the link when an admin made it open, and says so', async () => {
    const g = await guildWithRoles(app);
    const email = uniqueEmail('open');
    const coordinatorTry = await invite(g.coordinator.agent, g.guildId, { email, open: true }).expect(403);
    expect(coordinatorTry.body.error.message).toMatch(/Only a guild admin can make an open link/);
    const sent = await invite(g.admin.agent, g.guildId, { email, open: true }).expect(201);
    expect(sent.body.open).toBe(true);
    const { token } = await tokenFor(email);
    const preview = await app.agent().get(`/api/invitations/${token}`).expect(200);
    expect(preview.body.open).toBe(true);
    const anyone = await signedInUser(app);
    await anyone.agent.post(`/api/invitations/${token}/accept`).expect(200);
    await anyone.agent.get(`/api/guilds/${g.guildId}`).expect(200);
  });
});
