/**
 * The board's pacing of one swap's changes (server/board/change-pacing.ts), on fake timers: at most one
 * change per interval, each event sent once, and under a steady stream with slow reads the changes
 * still go out about one interval apart (reading only once the interval had passed made the gap the
 * interval and a read).
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { paceChanges } from '../../server/board/change-pacing';

const INTERVAL = 50;

/** A swap's queue with events pushed by the test, paced as the board's fan-out paces it. */
function pacedQueue(readMs: number | (() => number)) {
  let queue: number[] | null = null;
  const sent: { at: number; events: number[] }[] = [];
  let running: Promise<void> | null = null;
  const push = (event: number) => {
    if (queue) {
      queue.push(event);
      return;
    }
    queue = [event];
    running = paceChanges(INTERVAL, {
      take: () => {
        const batch = queue!.splice(0);
        return batch.length > 0 ? batch : null;
      },
      read: async (batch) => {
        await new Promise((r) => setTimeout(r, typeof readMs === 'number' ? readMs : readMs()));
        return batch;
      },
      send: (events) => sent.push({ at: performance.now(), events }),
      stopped: () => {
        queue = null;
      },
    });
  };
  return { push, sent, isRunning: () => queue !== null, finished: () => running };
}

const gaps = (sent: { at: number }[]) => sent.slice(1).map((s, i) => s.at - sent[i]!.at);

/** Events 0 … count − 1, one each `everyMs`, then time enough for the pacing to send them all and stop. */
async function stream(board: ReturnType<typeof pacedQueue>, count: number, everyMs: number) {
  for (let event = 0; event < count; event++) {
    board.push(event);
    await vi.advanceTimersByTimeAsync(everyMs);
  }
  await vi.advanceTimersByTimeAsync(500);
}

beforeEach(() => {
  vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout', 'setImmediate', 'performance'] });
});
afterEach(() => {
  vi.useRealTimers();
});

describe('pacing a swap’s board changes', () => {
  it('sends the first change at once, then at most one an interval, every event exactly once', async () => {
    const board = pacedQueue(2);
    await stream(board, 100, 4);

    expect(board.sent[0]!.at).toBeLessThanOrEqual(2 + 1); // the read's time, no interval first
    for (const gap of gaps(board.sent)) expect(gap).toBeGreaterThanOrEqual(INTERVAL);
    expect(board.sent.flatMap((s) => s.events)).toEqual([...Array(100).keys()]);
    expect(board.sent.length).toBeLessThanOrEqual(1 + Math.ceil(400 / INTERVAL) + 1);
    expect(board.isRunning()).toBe(false); // stopped after a quiet interval
  });

  it('reads ahead, so slow reads under a steady stream still send about one change an interval', async () => {
    const board = pacedQueue(30);
    await stream(board, 200, 5);

    const spacing = gaps(board.sent).sort((a, b) => a - b);
    expect(spacing[0]).toBeGreaterThanOrEqual(INTERVAL);
    // Once the reads' time is learned the gap is the interval (and a timer's last millisecond or two);
    // the old rule made it 50 + 30 = 80 ms.
    expect(spacing[Math.floor(spacing.length / 2)]).toBeLessThanOrEqual(INTERVAL + 3);
    expect(board.sent.flatMap((s) => s.events)).toEqual([...Array(200).keys()]);
  });

  it('holds an event that comes just after an early empty take until the interval has passed', async () => {
    // The first read takes 40 ms, so the next batch is taken 20 ms before the interval ends; the next
    // read is quick, so a change taken at once would go out well within the interval.
    const reads = [40, 1];
    const board = pacedQueue(() => reads.shift() ?? 1);
    board.push(1);
    await vi.advanceTimersByTimeAsync(41); // sent at 40 ms; the learned read time is 20 ms
    expect(board.sent).toHaveLength(1);
    await vi.advanceTimersByTimeAsync(30); // 71 ms: the early take (at 70 ms) found nothing
    board.push(2);
    await vi.advanceTimersByTimeAsync(200);

    expect(board.sent.map((s) => s.events)).toEqual([[1], [2]]);
    expect(board.sent[1]!.at - board.sent[0]!.at).toBeGreaterThanOrEqual(INTERVAL);
  });

  it('a read with nothing to send still takes its turn, and the pacing goes on', async () => {
    let reads = 0;
    const queue: number[] = [];
    const sent: { at: number; events: number[] }[] = [];
    const done = paceChanges(INTERVAL, {
      take: () => (queue.length ? queue.splice(0) : null),
      read: async (batch) => (++reads === 1 ? null : batch),
      send: (events) => sent.push({ at: performance.now(), events }),
      stopped: () => undefined,
    });
    queue.push(1);
    await vi.advanceTimersByTimeAsync(1);
    queue.push(2);
    await vi.advanceTimersByTimeAsync(200);
    await done;

    expect(sent.map((s) => s.events)).toEqual([[2]]);
    expect(sent[0]!.at).toBeGreaterThanOrEqual(INTERVAL); // the empty read at 0 ms had its interval
  });

  it('stops when a send throws, so the next change starts a pacing of its own instead of queueing behind it', async () => {
    const queue: number[] = [];
    let stopped = 0;
    const sent: number[][] = [];
    const pace = () =>
      paceChanges(INTERVAL, {
        take: () => (queue.length ? queue.splice(0) : null),
        read: async (batch) => batch,
        send: (events) => {
          if (events.includes(1)) throw new Error('the socket layer failed');
          sent.push(events);
        },
        stopped: () => void stopped++,
      });
    queue.push(1);
    const failed = expect(pace()).rejects.toThrow('the socket layer failed');
    await vi.advanceTimersByTimeAsync(10);
    await failed;
    expect(stopped).toBe(1);

    queue.push(2);
    const next = pace();
    await vi.advanceTimersByTimeAsync(200);
    await next;
    expect(sent).toEqual([[2]]);
    expect(stopped).toBe(2);
  });
});
