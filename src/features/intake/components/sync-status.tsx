import { VERDICT_LABELS } from '@shared/vocabulary';
import { Button } from '@/components/ui/button';
import type { QueueView } from '../hooks/use-intake-queue';
import { discardItem, flushQueue, retryItem } from '../offline/sync-queue';

const LISTED = 6;

/** 24-hour time in the guild's zone, as every other screen shows it (the device's clock may differ). */
const clock = (iso: string, timeZone?: string) =>
  new Intl.DateTimeFormat('en-GB', {
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
    ...(timeZone ? { timeZone } : {}),
  }).format(new Date(iso));

function stateLine(queue: QueueView, online: boolean): string {
  if (queue.waiting.length === 0)
    return online
      ? 'Everything taken in so far has reached Blockpost.'
      : 'Nothing waiting. New scans and measurements are kept on this device.';
  if (!online || queue.state.pause === 'offline')
    return 'No connection: kept on this device, sent in order when the connection returns.';
  if (queue.state.pause === 'signed-out') return 'Your sign-in has lapsed. Sign in again in another tab; nothing here is lost.';
  if (queue.state.running) return 'Sending…';
  if (queue.state.pause === 'retrying') return 'Blockpost did not answer; trying again shortly.';
  return 'Sending shortly…';
}

/** How many blocks wait to reach the server, why, and what the server refused. */
export function SyncStatus({
  queue,
  online,
  keptAt,
  fromDevice,
  timeZone,
}: {
  queue: QueueView;
  online: boolean;
  keptAt: string;
  fromDevice: boolean;
  /** the guild's zone, once known */
  timeZone?: string;
}) {
  const waiting = queue.waitingBlocks;
  return (
    <section
      aria-label="Sync"
      className={`rounded-card border-2 p-4 ${waiting > 0 ? 'border-weld bg-weld/8' : 'border-lichen bg-lichen/8'}`}
    >
      <div className="flex flex-wrap items-center justify-between gap-3">
        <div>
          <p className="text-xl font-bold" role="status" data-testid="sync-count">
            {waiting > 0 ? (
              <>
                <span aria-hidden="true" className="mr-2 inline-block h-3 w-3 animate-pulse rounded-full bg-weld-deep" />
                Waiting to sync: {waiting}
              </>
            ) : (
              <>
                <span aria-hidden="true">✓ </span>
                All synced
              </>
            )}
          </p>
          <p className="text-base">{stateLine(queue, online)}</p>
          <p className="text-base text-walnut-soft">
            {online ? 'Online' : 'Offline'} · swap data kept on this device at {clock(keptAt, timeZone)}
            {fromDevice && ' (the server could not be reached when this page opened)'}
          </p>
        </div>
        {waiting > 0 && online && (
          <Button variant="secondary" onClick={() => void flushQueue()}>
            Send now
          </Button>
        )}
      </div>
      {queue.waiting.length > 0 && (
        <ul className="mt-2 space-y-0.5 text-base" aria-label="Waiting to sync">
          {queue.waiting.slice(0, LISTED).map((item) => (
            <li key={item.seq}>
              {item.label}:{' '}
              {item.kind === 'receive' ? 'received' : `measured (${VERDICT_LABELS[item.localVerdict!].label} on this device)`}
            </li>
          ))}
          {queue.waiting.length > LISTED && <li>… and {queue.waiting.length - LISTED} more, in the order taken</li>}
        </ul>
      )}
      {queue.failed.length > 0 && (
        <div role="alert" className="mt-3 rounded-lg border-l-4 border-madder bg-madder/8 p-3">
          <p className="font-semibold text-madder-deep">
            Blockpost refused {queue.failed.length === 1 ? 'one action' : `${queue.failed.length} actions`}:
          </p>
          <ul className="mt-1 space-y-2">
            {queue.failed.map((item) => (
              <li key={item.seq} className="flex flex-wrap items-center gap-2">
                <span className="min-w-0 flex-1 basis-64">
                  {item.label} ({item.kind === 'receive' ? 'received' : 'measurement'}): {item.failed!.message}
                </span>
                <Button variant="secondary" onClick={() => void retryItem(item)}>
                  Try again
                </Button>
                <Button variant="quiet" onClick={() => void discardItem(item)}>
                  Drop it
                </Button>
              </li>
            ))}
          </ul>
        </div>
      )}
    </section>
  );
}
