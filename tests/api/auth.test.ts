import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { PASSWORD, signedInUser, testPasswordHash, uniqueEmail } from '../helpers/factories';
import { linkIn, mailTo, waitForMail } from '../helpers/maildev';
import { startMailJobs, type MailJobs } from '../../server/mail/mail-jobs';

let app: TestApp;
let jobs: MailJobs;
beforeAll(async () => {
  app = await createTestApp({ LOGIN_RATE_LIMIT: '5', JOBS_POLL_SECONDS: '0.5' });
  // The mail worker as a node with JOBS=true runs it: account mail is looked up and sent there.
  jobs = await startMailJobs(app.deps, { schedule: false });
});
afterAll(async () => {
  await jobs.close();
  await app.close();
});

function sessionCookie(res: { headers: Record<string, unknown> }) {
  const cookies = (res.headers['set-cookie'] as string[] | undefined) ?? [];
  return cookies.find((c) => c.startsWith('blockpost.sid='));
}

const confirmLink = /http:\/\/127\.0\.0\.1:3000\/confirm-email\?\S+/;

/** The token in the confirmation link mailed to `email`. */
async function mailedToken(email: string) {
  const mail = await waitForMail(email, (m) => /Confirm your address/.test(m.subject));
  return { mail, url: new URL(linkIn(mail, confirmLink)) };
}

async function pendingFor(email: string) {
  const { PendingSignup } = await import('../../server/db/models');
  return PendingSignup.findAll({ where: { email } });
}

describe('sign-up by mail', () => {
  it('mails a link, makes the account only when it is opened, and signs in with a fresh session id', async () => {
    const email = uniqueEmail('reg');
    const agent = app.agent();
    const asked = await agent
      .post('/api/auth/register')
      .send({ email: ` ${email.toUpperCase()} `, password: PASSWORD, displayName: 'Nell Okafor', next: '/invitations/abc-123' })
      .expect(202);
    expect(asked.body).toEqual({ message: expect.stringMatching(/^Check your inbox/) });
    expect(sessionCookie(asked)).toBeUndefined();
    await agent.get('/api/me').expect(401);
    await app.agent().post('/api/auth/login').send({ email, password: PASSWORD }).expect(401);

    const { mail, url } = await mailedToken(email);
    expect(mail.html).toContain('Confirm my address');
    expect(mail.text).not.toContain('Nell Okafor'); // what the form said never reaches the address's owner
    expect(url.searchParams.get('next')).toBe('/invitations/abc-123');
    const token = url.searchParams.get('token')!;

    // Only hashes are kept: the password's and the token's; the queued job holds neither secret.
    const [pending] = await pendingFor(email);
    expect(pending!.passwordHash).toMatch(/^\$argon2id\$/);
    expect(pending!.tokenHash).toMatch(/^[0-9a-f]{64}$/);
    expect(pending!.tokenHash).not.toBe(token);
    const jobsData = await app.deps.pool.query<{ data: string }>(`SELECT data::text FROM pgboss.job WHERE name = 'mail-compose'`);
    expect(jobsData.rows.some((r) => r.data.includes(PASSWORD) || r.data.includes(token))).toBe(false);

    const confirmed = await agent.post('/api/auth/confirm-email').send({ token }).expect(201);
    expect(confirmed.body.user).toMatchObject({ email, displayName: 'Nell Okafor', units: 'in' });
    expect(confirmed.body.memberships).toEqual([]);
    expect(confirmed.body.user.passwordHash).toBeUndefined();
    const cookie = sessionCookie(confirmed)!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i); // plain http on loopback
    expect(await pendingFor(email)).toEqual([]);

    await agent.get('/api/me').expect(200);
    await agent.post('/api/auth/logout').expect(204);
    await agent.get('/api/me').expect(401);
    const login = await agent.post('/api/auth/login').send({ email: email.toUpperCase(), password: PASSWORD }).expect(200);
    expect(sessionCookie(login)!.split(';')[0]).not.toBe(cookie.split(';')[0]);
    await agent.get('/api/me').expect(200);
  });

  it('answers an address with an account exactly as a new one; the owner is told and no second account is made', async () => {
    const owner = await signedInUser(app, { displayName: 'Orla Owner' });
    const fresh = uniqueEmail('fresh');
    const send = (email: string) =>
      app.agent().post('/api/auth/register').send({ email, password: 'thimble-orchard-lantern', displayName: 'Someone Else' });
    const [taken, unused] = [await send(owner.email), await send(fresh)];
    expect(taken.status).toBe(202);
    expect(unused.status).toBe(202);
    expect(taken.body).toEqual(unused.body);
    expect(Object.keys(taken.headers).sort()).toEqual(Object.keys(unused.headers).sort());

    const told = await waitForMail(owner.email, (m) => /Someone tried to sign up/.test(m.subject));
    expect(told.text).toContain('Hello Orla Owner');
    expect(told.text).toContain('http://127.0.0.1:3000/sign-in');
    expect(told.text).toContain('http://127.0.0.1:3000/forgot-password');
    expect(told.text).not.toMatch(/confirm-email|token=/);
    expect(told.text).not.toContain('Someone Else');
    await waitForMail(fresh, (m) => /Confirm your address/.test(m.subject));

    const { User } = await import('../../server/db/models');
    expect(await User.count({ where: { email: owner.email } })).toBe(1);
    expect(await pendingFor(owner.email)).toEqual([]); // the attempt and its password hash are gone
    await app.agent().post('/api/auth/login').send({ email: owner.email, password: PASSWORD }).expect(200);
    await app.agent().post('/api/auth/login').send({ email: owner.email, password: 'thimble-orchard-lantern' }).expect(401);
    expect((await mailTo(owner.email)).filter((m) => /Confirm your address/.test(m.subject))).toEqual([]);
  });

  it('refuses a link that is unknown, used or expired with words to act on, and an address taken meanwhile with 409', async () => {
    const unknown = await app
      .agent()
      .post('/api/auth/confirm-email')
      .send({ token: 'x'.repeat(43) })
      .expect(400);
    expect(unknown.body.error.message).toMatch(/already used or is not one of ours\. Sign in, or sign up again/);
    const short = await app.agent().post('/api/auth/confirm-email').send({ token: 'abc' }).expect(400);
    expect(short.body.error.fields.token).toMatch(/incomplete/);

    const email = uniqueEmail('twice');
    await app.agent().post('/api/auth/register').send({ email, password: PASSWORD, displayName: 'Tess Twice' }).expect(202);
    const token = (await mailedToken(email)).url.searchParams.get('token')!;
    await app.agent().post('/api/auth/confirm-email').send({ token }).expect(201);
    const used = await app.agent().post('/api/auth/confirm-email').send({ token }).expect(400);
    expect(used.body.error.message).toMatch(/already used/);

    const { PendingSignup } = await import('../../server/db/models');
    const { newToken } = await import('../../server/auth/tokens');
    const { hashPassword } = await import('../../server/auth/passwords');
    const pendingWith = async (address: string, expiresAt: Date) => {
      const t = newToken();
      const row = { email: address, displayName: 'Late Comer', passwordHash: await hashPassword(PASSWORD), nextPath: null };
      await PendingSignup.create({ ...row, tokenHash: t.tokenHash, expiresAt, mailedAt: new Date() });
      return t.token;
    };
    const expired = await app
      .agent()
      .post('/api/auth/confirm-email')
      .send({ token: await pendingWith(uniqueEmail('late'), new Date(Date.now() - 1000)) })
      .expect(400);
    expect(expired.body.error.message).toMatch(/expired \(links work for 24 hours\)\. Sign up again/);

    const owner = await signedInUser(app);
    const raced = await app
      .agent()
      .post('/api/auth/confirm-email')
      .send({ token: await pendingWith(owner.email, new Date(Date.now() + 600_000)) })
      .expect(409);
    expect(raced.body.error).toMatchObject({
      code: 'email_taken',
      message: expect.stringMatching(/already has an account\. Sign in/),
    });
    expect(await pendingFor(owner.email)).toEqual([]);
  });

  it('mails a sign-up whose job was lost at the next sweep, and deletes expired ones with their password hash', async () => {
    const { PendingSignup } = await import('../../server/db/models');
    const row = async (email: string, expiresInMs: number) =>
      PendingSignup.create({
        email,
        displayName: 'Lou Lost',
        passwordHash: await testPasswordHash(),
        nextPath: null,
        expiresAt: new Date(Date.now() + expiresInMs),
      });
    // Made on a node without the job worker, say: no job was queued for it.
    const lost = await row(uniqueEmail('lost'), 3_600_000);
    const expired = await row(uniqueEmail('expired'), -1000);
    await app.deps.pool.query(`UPDATE pending_signups SET created_at = now() - interval '10 minutes' WHERE id = $1`, [lost.id]);

    const swept = await jobs.sweep();
    expect(swept.requeued).toBeGreaterThanOrEqual(1);
    await mailedToken(lost.email);
    expect(await PendingSignup.findByPk(expired.id)).toBeNull();
  });

  it('refuses a bad body with field messages, and a return path to another site', async () => {
    const bad = await app.agent().post('/api/auth/register').send({ email: 'not-an-address', password: 'short' }).expect(400);
    expect(bad.body.error.fields).toMatchObject({
      email: expect.stringMatching(/e-mail/),
      password: expect.stringMatching(/10 characters/),
      displayName: expect.any(String),
    });
    expect(JSON.stringify(bad.body)).not.toMatch(/at .*\.ts/);
    for (const next of ['//evil.test/x', '/\\evil.test', 'https://evil.test/']) {
      const res = await app
        .agent()
        .post('/api/auth/register')
        .send({ email: uniqueEmail('next'), password: PASSWORD, displayName: 'Nia Next', next })
        .expect(400);
      expect(res.body.error.fields.next).toMatch(/page of this site/);
    }
  });
});

describe('sign-in', () => {
  it('rotates a session id planted before sign-in', async () => {
    const { email } = await signedInUser(app);
    const agent = app.agent();
    const first = await agent.post('/api/auth/login').send({ email, password: 'wrong-password-1' }).expect(401);
    expect(first.body.error.message).toMatch(/do not match/);
    const ok = await agent.post('/api/auth/login').send({ email, password: PASSWORD }).expect(200);
    const again = await agent.post('/api/auth/login').send({ email, password: PASSWORD }).expect(200);
    expect(sessionCookie(again)!.split(';')[0]).not.toBe(sessionCookie(ok)!.split(';')[0]);
  });

  it('answers malformed JSON with 400, not a stack trace', async () => {
    const res = await app.agent().post('/api/auth/login').set('Content-Type', 'application/json').send('{"email":').expect(400);
    expect(res.body.error).toEqual({ code: 'bad_json', message: expect.any(String) });
  });

  it('refuses a state-changing request without the CSRF header', async () => {
    const res = await (
      await import('supertest')
    )
      .default(app.app)
      .post('/api/auth/login')
      .send({ email: 'a@b.test', password: 'x' })
      .expect(403);
    expect(res.body.error.message).toMatch(/X-Requested-With/);
  });

  it('rate-limits repeated failed sign-ins for one address', async () => {
    const { email } = await signedInUser(app);
    const agent = app.agent();
    const statuses: number[] = [];
    for (let i = 0; i < 7; i++)
      statuses.push((await agent.post('/api/auth/login').send({ email, password: `nope-${i}-xxxxx` })).status);
    // Five tries per address and client, the factory's own sign-in counting as the first.
    expect(statuses.slice(0, 4).every((s) => s === 401)).toBe(true);
    expect(statuses.slice(4)).toEqual([429, 429, 429]);
  });
});

describe('password reset', () => {
  it('mails a single-use link that sets a new password and signs out other sessions', async () => {
    const { email, agent: oldSession } = await signedInUser(app);
    const anon = app.agent();
    await anon.post('/api/auth/reset-request').send({ email }).expect(202);
    const unknown = await anon
      .post('/api/auth/reset-request')
      .send({ email: uniqueEmail('nobody') })
      .expect(202);
    expect(unknown.body.message).toMatch(/If that address has an account/);

    const mail = await waitForMail(email, (m) => /Reset your Blockpost password/.test(m.subject));
    const link = linkIn(mail, /http:\/\/127\.0\.0\.1:3000\/reset-password\?token=[\w-]+/);
    const token = new URL(link).searchParams.get('token')!;

    const { PasswordReset } = await import('../../server/db/models');
    const stored = await PasswordReset.findAll();
    expect(stored.some((r) => r.tokenHash === token)).toBe(false); // only the hash is kept

    await anon.post('/api/auth/reset').send({ token, password: 'a-brand-new-pass' }).expect(200);
    const reused = await anon.post('/api/auth/reset').send({ token, password: 'another-new-pass' }).expect(400);
    expect(reused.body.error.message).toMatch(/expired or was already used/);
    await oldSession.get('/api/me').expect(401);
    await anon.post('/api/auth/login').send({ email, password: PASSWORD }).expect(401);
    await anon.post('/api/auth/login').send({ email, password: 'a-brand-new-pass' }).expect(200);
  });

  it('refuses an expired token', async () => {
    const { email, id } = await signedInUser(app);
    const { PasswordReset } = await import('../../server/db/models');
    const { newToken } = await import('../../server/auth/tokens');
    const { token, tokenHash } = newToken();
    await PasswordReset.create({ userId: id, tokenHash, expiresAt: new Date(Date.now() - 1000) });
    await app.agent().post('/api/auth/reset').send({ token, password: 'a-brand-new-pass' }).expect(400);
    await app.agent().post('/api/auth/login').send({ email, password: PASSWORD }).expect(200);
  });
});

describe('profile', () => {
  it('updates the name, units and private mailing address, and refuses unknown fields', async () => {
    const { agent } = await signedInUser(app);
    const res = await agent
      .patch('/api/me')
      .send({ displayName: 'Maud Ellery', units: 'mm', mailingAddress: '9 Tansy Court' })
      .expect(200);
    expect(res.body.user).toMatchObject({ displayName: 'Maud Ellery', units: 'mm', mailingAddress: '9 Tansy Court' });
    const bad = await agent.patch('/api/me').send({ units: 'cubits', isAdmin: true }).expect(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(expect.arrayContaining(['units']));
    expect((await agent.get('/api/me')).body.user.units).toBe('mm');
  });
});

describe('health', () => {
  it('reports the database up', async () => {
    const res = await app.agent().get('/api/health').expect(200);
    expect(res.body).toEqual({ ok: true, db: 'up' });
  });
});
