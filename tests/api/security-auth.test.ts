/**
 * Accounts under attack: the sign-in limits cannot be dodged with spaces or look-alike forms of an
 * address, one client cannot spray a password over many accounts or open accounts without end,
 * easily guessed passwords are refused everywhere a password is set, a sign-up and a reset request
 * answer alike before anything is looked up (the mail job looks the address up), and a password
 * change signs out every other session.
 */
import { randomInt } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { insertConfirmedAccount, PASSWORD, uniqueEmail } from '../helpers/factories';
import { waitForMail } from '../helpers/maildev';
import { startMailJobs, type MailJobs } from '../../server/mail/mail-jobs';
import { User } from '../../server/db/models';

let app: TestApp;
let jobs: MailJobs;
beforeAll(async () => {
  // Behind a trusted proxy, so each test can be its own client (X-Forwarded-For) on one app.
  app = await createTestApp({
    TRUST_PROXY: 'true',
    LOGIN_RATE_LIMIT: '3',
    LOGIN_IP_RATE_LIMIT: '5',
    REGISTER_RATE_LIMIT: '3',
    JOBS_POLL_SECONDS: '0.5',
  });
  jobs = await startMailJobs(app.deps, { schedule: false });
});
afterAll(async () => {
  await jobs.close();
  await app.close();
});

/** A browser on its own network address. */
function client(ip = `10.${randomInt(256)}.${randomInt(256)}.${randomInt(1, 255)}`) {
  return app.agent().set('X-Forwarded-For', ip);
}

/** A confirmed account, signed in from a client of its own. */
async function signedInUser(_app?: TestApp) {
  const agent = client();
  const email = uniqueEmail('sec');
  const id = await insertConfirmedAccount(app.deps.pool, { email, displayName: `Maker ${email.slice(4, 12)}` });
  await agent.post('/api/auth/login').send({ email, password: PASSWORD }).expect(200);
  return { agent, email, id };
}

/**
 * A mail server slower than the requests' 3-second timeout: a request that waited for it would fail.
 * Counts the messages tried, by recipient.
 */
function slowMailServer(slowFor: string[], delayMs = 3500) {
  const mailer = app.deps.mailer;
  const send = mailer.send;
  const tried: string[] = [];
  // Only the addresses under test wait: mail left queued by earlier tests goes at once, so it cannot
  // hold the single mail worker past the test's time.
  mailer.send = (mail) => {
    tried.push(mail.to);
    if (!slowFor.includes(mail.to)) return send.call(mailer, mail);
    return new Promise((resolve) => setTimeout(() => resolve({ messageId: 'slow' }), delayMs));
  };
  return {
    tried,
    /** Waits until a message to each of `addresses` was tried (mail left over from other tests may come first). */
    async until(addresses: string[]) {
      for (let i = 0; i < 300 && !addresses.every((a) => tried.includes(a)); i += 1) await new Promise((r) => setTimeout(r, 50));
    },
    restore() {
      mailer.send = send;
    },
  };
}

/** Calls of User's finders made from request code (server/auth), not from the mail job. */
function userLookupsFromRequests() {
  const finders = ['findOne', 'findAll', 'findByPk', 'count'] as const;
  const saved = finders.map((name) => [name, User[name]] as const);
  const seen: string[] = [];
  for (const [name, original] of saved) {
    (User as unknown as Record<string, unknown>)[name] = function (this: unknown, ...args: unknown[]) {
      const stack = new Error().stack ?? '';
      if (/server\/auth\//.test(stack)) seen.push(name);
      return (original as (...a: unknown[]) => unknown).apply(this, args);
    };
  }
  return {
    seen,
    restore: () => {
      for (const [name, original] of saved) (User as unknown as Record<string, unknown>)[name] = original;
    },
  };
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
        .expect(202);
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
      .expect(202);
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

describe('who has an account does not leak', () => {
  it('answers a sign-up with a taken address exactly as a new one, before looking either up', async () => {
    const { email } = await signedInUser();
    const fresh = uniqueEmail('fresh');
    const mailServer = slowMailServer([email, fresh]);
    const lookups = userLookupsFromRequests();
    try {
      const send = (address: string) =>
        client()
          .post('/api/auth/register')
          .send({ email: address, password: 'thimble-orchard-lantern', displayName: 'Quinn Query' })
          .timeout(3000);
      const taken = await send(email);
      const unused = await send(fresh);
      expect(taken.status).toBe(202);
      expect(unused.status).toBe(taken.status);
      expect(unused.body).toEqual(taken.body);
      expect(lookups.seen).toEqual([]); // the request never asks whether the address has an account
      await mailServer.until([email, fresh]); // both mails are tried by the job, after the answers
      expect(mailServer.tried).toEqual(expect.arrayContaining([email, fresh]));
    } finally {
      lookups.restore();
      mailServer.restore();
    }
    expect(await User.count({ where: { email } })).toBe(1);
    expect(await User.count({ where: { email: fresh } })).toBe(0); // not until the link is opened
  });

  it('tells the owner, and never makes a second account, however often the address is tried', async () => {
    const { email } = await signedInUser();
    for (const spelling of [email, email.toUpperCase(), ` ${email} `]) {
      await client()
        .post('/api/auth/register')
        .send({ email: spelling, password: 'copper-lantern-meadow', displayName: 'Copy Cat' })
        .expect(202);
    }
    await waitForMail(email, (m) => /Someone tried to sign up with your address/.test(m.subject));
    expect(await User.count({ where: { email } })).toBe(1);
    await client().post('/api/auth/login').send({ email, password: 'copper-lantern-meadow' }).expect(401);
  });

  it('refuses a confirmation link that is unknown with 400 and words to act on', async () => {
    const res = await client()
      .post('/api/auth/confirm-email')
      .send({ token: 'A'.repeat(43) })
      .expect(400);
    expect(res.body.error.message).toMatch(/Sign in, or sign up again/);
  });
});

describe('reset requests', () => {
  it('answers before looking the address up, so a slow mail server cannot tell accounts apart', async () => {
    const { email } = await signedInUser();
    const nobody = uniqueEmail('nobody');
    const mailServer = slowMailServer([email, nobody]);
    const lookups = userLookupsFromRequests();
    try {
      const known = await client().post('/api/auth/reset-request').send({ email }).timeout(3000).expect(202);
      const unknown = await client().post('/api/auth/reset-request').send({ email: nobody }).timeout(3000).expect(202);
      expect(known.body).toEqual(unknown.body);
      expect(lookups.seen).toEqual([]);
      await mailServer.until([email]); // the link still goes out to the real account, from the job
      expect(mailServer.tried).toContain(email);
      expect(mailServer.tried).not.toContain(nobody);
    } finally {
      lookups.restore();
      mailServer.restore();
    }
  });
});
