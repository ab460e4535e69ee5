import { useEffect, useState, useSyncExternalStore } from 'react';
import { queuedItems, type QueueItem } from '../offline/intake-db';
import { onQueueChange, syncState } from '../offline/sync-queue';

export interface QueueView {
  /** items still to send for this swap, oldest first */
  waiting: QueueItem[];
  /** items the server refused, kept with its message */
  failed: QueueItem[];
  /** blocks with something still to send */
  waitingBlocks: number;
  state: ReturnType<typeof syncState>;
}

/** The queue of one swap as it changes, read back from IndexedDB after every change. */
export function useIntakeQueue(swapId: number): QueueView {
  const state = useSyncExternalStore(onQueueChange, syncState);
  const [items, setItems] = useState<QueueItem[]>([]);
  useEffect(() => {
    let live = true;
    const load = () => void queuedItems().then((all) => live && setItems(all.filter((i) => i.swapId === swapId)));
    load();
    const stop = onQueueChange(load);
    return () => {
      live = false;
      stop();
    };
  }, [swapId]);
  const waiting = items.filter((i) => !i.failed);
  return { waiting, failed: items.filter((i) => i.failed), waitingBlocks: new Set(waiting.map((i) => i.blockId)).size, state };
}
