/**
 * Payments end to end against the local payments fake: the app (listening on a loopback port) creates
 * hosted checkouts through the official SDK, the fake's Pay and Decline buttons are pressed as a member
 * would, and the fake's signed webhooks are the only thing that marks money paid or refunded.
 */
import type { Server } from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import Stripe from 'stripe';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles, joinGuild } from '../helpers/factories';
import { waitForMail } from '../helpers/maildev';
import { freePort } from '../../scripts/lib/ports';
import { signPayload } from '../../scripts/lib/payments-fake';
import { subscribePaymentRefunds } from '../../server/payments/payments.startup';
import { startMailJobs, type MailJobs } from '../../server/mail/mail-jobs';
import { createSwap, move } from './swaps-support';

type Roles = Awaited<ReturnType<typeof guildWithRoles>>;
type Agent = Roles['member']['agent'];

let app: TestApp;
let server: Server;
let roles: Roles;
let jobs: MailJobs;
let webhookSecret: string;
let fakeUrl: string;

const until = async <T>(read: () => Promise<T>, ok: (v: T) => boolean, what: string, ms = 10_000): Promise<T> => {
  const deadline = Date.now() + ms;
  for (;;) {
    const value = await read();
    if (ok(value)) return value;
    if (Date.now() > deadline) throw new Error(`Timed out waiting for ${what}: ${JSON.stringify(value)}`);
    await new Promise((r) => setTimeout(r, 100));
  }
};

/** Presses a button on the fake's checkout page, as the member's browser would. */
async function press(url: string, button: 'pay' | 'decline') {
  const page = await fetch(url);
  expect(await page.text()).toContain('Local test checkout');
  const res = await fetch(`${url}/${button}`, { method: 'POST', redirect: 'manual' });
  expect(res.status).toBe(303);
  return res.headers.get('location')!;
}

const myPayments = async (agent: Agent) =>
  (await agent.get('/api/me/payments').expect(200)).body as {
    id: number;
    kind: string;
    status: string;
    amount: number;
    currency: string;
    swapId?: number;
    refundOnItsWay: boolean;
  }[];

beforeAll(async () => {
  const port = await freePort();
  const fakePort = inject('paymentsPort');
  fakeUrl = `http://127.0.0.1:${fakePort}`;
  // The app's webhook endpoint is registered with the fake the way it would be with the real service.
  const sdk = new Stripe('sk_test_blockpost', { host: '127.0.0.1', port: fakePort, protocol: 'http' });
  const endpoint = await sdk.webhookEndpoints.create({
    url: `http://127.0.0.1:${port}/api/payments/webhook`,
    enabled_events: ['*'],
  });
  webhookSecret = endpoint.secret!;
  app = await createTestApp({
    PUBLIC_URL: `http://127.0.0.1:${port}`,
    STRIPE_SECRET_KEY: 'sk_test_blockpost',
    STRIPE_WEBHOOK_SECRET: webhookSecret,
    STRIPE_API_HOST: '127.0.0.1',
    STRIPE_API_PORT: String(fakePort),
    STRIPE_API_PROTOCOL: 'http',
    JOBS_POLL_SECONDS: '0.5',
  });
  server = await new Promise<Server>((resolve) => {
    const s = app.app.listen(port, '127.0.0.1', () => resolve(s));
  });
  subscribePaymentRefunds(app.deps);
  jobs = await startMailJobs(app.deps, { schedule: false });
  roles = await guildWithRoles(app);
  await roles.admin.agent
    .patch(`/api/guilds/${roles.guildId}`)
    .send({ currency: 'cad', dues: { amount: 2500, year: 2027 } })
    .expect(200);
});

afterAll(async () => {
  await jobs?.close();
  await new Promise((r) => server?.close(r));
  await app?.close();
});

describe('guild dues', () => {
  it('a member pays on the hosted page; only the webhook marks it paid; the treasurer and the CSV agree', async () => {
    const member = await joinGuild(app, roles.guildId, 'member');
    const before = await member.agent.get(`/api/guilds/${roles.guildId}/dues`).expect(200);
    expect(before.body).toMatchObject({ currency: 'cad', dues: { amount: 2500, year: 2027 }, mine: 'owed', enabled: true });
    expect(before.body.members).toBeUndefined();

    const checkout = await member.agent.post(`/api/guilds/${roles.guildId}/dues/checkout`).send({}).expect(200);
    expect(checkout.body.url).toMatch(new RegExp(`^${fakeUrl}/checkout/cs_test_`));
    // Started but not paid: waiting, not paid.
    expect((await myPayments(member.agent))[0]).toMatchObject({ kind: 'dues', status: 'pending', amount: 2500, currency: 'cad' });

    const back = await press(checkout.body.url, 'pay');
    expect(back).toMatch(/\/payments\/return\?session_id=cs_test_/);
    const paid = await until(
      () => myPayments(member.agent),
      (p) => p[0]?.status === 'paid',
      'the dues to be paid',
    );
    expect(paid).toHaveLength(1);
    expect((await member.agent.get(`/api/guilds/${roles.guildId}/dues`).expect(200)).body.mine).toBe('paid');

    const treasurer = await roles.admin.agent.get(`/api/guilds/${roles.guildId}/payments?kind=dues&status=paid`).expect(200);
    const row = treasurer.body.payments.find((p: { userId: number }) => p.userId === member.id);
    expect(row).toMatchObject({ kind: 'dues', status: 'paid', amount: 2500, year: 2027 });
    expect(treasurer.body.totals.byYear.find((y: { year: number }) => y.year === 2027).paid).toBeGreaterThanOrEqual(2500);
    const admins = await roles.admin.agent.get(`/api/guilds/${roles.guildId}/dues`).expect(200);
    expect(admins.body.members.find((m: { userId: number }) => m.userId === member.id).standing).toBe('paid');

    const csv = await roles.admin.agent.get(`/api/guilds/${roles.guildId}/payments?format=csv&kind=dues`).expect(200);
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    const line = csv.text.split('\r\n').find((l) => l.includes(row.displayName));
    expect(line).toContain('25.00');
    expect(line).toContain('CAD');
    expect(line).toContain(',paid,Paid,');

    const receipt = await waitForMail(member.email, (m) => m.subject.startsWith('Receipt:'));
    expect(receipt.subject).toContain('25.00');
    expect(receipt.text).toContain('Guild dues 2027');

    // Paid already: no second checkout.
    const again = await member.agent.post(`/api/guilds/${roles.guildId}/dues/checkout`).send({}).expect(409);
    expect(again.body.error.message).toMatch(/already paid/);
  });

  it('only admins see every payment; members and outsiders are refused', async () => {
    await roles.member.agent.get(`/api/guilds/${roles.guildId}/payments`).expect(403);
    await roles.coordinator.agent.get(`/api/guilds/${roles.guildId}/payments`).expect(403);
    const stranger = await roles.stranger.agent.get(`/api/guilds/${roles.guildId}/dues`);
    expect([403, 404]).toContain(stranger.status);
  });

  it('refuses bad settings with a message a person can act on', async () => {
    const bad = await roles.admin.agent.patch(`/api/guilds/${roles.guildId}`).send({ currency: 'xyz' }).expect(400);
    expect(bad.body.error.fields.currency).toMatch(/three-letter code/);
    const negative = await roles.admin.agent
      .patch(`/api/guilds/${roles.guildId}`)
      .send({ dues: { amount: -5, year: 2027 } })
      .expect(400);
    expect(negative.body.error.message).toMatch(/cannot be negative|more than 0/);
    // Members have paid in cad: the currency stays.
    const change = await roles.admin.agent.patch(`/api/guilds/${roles.guildId}`).send({ currency: 'usd' }).expect(400);
    expect(change.body.error.fields.currency).toMatch(/cannot change/);
    await roles.member.agent.patch(`/api/guilds/${roles.guildId}`).send({ dues: null }).expect(403);
  });
});

describe('swap fees', () => {
  it('charges the entry fee to members who signed up; postage only to those who post blocks', async () => {
    const swap = await createSwap(roles.coordinator.agent, roles.guildId, { fees: { entry: 500, postage: 300 } });
    expect((await roles.coordinator.agent.get(`/api/swaps/${swap.id}`).expect(200)).body.fees).toEqual({
      entry: 500,
      postage: 300,
    });
    await move(roles.coordinator.agent, swap.id, 'signup');
    const before = await roles.member.agent.get(`/api/swaps/${swap.id}/fees`).expect(200);
    expect(before.body.mine).toEqual([
      { kind: 'entry', amount: 500, standing: 'not_owed' },
      { kind: 'postage', amount: 300, standing: 'not_owed' },
    ]);
    const early = await roles.member.agent.post(`/api/swaps/${swap.id}/checkout`).send({}).expect(409);
    expect(early.body.error.message).toMatch(/Sign up/);

    await roles.member.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 2 }).expect(200);
    const owed = await roles.member.agent.get(`/api/swaps/${swap.id}/fees`).expect(200);
    expect(owed.body.mine.map((l: { standing: string }) => l.standing)).toEqual(['owed', 'not_owed']);
    const postage = await roles.member.agent
      .post(`/api/swaps/${swap.id}/checkout`)
      .send({ kinds: ['postage'] })
      .expect(409);
    expect(postage.body.error.message).toMatch(/by post/);

    // A declined card leaves it unpaid (marked as not gone through); paying afterwards counts.
    const checkout = await roles.member.agent.post(`/api/swaps/${swap.id}/checkout`).send({}).expect(200);
    await press(checkout.body.url, 'decline');
    const failed = await until(
      () => roles.member.agent.get(`/api/swaps/${swap.id}/fees`).then((r) => r.body.mine[0].standing as string),
      (s) => s === 'failed',
      'the declined payment',
    );
    expect(failed).toBe('failed');
    await press(checkout.body.url, 'pay');
    await until(
      () => roles.member.agent.get(`/api/swaps/${swap.id}/fees`).then((r) => r.body.mine[0].standing as string),
      (s) => s === 'paid',
      'the entry fee to be paid',
    );
    const officers = await roles.coordinator.agent.get(`/api/swaps/${swap.id}/fees`).expect(200);
    expect(officers.body.members.find((m: { userId: number }) => m.userId === roles.member.id)).toMatchObject({
      entry: 'paid',
      postage: 'not_owed',
    });
    expect(before.body.members).toBeUndefined();
    await roles.member.agent.post(`/api/swaps/${swap.id}/checkout`).send({}).expect(409);

    // Cancelling the swap refunds what was paid; the refund's state comes back by webhook.
    await move(roles.coordinator.agent, swap.id, 'cancelled');
    // Until the webhook says so, the member's list shows the refund on its way (so their page keeps asking).
    const [fee] = (await myPayments(roles.member.agent)).filter((p) => p.swapId === swap.id);
    expect(fee!.refundOnItsWay).toBe(fee!.status === 'paid');
    const refunded = await until(
      () => myPayments(roles.member.agent),
      (p) => p.some((x) => x.swapId === swap.id && x.status === 'refunded'),
      'the refund',
    );
    expect(
      refunded
        .filter((p) => p.swapId === swap.id)
        .map((p) => p.status)
        .sort(),
    ).toEqual(['refunded']);
    expect(refunded.find((p) => p.swapId === swap.id)!.refundOnItsWay).toBe(false);
    await waitForMail(roles.member.email, (m) => m.subject.startsWith('Refund:'));
  });

  it('refunds a member who withdraws before sign-up closes', async () => {
    const maker = await joinGuild(app, roles.guildId, 'member');
    const swap = await createSwap(roles.coordinator.agent, roles.guildId, { fees: { entry: 750 } });
    await move(roles.coordinator.agent, swap.id, 'signup');
    await maker.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 1 }).expect(200);
    const checkout = await maker.agent.post(`/api/swaps/${swap.id}/checkout`).send({}).expect(200);
    await press(checkout.body.url, 'pay');
    await until(
      () => myPayments(maker.agent),
      (p) => p[0]?.status === 'paid',
      'the fee to be paid',
    );
    await maker.agent.delete(`/api/swaps/${swap.id}/signups/me`).expect(204);
    await until(
      () => myPayments(maker.agent),
      (p) => p[0]?.status === 'refunded',
      'the refund',
    );
  });

  it('refuses fees that are not whole amounts of the smallest unit', async () => {
    const res = await roles.coordinator.agent
      .post(`/api/guilds/${roles.guildId}/swaps`)
      .send({ ...(await import('./swaps-support')).swapBody({ fees: { entry: 4.5 } }) })
      .expect(400);
    expect(res.body.error.fields['fees.entry']).toMatch(/no decimals/);
  });
});

describe('the webhook', () => {
  const post = (body: string, signature?: string) => {
    const req = app.agent().post('/api/payments/webhook').set('Content-Type', 'application/json');
    return (signature ? req.set('Stripe-Signature', signature) : req).send(body);
  };
  const event = (type: string, object: unknown, id = `evt_test_${Math.random().toString(36).slice(2)}`) =>
    JSON.stringify({ id, object: 'event', type, created: Math.floor(Date.now() / 1000), livemode: false, data: { object } });

  it('refuses a forged or replayed event with 400 and changes nothing', async () => {
    const maker = await joinGuild(app, roles.guildId, 'member');
    const checkout = await maker.agent.post(`/api/guilds/${roles.guildId}/dues/checkout`).send({}).expect(200);
    const sessionId = checkout.body.url.split('/').pop();
    const body = event('checkout.session.completed', {
      id: sessionId,
      object: 'checkout.session',
      payment_status: 'paid',
      payment_intent: 'pi_test_forged',
    });

    expect((await post(body)).status).toBe(400);
    expect((await post(body, signPayload(body, 'whsec_not_the_secret'))).status).toBe(400);
    // The right secret, an hour too late: a replay.
    const old = await post(body, signPayload(body, webhookSecret, Math.floor(Date.now() / 1000) - 3600));
    expect(old.status).toBe(400);
    expect(old.body.error.message).toMatch(/signature/);
    expect((await myPayments(maker.agent))[0]!.status).toBe('pending');
  });

  it('applies each event once, and an older event never undoes a newer state', async () => {
    const maker = await joinGuild(app, roles.guildId, 'member');
    const checkout = await maker.agent.post(`/api/guilds/${roles.guildId}/dues/checkout`).send({}).expect(200);
    await press(checkout.body.url, 'pay');
    const [payment] = await until(
      () => myPayments(maker.agent),
      (p) => p[0]?.status === 'paid',
      'the dues to be paid',
    );
    const sessionId = checkout.body.url.split('/').pop();

    const refund = event(
      'refund.updated',
      { id: 're_test_x', object: 'refund', status: 'succeeded', metadata: { payment_id: String(payment!.id) } },
      'evt_test_refund_once',
    );
    const first = await post(refund, signPayload(refund, webhookSecret)).expect(200);
    expect(first.body).toMatchObject({ received: true, changed: 1 });
    const repeat = await post(refund, signPayload(refund, webhookSecret)).expect(200);
    expect(repeat.body).toMatchObject({ duplicate: true, changed: 0 });

    const late = event('checkout.session.completed', {
      id: sessionId,
      object: 'checkout.session',
      payment_status: 'paid',
      payment_intent: 'pi_test_late',
    });
    expect((await post(late, signPayload(late, webhookSecret)).expect(200)).body.changed).toBe(0);
    expect((await myPayments(maker.agent))[0]!.status).toBe('refunded');
  });
});

describe('with payments switched off', () => {
  it('answers a clear 503 and shows fees as not payable online', async () => {
    const off = await createTestApp();
    try {
      const r = await guildWithRoles(off);
      await r.admin.agent
        .patch(`/api/guilds/${r.guildId}`)
        .send({ dues: { amount: 1000, year: 2027 } })
        .expect(200);
      const dues = await r.member.agent.get(`/api/guilds/${r.guildId}/dues`).expect(200);
      expect(dues.body.enabled).toBe(false);
      const res = await r.member.agent.post(`/api/guilds/${r.guildId}/dues/checkout`).send({}).expect(503);
      expect(res.body.error).toMatchObject({ code: 'payments_off' });
      expect(res.body.error.message).toMatch(/treasurer/);
    } finally {
      await off.close();
    }
  });
});
