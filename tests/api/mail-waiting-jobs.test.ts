/**
 * A burst of events for one subject queues one delayed compose job from this node: the waiting job
 * covers the rest (it composes from the state when it runs). Counted at the queue's door (pg-boss's
 * `send`), with the worker off so nothing runs.
 */
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { startMailJobs, WaitingJobs, type MailJobs } from '../../server/mail/mail-jobs';
import { queues } from '../../server/jobs/queue';

let app: TestApp;
let jobs: MailJobs;

beforeAll(async () => {
  app = await createTestApp({ MAIL_BATCH_DELAY_SECONDS: '60' });
  jobs = await startMailJobs(app.deps, { schedule: false, workers: false });
});
afterAll(async () => {
  await jobs.close();
  await app.close();
});

const actor = { actorId: 1 };
const swapRef = (swapId: number) => ({ swapId, guildId: 1 });

/** A ruler measurement of a maker's block, as the measurement route announces it. */
const measured = (swapId: number, makerId: number, blockId: number, verdict: 'true' | 'short' = 'true') =>
  app.deps.events.emit('block.measured', {
    ...swapRef(swapId),
    ...actor,
    blockId,
    makerId,
    measurementId: blockId,
    verdict,
    source: 'ruler',
  });

/** The compose jobs sent to the queue while `act` runs, as [kind, key fields]. */
async function composeSends(act: () => void, settled: number) {
  const send = vi.spyOn(jobs.boss, 'send');
  try {
    act();
    await expect.poll(() => send.mock.calls.length).toBe(settled);
    await new Promise((resolve) => setTimeout(resolve, 200)); // and no more after
    return send.mock.calls.filter(([name]) => name === queues.compose).map(([, data]) => data);
  } finally {
    send.mockRestore();
  }
}

describe('delayed mail jobs queued from events', () => {
  it('queues one receipt for a maker however many of their blocks are measured meanwhile', async () => {
    const sent = await composeSends(() => {
      for (const blockId of [11, 12, 13]) {
        app.deps.events.emit('block.changed', {
          ...swapRef(501),
          ...actor,
          blockId,
          makerId: 7,
          from: 'received',
          to: 'measured',
        });
        measured(501, 7, blockId);
      }
    }, 1);
    expect(sent).toEqual([{ kind: 'receipt', swapId: 501, userId: 7 }]);

    // Later measurements of the same maker's blocks: still covered by the waiting job.
    const later = await composeSends(() => {
      measured(501, 7, 14, 'short');
      measured(501, 8, 21);
    }, 1);
    // Another maker is another subject.
    expect(later).toEqual([{ kind: 'receipt', swapId: 501, userId: 8 }]);
  });

  it('keeps asking while the waiting job is not its own', async () => {
    // A job for this subject queued elsewhere (another node): its start is unknown here.
    expect(await jobs.enqueue({ kind: 'receipt', swapId: 502, userId: 9 }, 60)).toBeTruthy();
    const sent = await composeSends(() => measured(502, 9, 31), 1);
    const again = await composeSends(() => measured(502, 9, 32), 1);
    expect([...sent, ...again]).toEqual([
      { kind: 'receipt', swapId: 502, userId: 9 },
      { kind: 'receipt', swapId: 502, userId: 9 },
    ]);
  });

  it('sends mail that goes at once every time', async () => {
    const sent = await composeSends(() => {
      app.deps.events.emit('swap.transitioned', { ...swapRef(503), ...actor, from: 'draft', to: 'signup' });
      app.deps.events.emit('swap.transitioned', { ...swapRef(503), ...actor, from: 'draft', to: 'signup' });
    }, 2);
    expect(sent).toEqual([
      { kind: 'announcement', swapId: 503 },
      { kind: 'announcement', swapId: 503 },
    ]);
  });
});

describe('WaitingJobs', () => {
  it('counts on a job until five seconds before it may start, and not after', () => {
    let now = 1_000;
    const waiting = new WaitingJobs(() => now);
    waiting.remember('receipt:1:2', now, 60);
    expect(waiting.covers('receipt:1:2')).toBe(true);
    expect(waiting.covers('receipt:1:3')).toBe(false);
    now += 54_999;
    expect(waiting.covers('receipt:1:2')).toBe(true);
    now += 1;
    expect(waiting.covers('receipt:1:2')).toBe(false);
    // A delay within the margin is never counted on.
    waiting.remember('receipt:1:4', now, 5);
    expect(waiting.covers('receipt:1:4')).toBe(false);
  });
});
