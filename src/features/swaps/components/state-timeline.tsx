import { useState } from 'react';
import { isStepBack, moveLabels, swapMoves, swapPath, swapStateShort, type SwapState } from '@shared/schemas/swaps';
import type { SwapDto } from '@shared/swap-types';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { TextField } from '@/components/ui/fields';
import { ApiError } from '@/lib/api-client';
import { formatInZone } from '@/lib/dates';
import { useTransitionPreview } from '../api/get-transition-preview';
import { useTransitions } from '../api/get-transitions';
import { useTransitionSwap } from '../api/transition-swap';

/** The big step's dialog: what the move will do and what is unusual, from the server, then the choice. */
function MoveDialog({ swap, to, onClose }: { swap: SwapDto; to: SwapState | null; onClose: () => void }) {
  const preview = useTransitionPreview(swap.id, to);
  const transition = useTransitionSwap(swap.id);
  const [reason, setReason] = useState('');
  const [problem, setProblem] = useState('');
  const p = preview.data;
  const refused = p?.warnings.find((w) => w.code === 'move_refused');
  const others = p?.warnings.filter((w) => w.code !== 'move_refused') ?? [];
  const back = to !== null && isStepBack(swap.state, to);
  const label =
    to === 'cancelled' ? 'Cancel the swap' : to ? (moveLabels[`${swap.state}>${to}`] ?? `Move to ${swapStateShort[to]}`) : '';

  const close = () => {
    setReason('');
    setProblem('');
    onClose();
  };
  const confirm = () => {
    if (!to) return;
    setProblem('');
    transition.mutate(
      { to, ...(reason.trim() ? { reason: reason.trim() } : {}) },
      {
        onSuccess: close,
        onError: (e) => setProblem(e instanceof ApiError ? e.message : 'That did not work. Please try again.'),
      },
    );
  };

  return (
    <ConfirmDialog
      open={to !== null}
      title={`${label}?`}
      confirmLabel={label}
      confirmVariant={to === 'cancelled' ? 'danger' : 'primary'}
      onConfirm={confirm}
      onCancel={close}
      pending={transition.isPending}
      pendingLabel="Moving…"
      confirmDisabled={!p || Boolean(refused)}
    >
      {preview.isPending && <p>Checking what this step will do…</p>}
      {preview.isError && (
        <Alert tone="error">
          {preview.error instanceof ApiError ? preview.error.message : 'Could not check this step. Please try again.'}
        </Alert>
      )}
      {p && (
        <>
          {refused && (
            <Alert tone="error" title="This step cannot be taken now">
              {refused.message}
            </Alert>
          )}
          <ul className="list-disc space-y-1 pl-6">
            <li>
              {p.emails === 0
                ? 'Nobody is e-mailed.'
                : `${p.emails} ${p.emails === 1 ? 'person is' : 'people are'} e-mailed about it.`}
            </li>
            <li>
              {p.owedBlocks === 0
                ? 'No blocks are still owed.'
                : `${p.owedBlocks} pledged block${p.owedBlocks === 1 ? ' is' : 's are'} still owed by makers.`}
            </li>
            {back && <li>This takes a step back; the history keeps who did it and when.</li>}
          </ul>
          {others.length > 0 && (
            <Alert tone="warning" title="Unusual right now">
              <ul className="list-disc space-y-1 pl-5">
                {others.map((w) => (
                  <li key={w.code}>{w.message}</li>
                ))}
              </ul>
            </Alert>
          )}
          {!refused && (
            <TextField
              label="Note for the history (optional)"
              hint={back || to === 'cancelled' ? 'Say why, so others know.' : undefined}
              value={reason}
              maxLength={500}
              onChange={(e) => setReason(e.target.value)}
            />
          )}
        </>
      )}
      {problem && <Alert tone="error">{problem}</Alert>}
    </ConfirmDialog>
  );
}

/** Where the swap is on its path, its history, and (for officers) the moves it can make now. */
export function StateTimeline({ swap }: { swap: SwapDto }) {
  const history = useTransitions(swap.id);
  const [asking, setAsking] = useState<SwapState | null>(null);
  const here = swapPath.indexOf(swap.state);
  const moves = swapMoves[swap.state].filter((m) => m !== 'cancelled');

  return (
    <Card title="Progress">
      <ol className="flex flex-wrap gap-2" aria-label="Swap states">
        {swapPath.map((s, i) => {
          const done = swap.state !== 'cancelled' && i < here;
          const current = s === swap.state;
          return (
            <li
              key={s}
              aria-current={current ? 'step' : undefined}
              className={`rounded-full px-3 py-1 ${current ? 'bg-indigo font-semibold text-white' : done ? 'bg-lichen/15 text-lichen-deep' : 'bg-linen text-walnut-soft'}`}
            >
              {done && <span aria-hidden="true">✓ </span>}
              {swapStateShort[s]}
              {done && <span className="sr-only"> (done)</span>}
            </li>
          );
        })}
        {swap.state === 'cancelled' && <li className="rounded-full bg-walnut/10 px-3 py-1 font-semibold">Cancelled</li>}
      </ol>

      {swap.canManage && swapMoves[swap.state].length > 0 && (
        <div className="mt-5 space-y-3">
          <div className="flex flex-wrap gap-3">
            {moves.map((to) => (
              <Button key={to} variant={swapPath.indexOf(to) > here ? 'primary' : 'secondary'} onClick={() => setAsking(to)}>
                {moveLabels[`${swap.state}>${to}`] ?? `Move to ${swapStateShort[to]}`}
              </Button>
            ))}
            <Button variant="quiet" onClick={() => setAsking('cancelled')}>
              Cancel the swap
            </Button>
          </div>
          <MoveDialog swap={swap} to={asking} onClose={() => setAsking(null)} />
        </div>
      )}

      {history.data && history.data.length > 0 && (
        <details className="mt-5">
          <summary className="min-h-11 cursor-pointer py-2 font-semibold text-indigo">History ({history.data.length})</summary>
          <ol className="mt-2 space-y-1">
            {history.data.map((t) => (
              <li key={t.id}>
                <time dateTime={t.at}>{formatInZone(t.at, swap.guild.timeZone)}</time>:{' '}
                {t.from ? `${swapStateShort[t.from]} → ` : 'created as '}
                {swapStateShort[t.to]}
                {isStepBack(t.from, t.to) && ' (a step back)'}
                {t.by && ` by ${t.by.displayName}`}
                {t.reason && ` — “${t.reason}”`}
              </li>
            ))}
          </ol>
        </details>
      )}
    </Card>
  );
}
