import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import type { SaveState } from '../hooks/use-layout-autosave';

/** "Saving…", "✓ Saved 14:05" or a hint that changes save by themselves. */
export function SaveStatus({ state }: { state: SaveState }) {
  return (
    <p role="status" className="font-semibold">
      {(state.kind === 'saving' || state.kind === 'pending') && 'Saving…'}
      {state.kind === 'saved' && `✓ Saved ${new Date(state.at).toLocaleTimeString([], { hour: '2-digit', minute: '2-digit' })}`}
      {state.kind === 'idle' && 'Not saved yet: changes save by themselves.'}
    </p>
  );
}

/** A failed save, with the layout still on the page and a way to try again. */
export function SaveFailed({ state, onRetry }: { state: SaveState; onRetry: () => void }) {
  if (state.kind !== 'error') return null;
  return (
    <Alert tone="error" title="Your last change is not saved yet.">
      {state.message} Your layout stays on this page.{' '}
      <Button variant="quiet" onClick={onRetry}>
        Try again
      </Button>
    </Alert>
  );
}
