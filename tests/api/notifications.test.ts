/**
 * The notification routes: a person's mail choices, the one-click unsubscribe link (and why its POST
 * alone needs no CSRF header), choices honoured at the moment of sending, and the guild's message
 * history, which only the guild's admins may read.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles, signedInUser } from '../helpers/factories';
import { mailTo } from '../helpers/maildev';
import { startMailJobs } from '../../server/mail/mail-jobs';
import { recordAndQueue } from '../../server/mail/outbox';
import { unsubscribeToken } from '../../server/mail/unsubscribe-token';
import { MailMessage } from '../../server/db/models';

let app: TestApp;
const SECRET = 'test-secret-test-secret';
beforeAll(async () => {
  app = await createTestApp({ JOBS_POLL_SECONDS: '0.5' });
});
afterAll(() => app.close());

const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe('mail choices', () => {
  it('lists every kind of mail, on by default, and saves changes', async () => {
    const { agent, email } = await signedInUser(app);
    const before = await agent.get('/api/me/mail-preferences').expect(200);
    expect(before.body.email).toBe(email);
    expect(before.body.categories.map((c: { category: string }) => c.category)).toEqual([
      'announcements',
      'signup-confirmations',
      'reminders',
      'receipts',
      'distribution',
      'coordinator-digest',
    ]);
    expect(before.body.categories.every((c: { enabled: boolean; label: string }) => c.enabled && c.label)).toBe(true);

    const after = await agent
      .patch('/api/me/mail-preferences')
      .send({ reminders: false, 'coordinator-digest': false })
      .expect(200);
    const enabled = Object.fromEntries(
      after.body.categories.map((c: { category: string; enabled: boolean }) => [c.category, c.enabled]),
    );
    expect(enabled).toMatchObject({ reminders: false, 'coordinator-digest': false, announcements: true });
    await agent.patch('/api/me/mail-preferences').send({ reminders: true }).expect(200);
    expect((await agent.get('/api/me/mail-preferences').expect(200)).body.categories[2].enabled).toBe(true);
  });

  it('refuses unknown kinds, account mail and empty changes with a clear message', async () => {
    const { agent } = await signedInUser(app);
    const unknown = await agent.patch('/api/me/mail-preferences').send({ account: false }).expect(400);
    expect(unknown.body.error.code).toBe('validation');
    const empty = await agent.patch('/api/me/mail-preferences').send({}).expect(400);
    expect(empty.body.error.message).toMatch(/at least one/);
    const notBool = await agent.patch('/api/me/mail-preferences').send({ reminders: 'no' }).expect(400);
    expect(notBool.body.error.fields.reminders).toBe('Use true or false.');
    await app.agent().get('/api/me/mail-preferences').expect(401);
  });
});

describe('one-click unsubscribe', () => {
  it('opens the confirmation page on GET and changes nothing', async () => {
    const user = await signedInUser(app);
    const token = unsubscribeToken(SECRET, user.id, 'receipts');
    const res = await supertest(app.app).get(`/api/unsubscribe?token=${token}`).expect(303);
    expect(res.headers.location).toBe(`/unsubscribe?token=${token}`);
    const info = await supertest(app.app).get(`/api/unsubscribe/info?token=${token}`).expect(200);
    expect(info.body).toMatchObject({ category: 'receipts', label: 'Block receipts', enabled: true });
    expect(info.body.emailHint).toMatch(/^q•+@example\.test$/);
    expect(JSON.stringify(info.body)).not.toContain(user.email);
  });

  it('switches off exactly that kind for exactly that person on a bare POST, and can be undone', async () => {
    const user = await signedInUser(app);
    const bystander = await signedInUser(app);
    const token = unsubscribeToken(SECRET, user.id, 'announcements');
    await supertest(app.app).post(`/api/unsubscribe?token=${token}`).type('form').send('List-Unsubscribe=One-Click').expect(200);
    const mine = (await user.agent.get('/api/me/mail-preferences').expect(200)).body.categories;
    expect(mine.filter((c: { enabled: boolean }) => !c.enabled).map((c: { category: string }) => c.category)).toEqual([
      'announcements',
    ]);
    const theirs = (await bystander.agent.get('/api/me/mail-preferences').expect(200)).body.categories;
    expect(theirs.every((c: { enabled: boolean }) => c.enabled)).toBe(true);

    // Undo comes from our own page, so it carries the CSRF header like every other change.
    await supertest(app.app).post(`/api/unsubscribe/undo?token=${token}`).expect(403);
    const undone = await app.agent().post(`/api/unsubscribe/undo?token=${token}`).expect(200);
    expect(undone.body.enabled).toBe(true);
  });

  it('refuses altered or truncated tokens, and keeps the CSRF check on every other route', async () => {
    const user = await signedInUser(app);
    const token = unsubscribeToken(SECRET, user.id, 'reminders');
    const other = await signedInUser(app);
    for (const bad of [
      token.replace(`${user.id}.`, `${other.id}.`),
      token.slice(0, -3),
      'nonsense-token',
      unsubscribeToken('a-different-secret-value', user.id, 'reminders'),
    ]) {
      const res = await supertest(app.app)
        .post(`/api/unsubscribe?token=${encodeURIComponent(bad)}`)
        .expect(400);
      expect(res.body.error.message).toMatch(/not valid/);
    }
    await supertest(app.app).post('/api/unsubscribe').expect(400);
    expect((await other.agent.get('/api/me/mail-preferences').expect(200)).body.categories[2].enabled).toBe(true);
    await supertest(app.app).post('/api/auth/logout').expect(403);
    await supertest(app.app).post('/api/unsubscribe/undo').expect(403);
  });

  it('honours a choice made after a message was queued: it is recorded as not sent', async () => {
    const user = await signedInUser(app);
    const producer = await startMailJobs(app.deps, { workers: false, events: false, schedule: false });
    await recordAndQueue(app.deps.pool, producer.boss, [
      {
        key: `test:late-choice:${user.id}`,
        category: 'receipts',
        kind: 'receipt',
        guildId: null,
        swapId: null,
        userId: user.id,
        to: user.email,
        mail: { subject: 'Late choice', text: 'Hello.\n', html: '<p>Hello.</p>' },
      },
    ]);
    await producer.close();
    await user.agent.patch('/api/me/mail-preferences').send({ receipts: false }).expect(200);
    const worker = await startMailJobs(app.deps, { events: false, schedule: false });
    const deadline = Date.now() + 10_000;
    const row = await MailMessage.findOne({ where: { idempotencyKey: `test:late-choice:${user.id}` } });
    while (row!.status === 'queued' && Date.now() < deadline) {
      await pause(200);
      await row!.reload();
    }
    await worker.close();
    expect(row).toMatchObject({ status: 'skipped', statusReason: 'Switched off “Block receipts” in their e-mail choices.' });
    expect(await mailTo(user.email)).toHaveLength(0);
  });
});

describe('message history', () => {
  it('shows the guild admin each message with recipient, status, reason and attempts; filters and searches', async () => {
    const roles = await guildWithRoles(app);
    const producer = await startMailJobs(app.deps, { workers: false, events: false, schedule: false });
    const base = { category: 'reminders' as const, kind: 'due-reminder' as const, guildId: roles.guildId, swapId: null };
    await recordAndQueue(app.deps.pool, producer.boss, [
      {
        ...base,
        key: `test:log:${roles.guildId}:1`,
        userId: roles.member.id,
        to: roles.member.email,
        mail: { subject: 'Blocks due tomorrow', text: 'a', html: 'a' },
      },
      {
        ...base,
        key: `test:log:${roles.guildId}:2`,
        userId: roles.coordinator.id,
        to: roles.coordinator.email,
        mail: { subject: 'Blocks due tomorrow', text: 'b', html: 'b' },
        skipReason: 'Switched off “Deadline reminders” in their e-mail choices.',
      },
      {
        ...base,
        key: `test:log:${roles.stranger.id}:elsewhere`,
        guildId: null,
        userId: roles.stranger.id,
        to: roles.stranger.email,
        mail: { subject: 'Elsewhere', text: 'c', html: 'c' },
      },
    ]);
    await producer.close();

    const log = await roles.admin.agent.get(`/api/guilds/${roles.guildId}/mail-messages`).expect(200);
    expect(log.body.total).toBe(2);
    expect(log.body.counts).toMatchObject({ queued: 1, skipped: 1, sent: 0, failed: 0 });
    const skipped = log.body.messages.find((m: { status: string }) => m.status === 'skipped');
    expect(skipped).toMatchObject({
      category: 'reminders',
      subject: 'Blocks due tomorrow',
      attempts: 0,
      reason: 'Switched off “Deadline reminders” in their e-mail choices.',
      recipient: {
        userId: roles.coordinator.id,
        email: roles.coordinator.email,
        displayName: expect.stringMatching(/^coordinator/),
      },
    });
    expect(JSON.stringify(log.body)).not.toContain(roles.stranger.email);

    const filtered = await roles.admin.agent.get(`/api/guilds/${roles.guildId}/mail-messages?status=queued`).expect(200);
    expect(filtered.body.messages.map((m: { recipient: { email: string } }) => m.recipient.email)).toEqual([roles.member.email]);
    const searched = await roles.admin.agent
      .get(`/api/guilds/${roles.guildId}/mail-messages?q=${encodeURIComponent('coordinator')}`)
      .expect(200);
    expect(searched.body.total).toBe(1);
    const wildcard = await roles.admin.agent.get(`/api/guilds/${roles.guildId}/mail-messages?q=%25`).expect(200);
    expect(wildcard.body.total).toBe(0);
    const bad = await roles.admin.agent.get(`/api/guilds/${roles.guildId}/mail-messages?status=lost`).expect(400);
    expect(bad.body.error.fields.status).toBeDefined();

    const one = await roles.admin.agent.get(`/api/guilds/${roles.guildId}/mail-messages/${skipped.id}`).expect(200);
    expect(one.body.text).toBe('b');
  });

  it('is closed to coordinators, members and other guilds', async () => {
    const roles = await guildWithRoles(app);
    for (const who of [roles.coordinator, roles.member]) {
      const res = await who.agent.get(`/api/guilds/${roles.guildId}/mail-messages`).expect(403);
      expect(res.body.error.code).toBe('forbidden');
    }
    // Someone from another guild cannot tell this guild exists.
    const outsider = await roles.stranger.agent.get(`/api/guilds/${roles.guildId}/mail-messages`).expect(404);
    expect(outsider.body.error.code).toBe('not_found');
    await app.agent().get(`/api/guilds/${roles.guildId}/mail-messages`).expect(401);
    const row = await MailMessage.create({
      idempotencyKey: `test:other-guild:${roles.guildId}`,
      category: 'reminders',
      kind: 'due-reminder',
      guildId: null,
      swapId: null,
      userId: roles.member.id,
      toAddress: roles.member.email,
      subject: 'x',
      textBody: 'x',
      htmlBody: 'x',
    });
    await roles.admin.agent.get(`/api/guilds/${roles.guildId}/mail-messages/${row.id}`).expect(404);
  });
});
