/**
 * Swap mail end to end, through the swaps API, with the job worker running and every message read
 * back from the maildev started by the test run: the announcement, the sign-up confirmation with
 * the member's cutting plan, deadline reminders (only to members who still owe blocks), and the
 * one-click unsubscribe stopping a category.
 */
import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles, joinGuild } from '../helpers/factories';
import { mailTo, waitForMail, type CaughtMail } from '../helpers/maildev';
import { startMailJobs, type MailJobs } from '../../server/mail/mail-jobs';
import { MailMessage } from '../../server/db/models';

type Roles = Awaited<ReturnType<typeof guildWithRoles>>;
type Person = Roles['member'];
type Agent = Person['agent'];

const DAY = 86_400_000;
let app: TestApp;
let roles: Roles;
let extra: Person;
let removed: Person;
let jobs: MailJobs;

beforeAll(async () => {
  app = await createTestApp({ JOBS_POLL_SECONDS: '0.5', MAIL_BATCH_DELAY_SECONDS: '1' });
  roles = await guildWithRoles(app);
  await roles.admin.agent.patch(`/api/guilds/${roles.guildId}`).send({ timeZone: 'America/Chicago' }).expect(200);
  extra = await joinGuild(app, roles.guildId, 'member');
  removed = await joinGuild(app, roles.guildId, 'member');
  await roles.admin.agent.delete(`/api/guilds/${roles.guildId}/members/${removed.id}`).expect(204);
  jobs = await startMailJobs(app.deps, { schedule: false });
});
afterAll(async () => {
  await jobs.close();
  await app.close();
});

const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function createSwap(overrides: Record<string, unknown> = {}) {
  const title = `Harvest Stripes ${randomBytes(3).toString('hex')}`;
  const res = await roles.coordinator.agent.post(`/api/guilds/${roles.guildId}/swaps`).send({
    title,
    description: 'Two-colour strip blocks for the spring raffle quilt',
    block: { kind: 'grid', columns: [3.5, 3.5, 3.5], rows: [3.5, 3.5, 3.5], seam: 0.25 },
    tolerance: '1/8',
    colourRules: [
      { role: 'light', note: 'cream to pale gold' },
      { role: 'dark', note: 'indigo' },
    ],
    quota: { min: 1, max: 6 },
    // 10 March 2027 18:00 UTC is 12:00 noon in Chicago (CST, UTC−6, before the 14 March change).
    signupClosesAt: '2027-03-10T18:00:00Z',
    dueAt: '2027-04-20T17:00:00Z',
    ...overrides,
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { id: res.body.id as number, title };
}

async function move(swapId: number, to: string) {
  const res = await roles.coordinator.agent.post(`/api/swaps/${swapId}/transitions`).send({ to });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
}

async function pledge(person: Person, swapId: number, blocks: number) {
  const res = await person.agent.post(`/api/swaps/${swapId}/signups`).send({ blocks });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
}

async function handIn(agent: Agent, swapId: number, count: number) {
  const blocks = (await agent.get(`/api/swaps/${swapId}/blocks?maker=me`).expect(200)).body as { id: number }[];
  for (const b of blocks.slice(0, count))
    await agent.post(`/api/blocks/${b.id}/handed-in`).send({ how: 'in-person' }).expect(200);
}

/** Waits for each intended person's message, then checks nobody got it twice and nobody else got it. */
async function expectOnlyTo(intended: Person[], others: Person[], match: (m: CaughtMail) => boolean): Promise<CaughtMail[]> {
  const got = [];
  for (const p of intended) got.push(await waitForMail(p.email, match, 15_000));
  await pause(1500);
  for (const p of intended) expect((await mailTo(p.email)).filter(match), p.email).toHaveLength(1);
  for (const p of others) expect((await mailTo(p.email)).filter(match), p.email).toHaveLength(0);
  return got;
}

describe('swap announced', () => {
  it('goes once to every active member of the guild, with the spec, the dates in the guild zone and a link', async () => {
    const swap = await createSwap();
    await move(swap.id, 'signup');
    const everyone = [roles.admin, roles.coordinator, roles.member, extra];
    const [mail] = await expectOnlyTo(everyone, [roles.stranger, removed], (m) =>
      m.subject.startsWith(`New swap: ${swap.title}`),
    );
    expect(mail!.subject).toBe(`New swap: ${swap.title} (sign up by Wednesday 10 March 2027)`);
    expect(mail!.text).toContain('Hand it in at: 9½″ × 9½″ unfinished, within ⅛″ either way');
    expect(mail!.text).toContain('Finished size: 9″ × 9″');
    expect(mail!.text).toContain('- light: cream to pale gold');
    expect(mail!.text).toContain('Sign-up closes: Wednesday 10 March 2027 at 12:00 pm');
    expect(mail!.text).toContain('DATES (times in America/Chicago time)');
    expect(mail!.text).toContain(`See the swap and sign up: http://127.0.0.1:3000/guilds/${roles.guildId}/swaps/${swap.id}`);
    expect(mail!.html).toContain('background:#F7F3EA');
    expect(mail!.html).toContain('font-size:18px');
    expect(mail!.html).toContain('background:#2F4B7C');

    // Reopening sign-up later does not announce the swap a second time.
    await pledge(roles.member, swap.id, 2);
    await move(swap.id, 'sewing');
    await move(swap.id, 'signup');
    await pause(2500);
    expect((await mailTo(extra.email)).filter((m) => m.subject.startsWith(`New swap: ${swap.title}`))).toHaveLength(1);
  });
});

describe('sign-up confirmation', () => {
  it('sends the member their own cutting plan for their pledge, and a new one when the pledge changes', async () => {
    const swap = await createSwap();
    await move(swap.id, 'signup');
    await pledge(extra, swap.id, 4);
    const match = (m: CaughtMail) => m.subject.startsWith(`Your cutting plan for ${swap.title}`);
    const [mail] = await expectOnlyTo([extra], [roles.member, roles.coordinator, roles.admin], match);
    expect(mail!.subject).toBe(`Your cutting plan for ${swap.title} (4 blocks)`);
    // 4 blocks × 9 patches = 36 squares cut 3½″; 42″ ÷ 3½″ = 12 per strip, so 3 strips;
    // 3 × 3½″ = 10½″ of fabric = 0.29 yd, rounded up to the next ⅛ yd: ⅜ yd (rounding: common practice, no source).
    expect(mail!.text).toContain('- Any fabric: 36 × 3½″ × 3½″');
    expect(mail!.text).toContain('- Any fabric: ⅜ yd (3 strips 3½″ wide)');
    expect(mail!.text).toMatch(/TAKE CARE: a rotary cutter is very sharp/);
    expect(mail!.html).toContain('<th');

    await pledge(extra, swap.id, 5);
    const second = await waitForMail(extra.email, (m) => m.subject === `Your cutting plan for ${swap.title} (5 blocks)`, 15_000);
    // 45 squares: 4 strips of 12; 4 × 3½″ = 14″ = 0.39 yd → ½ yd.
    expect(second.text).toContain('- Any fabric: ½ yd (4 strips 3½″ wide)');
    // The same pledge again is the same message: nothing new is sent.
    await pledge(extra, swap.id, 5);
    await pause(3000);
    expect((await mailTo(extra.email)).filter(match)).toHaveLength(2);
  });
});

describe('deadline reminders', () => {
  it('go only to members who still owe blocks, say how many, and go once even when two workers sweep together', async () => {
    const owesAll = await joinGuild(app, roles.guildId, 'member');
    const owesSome = await joinGuild(app, roles.guildId, 'member');
    const handedAll = await joinGuild(app, roles.guildId, 'member');
    const swap = await createSwap({
      signupClosesAt: new Date(Date.now() + 5 * DAY).toISOString(),
      dueAt: new Date(Date.now() + 30 * DAY).toISOString(),
    });
    await move(swap.id, 'signup');
    await pledge(owesAll, swap.id, 3);
    await pledge(owesSome, swap.id, 3);
    await pledge(handedAll, swap.id, 2);
    await handIn(owesSome.agent, swap.id, 1);
    await handIn(handedAll.agent, swap.id, 2);

    // Sign-up closes in 5 days, inside the default 7-day window: the sweep sends sign-up reminders now.
    await jobs.sweep();
    const signupMatch = (m: CaughtMail) => m.subject === `Sign-up for ${swap.title} closes in 5 days`;
    const [first, second] = await expectOnlyTo([owesAll, owesSome], [handedAll, roles.member, extra], signupMatch);
    expect(first!.text).toContain('you still owe 3 blocks');
    expect(second!.text).toContain('you still owe 2 blocks');

    // A day before the due date, two workers sweep at the same moment.
    await move(swap.id, 'sewing');
    const other = await startMailJobs(app.deps, { schedule: false, events: false });
    const dayBefore = new Date(Date.now() + 29 * DAY);
    const results = await Promise.all([jobs.sweep(dayBefore), other.sweep(dayBefore), jobs.sweep(dayBefore)]);
    expect(results.reduce((s, r) => s + r.queued, 0)).toBe(2);
    const dueMatch = (m: CaughtMail) => m.subject.endsWith(`still to hand in for ${swap.title}, due tomorrow`);
    const [all, some] = await expectOnlyTo([owesAll, owesSome], [handedAll], dueMatch);
    expect(all!.subject).toBe(`3 blocks still to hand in for ${swap.title}, due tomorrow`);
    expect(some!.text).toContain(
      'You still have 2 blocks to hand in, of the 3 blocks you pledged (1 block already in, thank you).',
    );
    await other.close();

    // Later sweeps within the same window send nothing new.
    await jobs.sweep(new Date(dayBefore.getTime() + 3_600_000));
    await pause(1500);
    expect((await mailTo(owesAll.email)).filter(dueMatch)).toHaveLength(1);
  });
});

describe('unsubscribe', () => {
  it('the one-click link stops reminders for that person only; the message is recorded as not sent', async () => {
    const quits = await joinGuild(app, roles.guildId, 'member');
    const stays = await joinGuild(app, roles.guildId, 'member');
    const swap = await createSwap({
      signupClosesAt: new Date(Date.now() + 3 * DAY).toISOString(),
      dueAt: new Date(Date.now() + 30 * DAY).toISOString(),
    });
    await move(swap.id, 'signup');
    await pledge(quits, swap.id, 2);
    await pledge(stays, swap.id, 2);
    await jobs.sweep();
    const reminder = await waitForMail(quits.email, (m) => m.subject.startsWith(`Sign-up for ${swap.title}`), 15_000);

    const pageLink = reminder.text.match(/http:\/\/127\.0\.0\.1:3000\/unsubscribe\?token=[\w.%-]+/)![0];
    const token = new URL(pageLink).searchParams.get('token')!;
    expect(token).toMatch(new RegExp(`^${quits.id}\\.reminders\\.`));
    // What a mail program does for List-Unsubscribe-Post: a bare POST, no cookie, no CSRF header.
    const oneClick = await supertest(app.app)
      .post(`/api/unsubscribe?token=${encodeURIComponent(token)}`)
      .type('form')
      .send('List-Unsubscribe=One-Click')
      .expect(200);
    expect(oneClick.body).toMatchObject({ category: 'reminders', enabled: false });

    await move(swap.id, 'sewing');
    await jobs.sweep(new Date(Date.now() + 29 * DAY));
    const due = (m: CaughtMail) => m.subject.includes(`still to hand in for ${swap.title}`);
    await expectOnlyTo([stays], [quits], due);
    const skipped = await MailMessage.findOne({ where: { userId: quits.id, swapId: swap.id, kind: 'due-reminder' } });
    expect(skipped).toMatchObject({
      status: 'skipped',
      statusReason: 'Switched off “Deadline reminders” in their e-mail choices.',
    });

    const prefs = await quits.agent.get('/api/me/mail-preferences').expect(200);
    expect(prefs.body.categories.find((c: { category: string }) => c.category === 'reminders').enabled).toBe(false);
    expect(prefs.body.categories.find((c: { category: string }) => c.category === 'announcements').enabled).toBe(true);
  });
});
