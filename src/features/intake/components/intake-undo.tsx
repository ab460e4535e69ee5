import { useEffect, useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { ApiError } from '@/lib/api-client';
import { UNDO_SECONDS } from '@/lib/use-undo-window';
import { useUndoBlock } from '@/entities/block/api/undo-block';
import type { StationResult } from '../hooks/use-intake-station';

type Stage = 'measured' | 'received' | 'handed_in';

/**
 * Undo for the block just measured at this station, once the server has it: first the measurement
 * (it stays in the history, withdrawn), then, if the block should not have been taken in at all, the
 * taking in. Offered for a couple of minutes; ordinary buttons, so Tab and Enter reach them.
 */
export function IntakeUndo({ swapId, result }: { swapId: number; result: StationResult }) {
  const undo = useUndoBlock(swapId);
  const [stage, setStage] = useState<Stage>('measured');
  const [expired, setExpired] = useState(false);
  const [problem, setProblem] = useState('');
  useEffect(() => {
    const timer = window.setTimeout(() => setExpired(true), UNDO_SECONDS * 1000);
    return () => window.clearTimeout(timer);
  }, []);
  if (result.confirmed === null || expired || stage === 'handed_in') {
    return stage === 'handed_in' ? (
      <p role="status" className="rounded-lg bg-linen p-3">
        Block {result.block.ordinal} of {result.block.maker.displayName} is no longer taken in; it is as it was before it reached
        you.
      </p>
    ) : null;
  }
  const step = () => {
    setProblem('');
    undo.mutate(result.block.id, {
      onSuccess: () => setStage(stage === 'measured' ? 'received' : 'handed_in'),
      onError: (e) => setProblem(e instanceof ApiError ? e.message : 'That did not work. Please try again.'),
    });
  };
  return (
    <div role="status" className="space-y-2 rounded-lg bg-linen p-3">
      {stage === 'received' && (
        <p>The measurement is withdrawn: block {result.block.ordinal} is taken in, not measured. Measure it again, or:</p>
      )}
      <Button variant="secondary" pending={undo.isPending} pendingLabel="Undoing…" onClick={step}>
        {stage === 'measured' ? 'Undo this measurement' : 'Undo taking this block in too'}
      </Button>
      {problem && <Alert tone="error">{problem}</Alert>}
    </div>
  );
}
