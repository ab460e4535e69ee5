/**
 * Sends queued intake actions to the server one at a time, oldest first. A dropped connection or a
 * busy server leaves the item queued and tries again later (at once when the browser says it is back
 * online, otherwise after 1, 2, 4 … 60 s); each item carries its clientId, so a resend after a lost
 * answer records nothing twice. A refusal (4xx) sets the item aside with the server's message.
 */
import { ApiError } from '@/lib/api-client';
import type { BlockDto } from '@shared/swap-types';
import { measureBlock, type MeasurementAnswer } from '@/entities/block/api/measure-block';
import { receiveBlock } from '@/entities/block/api/receive-block';
import { queuedItems, removeItem, updateItem, type QueueItem } from './intake-db';

export type SentEvent =
  { item: QueueItem; kind: 'receive'; answer: BlockDto | null } | { item: QueueItem; kind: 'measure'; answer: MeasurementAnswer };

export type SyncPause = null | 'offline' | 'retrying' | 'signed-out';

interface SyncState {
  running: boolean;
  pause: SyncPause;
  /** when the next attempt is due, while retrying */
  retryAt: number | null;
}

const MAX_DELAY_MS = 60_000;
const events = new EventTarget();
let state: SyncState = { running: false, pause: null, retryAt: null };
let userId: number | null = null;
let failures = 0;
let timer: ReturnType<typeof setTimeout> | undefined;
let again = false;

function setState(next: Partial<SyncState>) {
  state = { ...state, ...next };
  events.dispatchEvent(new Event('change'));
}

export const syncState = () => state;

/** Subscribes to queue changes (items added, sent, set aside) and to the sync state. */
export function onQueueChange(listener: () => void): () => void {
  events.addEventListener('change', listener);
  return () => events.removeEventListener('change', listener);
}

export function onSent(listener: (event: SentEvent) => void): () => void {
  const handler = (e: Event) => listener((e as CustomEvent<SentEvent>).detail);
  events.addEventListener('sent', handler);
  return () => events.removeEventListener('sent', handler);
}

export const notifyQueueChanged = () => events.dispatchEvent(new Event('change'));

/**
 * Conflicts that clear by themselves: the block changed while this measurement was being written, or
 * the same request is being answered right now. The item is sent again after the usual wait.
 */
const BUSY_FOR_A_MOMENT = new Set(['block_busy', 'client_id_busy']);

type Outcome = { ok: true; event: SentEvent } | { ok: false; retry: boolean; signedOut?: boolean; code: string; message: string };

// A lapsed session is reported to the queue instead of leaving the page.
const fromQueue = { allowUnauthenticated: true };

async function send(item: QueueItem): Promise<Outcome> {
  try {
    if (item.kind === 'receive')
      return { ok: true, event: { item, kind: 'receive', answer: await receiveBlock(item.blockId, item.clientId, fromQueue) } };
    return {
      ok: true,
      event: {
        item,
        kind: 'measure',
        answer: await measureBlock(item.blockId, { ...item.body!, source: 'ruler', clientId: item.clientId }, fromQueue),
      },
    };
  } catch (error) {
    if (!(error instanceof ApiError)) return { ok: false, retry: true, code: 'client', message: String(error) };
    // Already past "received" (measured before, perhaps on another device): nothing left to do.
    if (item.kind === 'receive' && error.code === 'already_received')
      return { ok: true, event: { item, kind: 'receive', answer: null } };
    if (error.status === 401) return { ok: false, retry: true, signedOut: true, code: error.code, message: error.message };
    const transient =
      error.status === 0 ||
      error.status === 408 ||
      error.status === 429 ||
      error.status >= 500 ||
      BUSY_FOR_A_MOMENT.has(error.code);
    return { ok: false, retry: transient, code: error.code, message: error.message };
  }
}

/**
 * The wait before the next attempt after `failures` failed ones in a row: 1 s, 2 s, 4 s … at most a
 * minute, give or take 15 % (`random` in [0, 1)) so several devices do not knock together.
 */
export const retryDelay = (failures: number, random: number) =>
  Math.min(MAX_DELAY_MS, 1000 * 2 ** Math.min(failures, 6)) * (0.85 + random * 0.3);

function scheduleRetry() {
  clearTimeout(timer);
  const delay = retryDelay(failures, Math.random());
  failures += 1;
  setState({ retryAt: Date.now() + delay });
  timer = setTimeout(() => void flushQueue(), delay);
}

async function drain(): Promise<void> {
  for (;;) {
    const next = (await queuedItems()).find((i) => !i.failed && i.userId === userId);
    if (!next) {
      failures = 0;
      setState({ pause: null, retryAt: null });
      return;
    }
    if (!navigator.onLine) {
      setState({ pause: 'offline', retryAt: null });
      return;
    }
    const outcome = await send(next);
    if (outcome.ok) {
      await removeItem(next.seq!);
      failures = 0;
      setState({ pause: null, retryAt: null });
      events.dispatchEvent(new CustomEvent<SentEvent>('sent', { detail: outcome.event }));
      continue;
    }
    if (outcome.retry) {
      await updateItem({ ...next, attempts: next.attempts + 1 });
      setState({ pause: outcome.signedOut ? 'signed-out' : navigator.onLine ? 'retrying' : 'offline' });
      scheduleRetry();
      return;
    }
    await updateItem({ ...next, attempts: next.attempts + 1, failed: { code: outcome.code, message: outcome.message } });
    notifyQueueChanged();
  }
}

/**
 * Sends what is queued for the signed-in person. Runs once at a time (across tabs too, where the
 * browser has Web Locks); a call while running makes the running pass look again when it ends.
 */
export async function flushQueue(): Promise<void> {
  if (userId === null) return;
  if (state.running) {
    again = true;
    return;
  }
  clearTimeout(timer);
  setState({ running: true });
  try {
    do {
      again = false;
      if (navigator.locks) await navigator.locks.request('blockpost-intake-sync', drain);
      else await drain();
    } while (again);
  } finally {
    setState({ running: false });
  }
}

let holders = 0;
let stopListening: (() => void) | null = null;

/**
 * Starts syncing for this person: now, whenever the browser comes back online, and on retries.
 * Both the app shell (so a queue left from a hall without Wi-Fi goes out from any page) and the
 * intake view hold it; syncing stops when the last of them lets go.
 */
export function startSync(forUserId: number): () => void {
  userId = forUserId;
  holders += 1;
  if (!stopListening) {
    const online = () => {
      failures = 0;
      void flushQueue();
    };
    const offline = () => setState({ pause: 'offline', retryAt: null });
    window.addEventListener('online', online);
    window.addEventListener('offline', offline);
    stopListening = () => {
      window.removeEventListener('online', online);
      window.removeEventListener('offline', offline);
      clearTimeout(timer);
      stopListening = null;
    };
  }
  void flushQueue();
  let released = false;
  return () => {
    if (released) return;
    released = true;
    holders -= 1;
    if (holders > 0) return;
    stopListening?.();
    userId = null;
  };
}

/** Puts a set-aside item back in line (after the cause is fixed), or drops it. */
export async function retryItem(item: QueueItem): Promise<void> {
  await updateItem({ ...item, failed: undefined });
  notifyQueueChanged();
  void flushQueue();
}

export async function discardItem(item: QueueItem): Promise<void> {
  await removeItem(item.seq!);
  notifyQueueChanged();
}
