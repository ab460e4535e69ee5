import { useEffect, useId, useRef, type ReactNode } from 'react';
import { Button, type ButtonVariant } from './button';

interface ConfirmDialogProps {
  open: boolean;
  title: string;
  children: ReactNode;
  confirmLabel: string;
  onConfirm: () => void;
  onCancel: () => void;
  pending?: boolean;
  pendingLabel?: string;
  /** Greys out the confirm button (the step cannot be taken now); the dialog says why. */
  confirmDisabled?: boolean;
  confirmVariant?: ButtonVariant;
  cancelLabel?: string;
}

/**
 * A modal question before a big step: what it will do, what is unusual, then the choice. Esc or
 * *Go back* closes it without doing anything; focus starts on *Go back*, so Enter never takes the step by accident.
 */
export function ConfirmDialog({
  open,
  title,
  children,
  confirmLabel,
  onConfirm,
  onCancel,
  pending,
  pendingLabel,
  confirmDisabled,
  confirmVariant = 'primary',
  cancelLabel = 'Go back',
}: ConfirmDialogProps) {
  const dialog = useRef<HTMLDialogElement>(null);
  const headingId = useId();

  useEffect(() => {
    const el = dialog.current;
    if (!el) return;
    if (open && !el.open) el.showModal();
    if (!open && el.open) el.close();
  }, [open]);

  return (
    <dialog
      ref={dialog}
      aria-labelledby={headingId}
      onClose={() => open && onCancel()}
      className="m-auto w-[min(94vw,36rem)] max-w-none rounded-card bg-card p-0 text-walnut shadow-xl backdrop:bg-walnut/75"
    >
      {open && (
        <div className="space-y-4 p-5">
          <h2 id={headingId} className="font-display text-2xl font-bold text-indigo-deep">
            {title}
          </h2>
          <div className="space-y-3">{children}</div>
          <div className="flex flex-wrap gap-3 pt-2">
            <Button
              variant={confirmVariant}
              onClick={onConfirm}
              disabled={confirmDisabled}
              pending={pending}
              pendingLabel={pendingLabel}
            >
              {confirmLabel}
            </Button>
            <Button variant="secondary" onClick={onCancel} autoFocus>
              {cancelLabel}
            </Button>
          </div>
        </div>
      )}
    </dialog>
  );
}
