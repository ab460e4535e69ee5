import { randomBytes } from 'node:crypto';
import type { TestApp } from './test-app';
import type { Role } from '../../shared/schemas/guilds';

export const PASSWORD = 'correct-horse-staple';

export function uniqueEmail(prefix = 'quilter') {
  return `${prefix}-${randomBytes(4).toString('hex')}@example.test`;
}

/** Registers a new account and returns its signed-in agent. */
export async function signedInUser(app: TestApp, opts: { email?: string; displayName?: string } = {}) {
  const agent = app.agent();
  const email = opts.email ?? uniqueEmail();
  const res = await agent
    .post('/api/auth/register')
    .send({ email, password: PASSWORD, displayName: opts.displayName ?? `Maker ${email.slice(0, 12)}` })
    .expect(201);
  return { agent, email, id: res.body.user.id as number };
}

/** A guild with one account per role, plus a stranger who belongs to another guild. */
export async function guildWithRoles(app: TestApp) {
  const admin = await signedInUser(app, { displayName: 'Ada Admin' });
  const guild = await admin.agent
    .post('/api/guilds')
    .send({ name: `Lantern Street Quilters ${randomBytes(2).toString('hex')}` })
    .expect(201);
  const guildId = guild.body.id as number;
  const coordinator = await joinGuild(app, guildId, 'coordinator');
  const member = await joinGuild(app, guildId, 'member');
  const stranger = await signedInUser(app, { displayName: 'Sam Stranger' });
  await stranger.agent.post('/api/guilds').send({ name: 'Elsewhere Stitchers' }).expect(201);
  return { guildId, admin, coordinator, member, stranger };
}

/** Adds a new account to the guild directly (the invitation flow has its own tests). */
export async function joinGuild(app: TestApp, guildId: number, role: Role) {
  const user = await signedInUser(app, { displayName: `${role} ${randomBytes(2).toString('hex')}` });
  const { Membership } = await import('../../server/db/models');
  await Membership.create({ guildId, userId: user.id, role });
  return user;
}
