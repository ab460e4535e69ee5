import { useEffect, useRef, useState } from 'react';
import type { DesignDto } from '@shared/schemas/designs';
import { ApiError } from '@/lib/api-client';
import { useSaveDesign } from '../api/save-design';
import { layoutFrom, toBody, type Layout } from '../lib/layout';

export type SaveState =
  | { kind: 'idle' }
  | { kind: 'pending' }
  | { kind: 'saving' }
  | { kind: 'saved'; at: string }
  | { kind: 'error'; message: string };
const AUTOSAVE_MS = 800;

/**
 * The wall's layout, saved a moment after the last change. `change` returns false when nothing
 * changed; a failed save keeps the layout on screen and says so.
 */
export function useLayoutAutosave(swapId: number, initial: DesignDto) {
  const [layout, setLayout] = useState<Layout>(() => layoutFrom(initial));
  const [saveState, setSaveState] = useState<SaveState>(
    initial.savedAt ? { kind: 'saved', at: initial.savedAt } : { kind: 'idle' },
  );
  const changed = useRef(false);
  const save = useSaveDesign(swapId);

  const saveNow = () => {
    setSaveState({ kind: 'saving' });
    save.mutate(toBody(layout), {
      onSuccess: (d) => setSaveState({ kind: 'saved', at: d.savedAt ?? new Date().toISOString() }),
      onError: (e) =>
        setSaveState({ kind: 'error', message: e instanceof ApiError ? e.message : 'The layout could not be saved.' }),
    });
  };
  useEffect(() => {
    if (!changed.current) return;
    const timer = setTimeout(saveNow, AUTOSAVE_MS);
    return () => clearTimeout(timer);
    // saveNow reads the latest layout
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [layout]);

  const change = (next: Layout) => {
    if (next === layout) return false;
    changed.current = true;
    setLayout(next);
    setSaveState({ kind: 'pending' });
    return true;
  };

  return { layout, change, saveState, saveNow };
}
