import { useCallback, useEffect, useState } from 'react';

/** How long *Undo* stays on screen after a step: long enough to notice a slip, short enough not to linger. */
export const UNDO_SECONDS = 120;

/**
 * Remembers the latest step that can still be undone from this screen, and forgets it after
 * UNDO_SECONDS. `offer(what)` after a step; `clear()` once undone or replaced.
 */
export function useUndoWindow<T>(seconds = UNDO_SECONDS) {
  const [offer, setOffer] = useState<{ what: T; until: number } | null>(null);
  useEffect(() => {
    if (!offer) return;
    const timer = window.setTimeout(() => setOffer(null), Math.max(0, offer.until - Date.now()));
    return () => window.clearTimeout(timer);
  }, [offer]);
  return {
    current: offer?.what ?? null,
    offer: useCallback((what: T) => setOffer({ what, until: Date.now() + seconds * 1000 }), [seconds]),
    clear: useCallback(() => setOffer(null), []),
  };
}
