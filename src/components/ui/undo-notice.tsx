import type { ReactNode } from 'react';
import { Button } from './button';

/** “Done. Undo” for a few seconds after a step, while it can still be taken back. */
export function UndoNotice({
  message,
  pending,
  onUndo,
  undoLabel,
  className = '',
}: {
  message: string;
  pending: boolean;
  onUndo: () => void;
  /** More words for screen readers after “Undo”, naming what is undone. */
  undoLabel?: ReactNode;
  className?: string;
}) {
  return (
    <div role="status" className={`flex flex-wrap items-center gap-3 rounded-lg bg-linen p-3 ${className}`}>
      <span>{message}.</span>
      <Button variant="secondary" pending={pending} pendingLabel="Undoing…" onClick={onUndo}>
        Undo
        {undoLabel && <span className="sr-only"> {undoLabel}</span>}
      </Button>
    </div>
  );
}
