/**
 * Mail that never contradicts itself: the coordinator measures, confirms the return at once, and only
 * then does the queue run. Every message is checked when it goes out, and each maker's receipt lands
 * before any return notice. Everything is read back from maildev.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { mailTo, waitForMail, type CaughtMail } from '../helpers/maildev';
import { startMailJobs, type MailJobs } from '../../server/mail/mail-jobs';
import { move, myBlocks, receiveAndMeasure, sewingSwap, type Roles } from './swaps-support';

const HOUR = 3_600_000;

let app: TestApp;
let roles: Roles;
let composer: MailJobs;
let jobs: MailJobs | undefined;

beforeAll(async () => {
  // Batched receipts would wait a minute: in this test only the queue run below sends anything.
  app = await createTestApp({ JOBS_POLL_SECONDS: '0.5', MAIL_BATCH_DELAY_SECONDS: '60' });
  roles = await guildWithRoles(app);
  composer = await startMailJobs(app.deps, { schedule: false, workers: false, events: false });
});
afterAll(async () => {
  await jobs?.close();
  await composer.close();
  await app.close();
});

const arrived = (m: CaughtMail) => new Date((m as unknown as { time: string }).time).getTime();

describe('mail checked at send time', () => {
  it('sends receipts before return notices, drops what no longer applies and rewrites what changed', async () => {
    const title = `Kestrel Star ${Date.now().toString(36)}`;
    // Due tomorrow, so the due reminder applies while the swap is collecting.
    const { swap, makers } = await sewingSwap(app, roles, {
      pledges: [3, 3, 2],
      body: {
        title,
        signupClosesAt: new Date(Date.now() + HOUR).toISOString(),
        dueAt: new Date(Date.now() + 20 * HOUR).toISOString(),
      },
    });
    const [member, coordinator, extra] = makers as [Roles['member'], Roles['coordinator'], Roles['member']];
    await move(roles.coordinator.agent, swap.id, 'collecting');

    // 9½″ ± ⅛″: the member's third block runs short; the coordinator still owes one block.
    const sizes: [typeof member, number[]][] = [
      [member, [9.5, 9.5, 9]],
      [coordinator, [9.5, 9.5]],
      [extra, [9.5, 9.5]],
    ];
    for (const [who, list] of sizes) {
      const blocks = await myBlocks(who.agent, swap.id);
      for (const [i, size] of list.entries())
        await receiveAndMeasure(roles.coordinator.agent, blocks[i]!.id, { width: size, height: size });
    }

    // While collecting, the receipts ask for a replacement and for the owed block, and a due reminder is recorded.
    await composer.compose({ kind: 'receipt', swapId: swap.id, userId: member.id });
    await composer.compose({ kind: 'receipt', swapId: swap.id, userId: coordinator.id });
    const sweep = await composer.sweep();
    expect(sweep.queued).toBeGreaterThanOrEqual(1);
    const recorded = await app.deps.pool.query<{ kind: string; user_id: number; text_body: string }>(
      `SELECT kind, user_id, text_body FROM mail_messages WHERE swap_id = $1 ORDER BY id`,
      [swap.id],
    );
    expect(recorded.rows.find((r) => r.kind === 'receipt' && r.user_id === member.id)!.text_body).toContain('make a replacement');
    expect(recorded.rows.find((r) => r.kind === 'receipt' && r.user_id === coordinator.id)!.text_body).toContain(
      'Still to come from you: 1 block',
    );
    expect(recorded.rows.some((r) => r.kind === 'due-reminder' && r.user_id === coordinator.id)).toBe(true);

    // The return is confirmed at once, before anything went out.
    await move(roles.coordinator.agent, swap.id, 'sorting');
    const plan = (await roles.coordinator.agent.post(`/api/swaps/${swap.id}/distribution/plan`).expect(200)).body as {
      transfers: { from: number; to: number; count: number }[];
    };
    const transfers = plan.transfers.map(({ from, to, count }) => ({ from, to, count }));
    await roles.coordinator.agent.post(`/api/swaps/${swap.id}/distribution/confirm`).send({ transfers }).expect(200);
    await composer.enqueue({ kind: 'distribution', swapId: swap.id });

    // Now the queue runs.
    jobs = await startMailJobs(app.deps, { schedule: false, events: false });
    const isReceipt = (m: CaughtMail) => m.subject.startsWith(`Your blocks for ${title}`);
    const isReturn = (m: CaughtMail) => m.subject.endsWith(`coming back to you: ${title}`);
    for (const who of [member, coordinator, extra]) {
      const notice = await waitForMail(who.email, isReturn, 30_000);
      const receipts = (await mailTo(who.email)).filter(isReceipt);
      expect(receipts, who.email).toHaveLength(1);
      expect(arrived(receipts[0]!), `${who.email}: receipt before return notice`).toBeLessThanOrEqual(arrived(notice));
      for (const m of [...receipts, notice]) {
        expect(m.text).not.toContain('make a replacement');
        expect(m.text).not.toContain('Still to come from you');
      }
    }

    const memberReceipt = (await mailTo(member.email)).find(isReceipt)!;
    expect(memberReceipt.text).toContain('Block 3: ↓ Runs short');
    expect(memberReceipt.text).toContain('It does not take part in the return of blocks');
    expect(memberReceipt.subject).toBe(`Your blocks for ${title} have arrived`);

    // The due reminder was no longer true: recorded as not sent, with the reason, and never delivered.
    expect((await mailTo(coordinator.email)).filter((m) => m.subject.includes('still to hand in'))).toHaveLength(0);
    const after = await app.deps.pool.query<{ kind: string; user_id: number; status: string; status_reason: string | null }>(
      `SELECT kind, user_id, status, status_reason FROM mail_messages WHERE swap_id = $1 ORDER BY id`,
      [swap.id],
    );
    const reminder = after.rows.find((r) => r.kind === 'due-reminder' && r.user_id === coordinator.id)!;
    expect(reminder.status).toBe('skipped');
    expect(reminder.status_reason).toMatch(/no longer applied/);
    expect(after.rows.filter((r) => r.kind === 'receipt').every((r) => r.status === 'sent')).toBe(true);
  });
});
