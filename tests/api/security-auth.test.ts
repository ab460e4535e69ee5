/**
 * Accounts under attack: the sign-in limits cannot be dodged with spaces or look-alike forms of an
 * address, one client cannot spray a password over many accounts or open accounts without end,
 * easily guessed passwords are refused everywhere a password is set, a reset request answers
 * before anything is looked up, and a password change signs out every other session.
 */
import { randomInt } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { PASSWORD, uniqueEmail } from '../helpers/factories';

let app: TestApp;
beforeAll(async () => {
  // Behind a trusted proxy, so each test can be its own client (X-Forwarded-For) on one app.
  app = await createTestApp({ TRUST_PROXY: 'true', LOGIN_RATE_LIMIT: '3', LOGIN_IP_RATE_LIMIT: '5', REGISTER_RATE_LIMIT: '3' });
});
afterAll(() => app.close());

/** A browser on its own network address. */
function client(ip = `10.${randomInt(256)}.${randomInt(256)}.${randomInt(1, 255)}`) {
  return app.agent().set('X-Forwarded-For', ip);
}

/** A new account, registered and signed in from a client of its own. */
async function signedInUser(_app?: TestApp) {
  const agent = client();
  const email = uniqueEmail('sec');
  const res = await agent
    .post('/api/auth/register')
    .send({ email, password: PASSWORD, displayName: `Maker ${email.slice(4, 12)}` })
    .expect(201);
  return { agent, email, id: res.body.user.id as number };
}

const weakPasswords = ['          ', 'aaaaaaaaaa', '1234567890', 'password12'];

describe('sign-in limits', () => {
  it('counts every spelling of one address against one quota, and keeps it locked for the right password', async () => {
    const { email } = await signedInUser();
    const [local, domain] = email.split('@') as [string, string];
    const fullWidthAt = `${local}\uFF20${domain}`; // ＠ folds to @ under NFKC
    const variants = [` ${email}`, `${email} `, `\t${email.toUpperCase()}\n`];
    const attacker = '192.0.2.70';
    for (const variant of variants) {
      await client(attacker).post('/api/auth/login').send({ email: variant, password: 'not-the-password' }).expect(401);
    }
    const locked = await client(attacker)
      .post('/api/auth/login')
      .send({ email: fullWidthAt, password: 'not-the-password' })
      .expect(429);
    expect(locked.body.error).toMatchObject({ code: 'rate_limited', message: expect.stringMatching(/Wait 15 minutes/) });
    // The right password, with the address dressed up, does not get round the lock.
    await client(attacker)
      .post('/api/auth/login')
      .send({ email: `${email}  `, password: PASSWORD })
      .expect(429);
    await client(attacker).post('/api/auth/login').send({ email, password: PASSWORD }).expect(429);
  });

  it('signs in with an address typed with spaces, capitals or full-width characters', async () => {
    const { email } = await signedInUser();
    const typed = ` ${email.toUpperCase().replace('@', '\uFF20')} `;
    const res = await client().post('/api/auth/login').send({ email: typed, password: PASSWORD }).expect(200);
    expect(res.body.user.email).toBe(email);
  });

  it('stops one client trying a password across many accounts', async () => {
    const victim = await signedInUser();
    const sprayer = '192.0.2.77';
    for (let i = 0; i < 5; i += 1) {
      await client(sprayer)
        .post('/api/auth/login')
        .send({ email: uniqueEmail(`spray${i}`), password: 'Summer-2027!' })
        .expect(401);
    }
    const refused = await client(sprayer)
      .post('/api/auth/login')
      .send({ email: uniqueEmail('spray-next'), password: 'Summer-2027!' })
      .expect(429);
    expect(refused.body.error.message).toMatch(/Too many failed sign-ins from this network/);
    // Even a right password waits out the lock from this client; others are not affected.
    await client(sprayer).post('/api/auth/login').send({ email: victim.email, password: PASSWORD }).expect(429);
    await client().post('/api/auth/login').send({ email: victim.email, password: PASSWORD }).expect(200);
  });

  it('does not count successful sign-ins towards the spraying limit', async () => {
    // A guild meeting on one network: ten people sign in, more than the limit of failures.
    const people = await Promise.all(Array.from({ length: 10 }, () => signedInUser()));
    const hall = '192.0.2.80';
    for (const { email } of people) await client(hall).post('/api/auth/login').send({ email, password: PASSWORD }).expect(200);
  });

  it('limits new accounts per client', async () => {
    const cafe = '192.0.2.90';
    for (let i = 0; i < 3; i += 1) {
      await client(cafe)
        .post('/api/auth/register')
        .send({ email: uniqueEmail(`cafe${i}`), password: PASSWORD, displayName: `Cafe Maker ${i}` })
        .expect(201);
    }
    const refused = await client(cafe)
      .post('/api/auth/register')
      .send({ email: uniqueEmail('fourth'), password: PASSWORD, displayName: 'Fourth Try' })
      .expect(429);
    expect(refused.body.error).toMatchObject({
      code: 'rate_limited',
      message: 'Too many new accounts from this network. Try again in an hour.',
    });
    await client()
      .post('/api/auth/register')
      .send({ email: uniqueEmail('elsewhere'), password: PASSWORD, displayName: 'Elsewhere' })
      .expect(201);
  });
});

describe('password strength', () => {
  it.each(weakPasswords)('refuses %j on registration with the reason and a tip', async (password) => {
    const email = uniqueEmail('weak');
    const res = await client().post('/api/auth/register').send({ email, password, displayName: 'Wren Weakly' }).expect(400);
    expect(res.body.error.code).toBe('validation');
    expect(res.body.error.fields.password).toMatch(/easy to guess|common|most used/);
    expect(res.body.error.fields.password).toMatch(/Add another word|Leave out|Try four unrelated words/);
    await client().post('/api/auth/login').send({ email, password }).expect(401);
  });

  it('refuses a password made of the person’s own name', async () => {
    const res = await client()
      .post('/api/auth/register')
      .send({ email: uniqueEmail('own'), password: 'wilhelmina', displayName: 'Wilhelmina' })
      .expect(400);
    expect(res.body.error.fields.password).toBeTruthy();
  });

  it('refuses a weak password on reset and keeps the link usable', async () => {
    const { email, id } = await signedInUser();
    const { newToken } = await import('../../server/auth/tokens');
    const { PasswordReset } = await import('../../server/db/models');
    const { token, tokenHash } = newToken();
    await PasswordReset.create({ userId: id, tokenHash, expiresAt: new Date(Date.now() + 600_000) });
    for (const password of weakPasswords) {
      const res = await client().post('/api/auth/reset').send({ token, password }).expect(400);
      expect(res.body.error.fields.password).toBeTruthy();
    }
    await client().post('/api/auth/reset').send({ token, password: 'lantern-thimble-orchard' }).expect(200);
    await client().post('/api/auth/login').send({ email, password: 'lantern-thimble-orchard' }).expect(200);
  });

  it('refuses a weak new password on change, and a wrong current one', async () => {
    const { agent } = await signedInUser();
    for (const newPassword of weakPasswords) {
      const res = await agent.post('/api/me/password').send({ currentPassword: PASSWORD, newPassword }).expect(400);
      expect(res.body.error.fields.newPassword).toBeTruthy();
    }
    const wrong = await agent
      .post('/api/me/password')
      .send({ currentPassword: 'not-my-password', newPassword: 'lantern-thimble-orchard' })
      .expect(400);
    expect(wrong.body.error.fields).toEqual({ currentPassword: 'That is not your current password.' });
  });
});

describe('password change', () => {
  it('changes the password, keeps this session and signs out every other one', async () => {
    const { agent, email } = await signedInUser();
    const elsewhere = client();
    await elsewhere.post('/api/auth/login').send({ email, password: PASSWORD }).expect(200);
    const res = await agent
      .post('/api/me/password')
      .send({ currentPassword: PASSWORD, newPassword: 'copper-lantern-meadow' })
      .expect(200);
    expect(res.body).toEqual({ message: 'Your password is changed.', signedOutElsewhere: 1 });
    await agent.get('/api/me').expect(200);
    await elsewhere.get('/api/me').expect(401);
    await client().post('/api/auth/login').send({ email, password: PASSWORD }).expect(401);
    await client().post('/api/auth/login').send({ email, password: 'copper-lantern-meadow' }).expect(200);
  });
});

describe('reset requests', () => {
  it('answers before looking the address up, so a slow mail server cannot tell accounts apart', async () => {
    const { email } = await signedInUser();
    const mailer = app.deps.mailer as { send: (...args: unknown[]) => Promise<unknown> };
    const send = mailer.send;
    let attempted = 0;
    // A mail server that never answers: the request must not wait for it.
    mailer.send = () => {
      attempted += 1;
      return new Promise(() => undefined);
    };
    try {
      const known = await client().post('/api/auth/reset-request').send({ email }).timeout(3000).expect(202);
      const unknown = await client()
        .post('/api/auth/reset-request')
        .send({ email: uniqueEmail('nobody') })
        .timeout(3000)
        .expect(202);
      expect(known.body).toEqual(unknown.body);
      for (let i = 0; i < 50 && attempted === 0; i += 1) await new Promise((r) => setTimeout(r, 50));
      expect(attempted).toBe(1); // the link still goes out to the real account, after the answer
    } finally {
      mailer.send = send;
    }
  });
});
