/**
 * The second half of a swap's mail, end to end through the swaps API with maildev: the receipt
 * notice (batched, and surviving a worker restart), the distribution notice to each recipient, and
 * the coordinators' weekly digest.
 */
import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles, joinGuild } from '../helpers/factories';
import { mailTo, waitForMail, type CaughtMail } from '../helpers/maildev';
import { startMailJobs, type MailJobs } from '../../server/mail/mail-jobs';

type Roles = Awaited<ReturnType<typeof guildWithRoles>>;
type Person = Roles['member'];

let app: TestApp;
let roles: Roles;
let extra: Person;
let jobs: MailJobs;
let swap: { id: number; title: string };
let transfers: { from: number; to: number; count: number }[];

beforeAll(async () => {
  app = await createTestApp({ JOBS_POLL_SECONDS: '0.5', MAIL_BATCH_DELAY_SECONDS: '3' });
  roles = await guildWithRoles(app);
  extra = await joinGuild(app, roles.guildId, 'member');
  jobs = await startMailJobs(app.deps, { schedule: false });
});
afterAll(async () => {
  await jobs.close();
  await app.close();
});

const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function post(agent: Person['agent'], url: string, body: object = {}) {
  const res = await agent.post(url).send(body);
  expect(res.status, `${url} ${JSON.stringify(res.body)}`).toBeLessThan(300);
  return res.body;
}

async function blocksOf(person: Person) {
  return (await person.agent.get(`/api/swaps/${swap.id}/blocks?maker=me`).expect(200)).body as { id: number; sequence: number }[];
}

async function measure(blockId: number, size: number) {
  await post(roles.coordinator.agent, `/api/blocks/${blockId}/received`);
  await post(roles.coordinator.agent, `/api/blocks/${blockId}/measurements`, { width: size, height: size });
}

async function expectOnlyTo(intended: Person[], others: Person[], match: (m: CaughtMail) => boolean): Promise<CaughtMail[]> {
  const got = [];
  for (const p of intended) got.push(await waitForMail(p.email, match, 20_000));
  await pause(1500);
  for (const p of intended) expect((await mailTo(p.email)).filter(match), p.email).toHaveLength(1);
  for (const p of others) expect((await mailTo(p.email)).filter(match), p.email).toHaveLength(0);
  return got;
}

describe('receipt notice', () => {
  it('lists each block with its verdict in words and what to do, once, even across a worker restart', async () => {
    const title = `Lantern Nine-Patch ${randomBytes(3).toString('hex')}`;
    const created = await post(roles.coordinator.agent, `/api/guilds/${roles.guildId}/swaps`, {
      title,
      block: { kind: 'grid', columns: [3.5, 3.5, 3.5], rows: [3.5, 3.5, 3.5], seam: 0.25 },
      tolerance: '1/8',
      quota: { min: 1, max: 6 },
      signupClosesAt: new Date(Date.now() + 10 * 86_400_000).toISOString(),
      dueAt: new Date(Date.now() + 40 * 86_400_000).toISOString(),
    });
    swap = { id: created.id, title };
    await post(roles.coordinator.agent, `/api/swaps/${swap.id}/transitions`, { to: 'signup' });
    await post(roles.member.agent, `/api/swaps/${swap.id}/signups`, { blocks: 3 });
    await post(extra.agent, `/api/swaps/${swap.id}/signups`, { blocks: 2 });
    await post(roles.coordinator.agent, `/api/swaps/${swap.id}/signups`, { blocks: 2 });
    await post(roles.coordinator.agent, `/api/swaps/${swap.id}/transitions`, { to: 'sewing' });
    await post(roles.coordinator.agent, `/api/swaps/${swap.id}/transitions`, { to: 'collecting' });

    // 9½″ is the unfinished target (± ⅛″): 9½″ true, 10″ trim, 9″ short.
    const mine = await blocksOf(roles.member);
    await measure(mine[0]!.id, 9.5);
    await measure(mine[1]!.id, 10);
    await measure(mine[2]!.id, 9);
    // The worker stops before the batched notice is due; a new one takes over.
    await jobs.close();
    jobs = await startMailJobs(app.deps, { schedule: false });

    const match = (m: CaughtMail) => m.subject.startsWith(`Your blocks for ${swap.title}`);
    const [mail] = await expectOnlyTo([roles.member], [extra, roles.coordinator, roles.admin], match);
    expect(mail!.subject).toBe(`Your blocks for ${swap.title}: 2 blocks need a look`);
    expect(mail!.text).toContain('Your coordinator has 3 blocks of yours');
    expect(mail!.text).toContain('Block 1: ✓ True to size');
    expect(mail!.text).toContain('Block 2: ✂ Trim to size (measured 10″ × 10″, should be 9½″ × 9½″)');
    expect(mail!.text).toContain('It is a little larger than 9½″ × 9½″, so it can be trimmed down and still counts.');
    expect(mail!.text).toContain('Block 3: ↓ Runs short (measured 9″ × 9″, should be 9½″ × 9½″)');
    expect(mail!.text).toContain('make a replacement');
    expect(mail!.text).toMatch(/TAKE CARE when you trim or press/);
    expect(mail!.html).toContain('✂ Trim to size');
  });

  it('sends a new notice when there is news, and none when there is not', async () => {
    for (const b of await blocksOf(extra)) await measure(b.id, 9.5);
    const extraMail = await waitForMail(extra.email, (m) => m.subject === `Your blocks for ${swap.title} have arrived`, 20_000);
    expect(extraMail.text).toContain('Block 2: ✓ True to size');
    expect(extraMail.text).not.toContain('TAKE CARE');
    // A repeated ruler measurement with the same verdict is no news.
    await post(roles.coordinator.agent, `/api/blocks/${(await blocksOf(extra))[0]!.id}/measurements`, {
      width: 9.5,
      height: 9.5,
    });
    await pause(5000);
    expect((await mailTo(extra.email)).filter((m) => m.subject.startsWith(`Your blocks for ${swap.title}`))).toHaveLength(1);
  });
});

describe('distribution notice', () => {
  it('tells each recipient how many blocks come back and from how many makers', async () => {
    for (const b of await blocksOf(roles.coordinator)) await measure(b.id, 9.5);
    const trim = (await blocksOf(roles.member))[1]!;
    await post(roles.coordinator.agent, `/api/blocks/${trim.id}/trimmed`);
    await post(roles.coordinator.agent, `/api/swaps/${swap.id}/transitions`, { to: 'sorting' });
    const plan = await post(roles.coordinator.agent, `/api/swaps/${swap.id}/distribution/plan`);
    transfers = (plan.transfers as { from: number; to: number; count: number }[]).map(({ from, to, count }) => ({
      from,
      to,
      count,
    }));
    await post(roles.coordinator.agent, `/api/swaps/${swap.id}/distribution/confirm`, { transfers });

    const recipients = [roles.member, extra, roles.coordinator];
    const match = (m: CaughtMail) => m.subject.endsWith(`coming back to you: ${swap.title}`);
    const mails = await expectOnlyTo(recipients, [roles.admin], match);
    for (const [i, person] of recipients.entries()) {
      const mine = transfers.filter((t) => t.to === person.id);
      const count = mine.reduce((s, t) => s + t.count, 0);
      const makers = new Set(mine.map((t) => t.from)).size;
      expect(mails[i]!.subject).toBe(
        `${count} block${count === 1 ? '' : 's'} from ${makers} maker${makers === 1 ? '' : 's'} coming back to you: ${swap.title}`,
      );
      expect(mine.every((t) => t.from !== person.id)).toBe(true);
    }
  });
});

describe('weekly digest for coordinators', () => {
  it('goes once per officer of the guild, with the week’s changes, even when two workers run it', async () => {
    const other = await startMailJobs(app.deps, { schedule: false, events: false, workers: false });
    const now = new Date(Date.now() + 60_000);
    await Promise.all([jobs.digest(now), other.digest(now)]);
    await other.close();
    const match = (m: CaughtMail) => m.subject.endsWith(': your swaps this week');
    const [mail] = await expectOnlyTo([roles.admin, roles.coordinator], [roles.member, extra], match);
    expect(mail!.text).toContain(swap.title);
    expect(mail!.text).toContain('3 new sign-ups (7 blocks pledged).');
    expect(mail!.text).toContain('7 blocks received.');
    // Current verdicts of the blocks measured this week: 5 true, 1 trim (trimmed), 1 short.
    expect(mail!.text).toContain('7 blocks measured: 5 true to size, 1 trim to size, 1 runs short.');
    expect(mail!.text).toMatch(/Moved from Sewing to Collecting on \w+day \d+ \w+ \d{4}\./);
    expect(mail!.text).toContain(`${transfers.reduce((s, t) => s + t.count, 0)} blocks shared out to their new homes.`);
  });
});
