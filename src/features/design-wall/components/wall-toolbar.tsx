import { useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { ApiError } from '@/lib/api-client';
import { useArrangeDesign } from '../api/arrange-design';
import { toBody, type Layout } from '../lib/layout';

interface WallToolbarProps {
  swapId: number;
  layout: Layout;
  update: (next: Layout, message?: string) => void;
  announce: (message: string) => void;
  valueView: boolean;
  onValueView: (on: boolean) => void;
  canSpread: boolean;
}

/** The value-view switch and "Spread the colours" with its result and an undo. */
export function WallToolbar({ swapId, layout, update, announce, valueView, onValueView, canSpread }: WallToolbarProps) {
  const arrange = useArrangeDesign(swapId);
  const [spread, setSpread] = useState<{ score: number; before: number; previous: Layout['cells']; moved: boolean } | null>(null);

  const runSpread = () => {
    setSpread(null);
    arrange.mutate(toBody(layout), {
      onSuccess: (r) => {
        const moved = r.cells.some((c, i) => c.blockId !== layout.cells[i]?.blockId);
        setSpread({ score: r.score, before: r.before, previous: layout.cells, moved });
        if (moved) update({ ...layout, cells: r.cells }, 'Blocks rearranged to spread the colours.');
        else announce('The blocks stay where they are.');
      },
    });
  };

  return (
    <>
      <div className="flex flex-wrap items-center gap-3">
        <label className="flex min-h-11 items-center gap-3 rounded-lg bg-card px-3 ring-1 ring-walnut/20">
          <input
            type="checkbox"
            role="switch"
            className="h-6 w-6 accent-indigo"
            checked={valueView}
            onChange={(e) => onValueView(e.target.checked)}
          />
          <span className="font-semibold">Value view (lightness only)</span>
        </label>
        <Button onClick={runSpread} pending={arrange.isPending} pendingLabel="Spreading…" disabled={!canSpread}>
          Spread the colours
        </Button>
        {spread?.moved && (
          <Button
            variant="secondary"
            onClick={() => (update({ ...layout, cells: spread.previous }, 'Arrangement put back.'), setSpread(null))}
          >
            Undo the spread
          </Button>
        )}
      </div>
      {valueView && (
        <p className="text-base text-walnut-soft">
          Each tile shows its mean lightness, CIE L*: 0 is black, 100 is white; under 35 reads dark, over 65 light. Tiles of
          blocks without a photo show the swap’s drawing.
        </p>
      )}
      {arrange.isError && (
        <Alert tone="error">
          {arrange.error instanceof ApiError ? arrange.error.message : 'The blocks could not be rearranged.'}
        </Alert>
      )}
      {spread && <SpreadResult score={spread.score} before={spread.before} />}
    </>
  );
}

function SpreadResult({ score, before }: { score: number; before: number }) {
  if (score === 0 && before === 0) {
    return (
      <Alert tone="info">None of the neighbouring blocks has a photo with colours yet, so there was nothing to spread.</Alert>
    );
  }
  const better = score > before + 0.005;
  return (
    <Alert tone={better ? 'success' : 'info'} title={better ? 'Colours spread out.' : 'Already well spread.'}>
      {better
        ? `The two most alike neighbours now differ by ${score.toFixed(1)}, up from ${before.toFixed(1)}${before > 0 ? ` (${(score / before).toFixed(1)} times as far apart)` : ''}.`
        : `No arrangement we tried keeps neighbours further apart: the most alike neighbours differ by ${score.toFixed(1)}.`}{' '}
      Colour difference in CIEDE2000 units: about 1 is the smallest step most eyes notice; 10 and more reads as clearly different.
    </Alert>
  );
}
