import { useState } from 'react';
import { moveLabels, swapMoves, swapPath, swapStateShort, type SwapState } from '@shared/schemas/swaps';
import type { SwapDto } from '@shared/swap-types';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ApiError } from '@/lib/api-client';
import { formatInZone } from '@/lib/dates';
import { useTransitions } from '../api/get-transitions';
import { useTransitionSwap } from '../api/transition-swap';

/** Where the swap is on its path, its history, and (for officers) the moves it can make now. */
export function StateTimeline({ swap }: { swap: SwapDto }) {
  const history = useTransitions(swap.id);
  const transition = useTransitionSwap(swap.id);
  const [problem, setProblem] = useState('');
  const here = swapPath.indexOf(swap.state);
  const moves = swapMoves[swap.state].filter((m) => m !== 'cancelled');

  const go = (to: SwapState) => {
    setProblem('');
    if (to === 'cancelled' && !window.confirm('Cancel this swap? It cannot be reopened.')) return;
    transition.mutate({ to }, { onError: (e) => setProblem(e instanceof ApiError ? e.message : 'That did not work. Please try again.') });
  };

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
          {problem && <Alert tone="warning" title="Not yet">{problem}</Alert>}
          <div className="flex flex-wrap gap-3">
            {moves.map((to) => (
              <Button key={to} variant={swapPath.indexOf(to) > here ? 'primary' : 'secondary'} pending={transition.isPending && transition.variables?.to === to} onClick={() => go(to)}>
                {moveLabels[`${swap.state}>${to}`] ?? `Move to ${swapStateShort[to]}`}
              </Button>
            ))}
            <Button variant="quiet" onClick={() => go('cancelled')}>Cancel the swap</Button>
          </div>
        </div>
      )}

      {history.data && history.data.length > 0 && (
        <details className="mt-5">
          <summary className="min-h-11 cursor-pointer py-2 font-semibold text-indigo">History ({history.data.length})</summary>
          <ol className="mt-2 space-y-1">
            {history.data.map((t) => (
              <li key={t.id}>
                <time dateTime={t.at}>{formatInZone(t.at, swap.guild.timeZone)}</time>: {t.from ? `${swapStateShort[t.from]} → ` : 'created as '}
                {swapStateShort[t.to]}
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
