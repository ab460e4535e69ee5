import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { PASSWORD, signedInUser, uniqueEmail } from '../helpers/factories';
import { linkIn, waitForMail } from '../helpers/maildev';

let app: TestApp;
beforeAll(async () => {
  app = await createTestApp({ LOGIN_RATE_LIMIT: '5' });
});
afterAll(() => app.close());

function sessionCookie(res: { headers: Record<string, unknown> }) {
  const cookies = (res.headers['set-cookie'] as string[] | undefined) ?? [];
  return cookies.find((c) => c.startsWith('blockpost.sid='));
}

describe('registration and sign-in', () => {
  it('registers, signs in with a fresh session id, answers /api/me and signs out', async () => {
    const email = uniqueEmail('reg');
    const agent = app.agent();
    const registered = await agent
      .post('/api/auth/register')
      .send({ email, password: PASSWORD, displayName: 'Nell Okafor' })
      .expect(201);
    expect(registered.body.user).toMatchObject({ email, displayName: 'Nell Okafor', units: 'in' });
    expect(registered.body.user.passwordHash).toBeUndefined();
    const cookie = sessionCookie(registered)!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i); // plain http on loopback

    const me = await agent.get('/api/me').expect(200);
    expect(me.body.memberships).toEqual([]);

    await agent.post('/api/auth/logout').expect(204);
    await agent.get('/api/me').expect(401);

    const login = await agent.post('/api/auth/login').send({ email: email.toUpperCase(), password: PASSWORD }).expect(200);
    const newCookie = sessionCookie(login)!;
    expect(newCookie.split(';')[0]).not.toBe(cookie.split(';')[0]);
    await agent.get('/api/me').expect(200);
  });

  it('rotates a session id planted before sign-in', async () => {
    const { email } = await signedInUser(app);
    const agent = app.agent();
    const first = await agent.post('/api/auth/login').send({ email, password: 'wrong-password-1' }).expect(401);
    expect(first.body.error.message).toMatch(/do not match/);
    const ok = await agent.post('/api/auth/login').send({ email, password: PASSWORD }).expect(200);
    const again = await agent.post('/api/auth/login').send({ email, password: PASSWORD }).expect(200);
    expect(sessionCookie(again)!.split(';')[0]).not.toBe(sessionCookie(ok)!.split(';')[0]);
  });

  it('refuses a taken e-mail with 409 and a bad body with field messages', async () => {
    const { email } = await signedInUser(app);
    const taken = await app
      .agent()
      .post('/api/auth/register')
      .send({ email, password: PASSWORD, displayName: 'Again' })
      .expect(409);
    expect(taken.body.error.code).toBe('email_taken');
    const bad = await app.agent().post('/api/auth/register').send({ email: 'not-an-address', password: 'short' }).expect(400);
    expect(bad.body.error.fields).toMatchObject({
      email: expect.stringMatching(/e-mail/),
      password: expect.stringMatching(/10 characters/),
      displayName: expect.any(String),
    });
    expect(JSON.stringify(bad.body)).not.toMatch(/at .*\.ts/);
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
    expect(statuses.slice(0, 5).every((s) => s === 401)).toBe(true);
    expect(statuses.slice(5)).toEqual([429, 429]);
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
