/**
 * Resolves once `performance.now()` has reached `at`, or on the next turn of the event loop when it has
 * already. A timer may fire a little early by this clock (libuv counts from the time it cached when
 * the loop's turn began), so it waits again for what is left.
 */
async function until(at: number) {
  if (at <= performance.now()) return new Promise<void>((resolve) => setImmediate(resolve));
  for (let left = at - performance.now(); left > 0; left = at - performance.now())
    await new Promise<void>((resolve) => setTimeout(resolve, left));
}

/** One swap's batches of changes, read and sent in turn by `paceChanges`. */
export interface PacedChanges<Batch, Change> {
  /** Everything queued since the last take; null when nothing is. */
  take(): Batch | null;
  /** The change for a batch, or null when there is nothing to send for it. */
  read(batch: Batch): Promise<Change | null>;
  send(change: Change): void;
  /** Called as the pacing stops (in the same tick as the last empty take, or as a read or send throws). */
  stopped(): void;
}

/**
 * Sends one swap's changes at most one per `intervalMs`: the first after a quiet spell at once, the
 * rest in batches. A batch is taken and read ahead of its turn by about as long as the last reads
 * took, then held until the interval has passed, so under load a change goes out when its interval
 * ends rather than a read's time after it (reading only once the interval had passed made the gap
 * between changes the interval and a read). Returns once an interval has passed with nothing queued.
 */
export async function paceChanges<Batch, Change>(intervalMs: number, changes: PacedChanges<Batch, Change>) {
  let sentAt = -Infinity;
  // How long reads take lately (each moves it halfway to its own time): how far ahead a batch is taken.
  let readMs = 0;
  try {
    for (;;) {
      await until(sentAt + intervalMs - readMs);
      let batch = changes.take();
      if (batch === null) {
        // Taken early and nothing queued: whatever comes before the interval ends still waits for it.
        await until(sentAt + intervalMs);
        batch = changes.take();
        if (batch === null) return;
      }
      const started = performance.now();
      const change = await changes.read(batch);
      readMs = Math.min(intervalMs, (readMs + performance.now() - started) / 2);
      if (change !== null) await until(sentAt + intervalMs);
      // A batch with nothing to send (or a failed read) still takes its turn.
      sentAt = performance.now();
      if (change !== null) changes.send(change);
    }
  } finally {
    // Also when a read or a send threw: the next change starts a pacing of its own instead of queueing
    // behind one that has stopped.
    changes.stopped();
  }
}
