import { useEffect } from 'react';
import { INTAKE_DB_NAME } from './db-name';

/**
 * Sends intake actions queued on this device (measured in a hall without a network) from whatever
 * page is open, not only from the intake view. Does nothing on a device that never ran an intake.
 */
export function useQueuedIntakeSync(userId: number | undefined) {
  useEffect(() => {
    if (userId === undefined || typeof indexedDB === 'undefined' || !indexedDB.databases) return;
    let stop: (() => void) | undefined;
    let cancelled = false;
    void (async () => {
      const names = (await indexedDB.databases()).map((d) => d.name);
      if (cancelled || !names.includes(INTAKE_DB_NAME)) return;
      // Loaded only here, so pages of people who never ran an intake do not download it.
      const { startSync } = await import('./sync-queue');
      if (!cancelled) stop = startSync(userId);
    })();
    return () => {
      cancelled = true;
      stop?.();
    };
  }, [userId]);
}
