import { VERDICT_LABELS } from '@shared/vocabulary';
import { formatDeviation, formatLength } from '@shared/quilt';
import { verdictTone } from '@/entities/block/components/verdict-badge';
import type { StationResult } from '../hooks/use-intake-station';

/** The last block's verdict, large: worked out here at once, then confirmed by the server. */
export function VerdictPanel({ result, units }: { result: StationResult; units: 'in' | 'mm' }) {
  const verdict = result.confirmed ?? result.local.verdict;
  const v = VERDICT_LABELS[verdict];
  const { deviations } = result.local;
  // A side exactly on size reads in words, not as a bare 0″.
  const f = (x: number) => (x === 0 ? 'on size' : formatDeviation(x, { unit: units }));
  const disagrees = result.confirmed !== null && result.confirmed !== result.local.verdict;
  return (
    <section
      aria-label="Last verdict"
      aria-live="polite"
      data-testid="verdict"
      className={`rounded-card border-4 p-5 ${verdictTone(verdict).panel}`}
    >
      <p className="text-walnut">
        Block {result.block.ordinal} of {result.block.of} · {result.block.maker.displayName}
      </p>
      <p className="flex items-center gap-4 font-display text-4xl font-bold sm:text-6xl">
        <span aria-hidden="true">{v.glyph}</span>
        <span>{v.label}</span>
      </p>
      <p className="mt-2 text-walnut">
        {formatLength(result.measured.width, { unit: units })} × {formatLength(result.measured.height, { unit: units })} · width{' '}
        {f(deviations.width)}, height {f(deviations.height)}
        {deviations.diagonal !== undefined && (
          <>, diagonals differ by {formatLength(Math.abs(deviations.diagonal), { unit: units })}</>
        )}
      </p>
      <p className="mt-1 font-semibold text-walnut" data-testid="verdict-status">
        {result.confirmed === null
          ? 'Worked out on this device · waiting for Blockpost to confirm'
          : disagrees
            ? 'Blockpost’s verdict differs from this device’s; Blockpost’s counts'
            : 'Confirmed by Blockpost'}
      </p>
    </section>
  );
}
