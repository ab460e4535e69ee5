import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { IntakeBlockDto } from '../../shared/schemas/intake';
import type { QueueItem } from '../../src/features/intake/offline/intake-db';
import { ApiError } from '../../src/lib/api-client';

// The queue's store on the device, in memory instead of IndexedDB.
const store = vi.hoisted(() => ({ items: [] as QueueItem[], seq: 0 }));
vi.mock('../../src/features/intake/offline/intake-db', () => ({
  queuedItems: async () => store.items.map((i) => ({ ...i })),
  removeItem: async (seq: number) => {
    store.items = store.items.filter((i) => i.seq !== seq);
  },
  updateItem: async (item: QueueItem) => {
    store.items = store.items.map((i) => (i.seq === item.seq ? { ...item } : i));
  },
}));
const server = vi.hoisted(() => ({ receive: vi.fn(), measure: vi.fn() }));
vi.mock('../../src/entities/block/api/receive-block', () => ({ receiveBlock: server.receive }));
vi.mock('../../src/entities/block/api/measure-block', () => ({ measureBlock: server.measure }));

const { retryDelay, startSync, syncState } = await import('../../src/features/intake/offline/sync-queue');
const { pickNewer } = await import('../../src/features/intake/offline/pick-newer');

function queue(kind: 'receive' | 'measure', blockId: number) {
  store.seq += 1;
  store.items.push({
    seq: store.seq,
    clientId: `00000000-0000-4000-8000-00000000000${store.seq}`,
    kind,
    swapId: 7,
    blockId,
    userId: 1,
    ...(kind === 'measure' ? { body: { width: 9.5, height: 9.5 }, localVerdict: 'true' as const } : {}),
    label: `Block ${blockId}`,
    createdAt: '2026-01-01T00:00:00Z',
    attempts: 0,
  });
}

const unreachable = () => new ApiError(0, 'network', 'Blockpost cannot be reached.');
/** Lets the queue's awaited steps run, without moving the clock. */
const settle = () => vi.advanceTimersByTimeAsync(0);

describe('the wait between attempts to reach the server', () => {
  it('doubles from 1 s after each failure and stops growing at a minute', () => {
    expect([0, 1, 2, 3, 4, 5, 6, 7, 12].map((failures) => retryDelay(failures, 0.5))).toEqual([
      1000, 2000, 4000, 8000, 16000, 32000, 60000, 60000, 60000,
    ]);
  });

  it('varies by at most 15 % either way, so devices in one hall do not retry in step', () => {
    expect(retryDelay(2, 0)).toBeCloseTo(4000 * 0.85);
    expect(retryDelay(2, 0.999999)).toBeCloseTo(4000 * 1.15, 0);
  });
});

describe('sending the offline queue', () => {
  let stop: () => void = () => {};

  beforeEach(() => {
    vi.useFakeTimers();
    vi.spyOn(Math, 'random').mockReturnValue(0.5); // no jitter: the waits are exactly 1 s, 2 s, 4 s …
    vi.stubGlobal('window', new EventTarget());
    vi.stubGlobal('navigator', { onLine: true });
    store.items = [];
    store.seq = 0;
    server.receive.mockReset();
    server.measure.mockReset();
  });

  afterEach(() => {
    stop();
    vi.useRealTimers();
    vi.unstubAllGlobals();
    vi.restoreAllMocks();
  });

  it('sends items oldest first, each once, with its own clientId', async () => {
    queue('receive', 11);
    queue('measure', 11);
    server.receive.mockResolvedValue({ id: 11, state: 'received' });
    server.measure.mockResolvedValue({ verdict: 'true', block: { id: 11, state: 'measured' } });
    stop = startSync(1);
    await settle();
    expect(server.receive.mock.calls).toEqual([[11, '00000000-0000-4000-8000-000000000001', { allowUnauthenticated: true }]]);
    expect(server.measure).toHaveBeenCalledWith(
      11,
      { width: 9.5, height: 9.5, source: 'ruler', clientId: '00000000-0000-4000-8000-000000000002' },
      { allowUnauthenticated: true },
    );
    expect(server.receive.mock.invocationCallOrder[0]).toBeLessThan(server.measure.mock.invocationCallOrder[0]!);
    expect(store.items).toEqual([]);
  });

  it('backs off 1 s, 2 s, 4 s while the server cannot be reached, then sends and starts again at 1 s', async () => {
    queue('receive', 11);
    server.receive.mockRejectedValueOnce(unreachable()).mockRejectedValueOnce(unreachable()).mockRejectedValueOnce(unreachable());
    server.receive.mockResolvedValue({ id: 11, state: 'received' });
    stop = startSync(1);
    await settle();
    expect(server.receive).toHaveBeenCalledTimes(1);
    expect(syncState().pause).toBe('retrying');

    for (const [wait, calls] of [
      [1000, 2],
      [2000, 3],
      [4000, 4],
    ] as const) {
      await vi.advanceTimersByTimeAsync(wait - 1);
      expect(server.receive, `just before ${wait} ms`).toHaveBeenCalledTimes(calls - 1);
      await vi.advanceTimersByTimeAsync(1);
      expect(server.receive, `at ${wait} ms`).toHaveBeenCalledTimes(calls);
    }
    expect(store.items).toEqual([]);
    expect(syncState()).toMatchObject({ pause: null, retryAt: null });

    // A new failure after a success waits 1 s again, not 8 s.
    queue('receive', 12);
    server.receive.mockRejectedValueOnce(unreachable()).mockResolvedValue({ id: 12, state: 'received' });
    window.dispatchEvent(new Event('online'));
    await settle();
    await vi.advanceTimersByTimeAsync(1000);
    expect(store.items).toEqual([]);
  });

  it('keeps an item whose attempts failed, counting them', async () => {
    queue('measure', 11);
    server.measure.mockRejectedValue(new ApiError(503, 'unavailable', 'The server is busy.'));
    stop = startSync(1);
    await settle();
    await vi.advanceTimersByTimeAsync(1000);
    expect(store.items).toHaveLength(1);
    expect(store.items[0]).toMatchObject({ attempts: 2 });
    expect(store.items[0]!.failed).toBeUndefined();
  });

  it('sets a refused item aside with the server’s message and goes on with the next', async () => {
    queue('measure', 11);
    queue('receive', 12);
    server.measure.mockRejectedValue(new ApiError(409, 'swap_closed', 'The swap is no longer taking blocks in.'));
    server.receive.mockResolvedValue({ id: 12, state: 'received' });
    stop = startSync(1);
    await settle();
    expect(store.items).toEqual([
      expect.objectContaining({
        blockId: 11,
        failed: { code: 'swap_closed', message: 'The swap is no longer taking blocks in.' },
      }),
    ]);
    expect(server.receive).toHaveBeenCalledTimes(1);
  });

  it('sends again, after the usual wait, a measurement refused only because the block was busy for a moment', async () => {
    queue('measure', 11);
    server.measure
      .mockRejectedValueOnce(
        new ApiError(409, 'block_busy', 'This block changed while it was being measured; send the measurement again.'),
      )
      .mockResolvedValue({ verdict: 'true', block: { id: 11, state: 'measured' } });
    stop = startSync(1);
    await settle();
    expect(store.items).toHaveLength(1);
    expect(store.items[0]!.failed).toBeUndefined();
    await vi.advanceTimersByTimeAsync(1000);
    expect(server.measure).toHaveBeenCalledTimes(2);
    expect(store.items).toEqual([]);
  });

  it('counts "already received" as done: the block was taken in on another device', async () => {
    queue('receive', 11);
    server.receive.mockRejectedValue(new ApiError(409, 'already_received', 'That block was already received.'));
    stop = startSync(1);
    await settle();
    expect(store.items).toEqual([]);
  });

  it('waits while the browser is offline and sends as soon as it is back', async () => {
    vi.stubGlobal('navigator', { onLine: false });
    queue('receive', 11);
    server.receive.mockResolvedValue({ id: 11, state: 'received' });
    stop = startSync(1);
    await settle();
    expect(syncState().pause).toBe('offline');
    expect(server.receive).not.toHaveBeenCalled();
    vi.stubGlobal('navigator', { onLine: true });
    window.dispatchEvent(new Event('online'));
    await settle();
    expect(server.receive).toHaveBeenCalledTimes(1);
    expect(store.items).toEqual([]);
  });

  it('pauses as signed out when the session has lapsed, keeping the item', async () => {
    queue('receive', 11);
    server.receive.mockRejectedValue(new ApiError(401, 'unauthenticated', 'Sign in again.'));
    stop = startSync(1);
    await settle();
    expect(syncState().pause).toBe('signed-out');
    expect(store.items).toHaveLength(1);
  });

  it('sends only the items of the person signed in on this device', async () => {
    queue('receive', 11);
    store.items[0]!.userId = 2;
    stop = startSync(1);
    await settle();
    expect(server.receive).not.toHaveBeenCalled();
    expect(store.items).toHaveLength(1);
  });
});

describe('merging the device’s copy of a block with the server’s (newer wins)', () => {
  const block = (state: IntakeBlockDto['state'], verdict: IntakeBlockDto['verdict'] = null): IntakeBlockDto => ({
    id: 11,
    swapId: 7,
    maker: { id: 3, displayName: 'Ada' },
    ordinal: 1,
    of: 2,
    state,
    verdict,
    shortCode: 'K7QMW3XD',
  });

  it('keeps the device’s state and verdict while its measurement is still queued', () => {
    expect(pickNewer(block('measured', 'short'), block('handed_in'))).toEqual({ state: 'measured', verdict: 'short' });
    expect(pickNewer(block('received'), block('sewn'))).toEqual({ state: 'received', verdict: null });
  });

  it('takes the server’s copy when it is as far along or further', () => {
    expect(pickNewer(block('measured', 'short'), block('measured', 'true'))).toEqual({});
    expect(pickNewer(block('received'), block('returned', 'true'))).toEqual({});
  });
});
