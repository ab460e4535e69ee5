import { randomBytes } from 'node:crypto';
import type supertest from 'supertest';
import type { TestApp } from './test-app';
import type { Role } from '../../shared/schemas/guilds';
import { normaliseEmail } from '../../shared/schemas/auth';
import type { Page } from 'playwright-core';
import { hashPassword } from '../../server/auth/passwords';
import { linkIn, waitForMail } from './maildev';

export const PASSWORD = 'correct-horse-staple';

export function uniqueEmail(prefix = 'quilter') {
  return `${prefix}-${randomBytes(4).toString('hex')}@example.test`;
}

/** A pg pool or client on the app's database. */
export interface Queryable {
  query<R extends object>(text: string, values?: unknown[]): Promise<{ rows: R[] }>;
}

let passwordHash: Promise<string> | null = null;
/** A real argon2id hash of PASSWORD, made once per test file (every test account shares the password). */
export function testPasswordHash() {
  return (passwordHash ??= hashPassword(PASSWORD));
}

/**
 * Writes an account as opening its confirmation link would, straight into the database: sign-up
 * by mail takes a mail job and a mailbox, and has its own tests (tests/api/auth.test.ts walks it).
 * Returns the new account's id.
 */
export async function insertConfirmedAccount(db: Queryable, opts: { email: string; displayName: string }) {
  const { rows } = await db.query<{ id: number }>(
    `INSERT INTO users (email, display_name, password_hash, created_at, updated_at) VALUES ($1, $2, $3, now(), now()) RETURNING id`,
    [normaliseEmail(opts.email), opts.displayName, await testPasswordHash()],
  );
  return rows[0]!.id;
}

/** Signs in through the real sign-in route (the agent keeps the session cookie). */
export async function signIn(agent: ReturnType<typeof supertest.agent>, email: string) {
  await agent.post('/api/auth/login').send({ email, password: PASSWORD }).expect(200);
  return agent;
}

/** A confirmed account, signed in through /api/auth/login; returns its signed-in agent. */
export async function signedInUser(app: TestApp, opts: { email?: string; displayName?: string } = {}) {
  const agent = app.agent();
  const email = opts.email ?? uniqueEmail();
  const id = await insertConfirmedAccount(app.deps.pool, {
    email,
    displayName: opts.displayName ?? `Maker ${email.slice(0, 12)}`,
  });
  await signIn(agent, email);
  return { agent, email, id };
}

/**
 * The confirmation link mailed after a sign-up with `email`. The mail job must run: a server
 * started with JOBS=true, or startMailJobs(app.deps) beside a test app.
 */
export async function confirmLinkFor(email: string) {
  const mail = await waitForMail(email, (m) => /Confirm your address/.test(m.subject), 20_000);
  return linkIn(mail, /https?:\/\/\S+\/confirm-email\?\S+/);
}

/** In the browser, after "Create account": the check-your-inbox screen, the mailed link, and its button. */
export async function finishSignUp(page: Page, email: string) {
  await page.getByRole('heading', { name: 'Check your inbox' }).waitFor();
  await page.goto(await confirmLinkFor(email));
  await page.getByRole('button', { name: 'Confirm and sign in' }).click();
}

/** Server settings for e2e tests that sign up in the browser: the mail job runs, and looks often. */
export const mailJobsOn = { JOBS: 'true', JOBS_POLL_SECONDS: '0.5' } as const;

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
