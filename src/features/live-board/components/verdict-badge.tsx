import type { VerdictName } from '@shared/swap-types';

/** Verdicts always as word, glyph and colour together. */
export const verdictLook: Record<VerdictName, { word: string; glyph: string; chip: string }> = {
  true: { word: 'True to size', glyph: '✓', chip: 'border-lichen bg-lichen/12 text-lichen-deep' },
  trim: { word: 'Trim to size', glyph: '✂', chip: 'border-weld bg-weld/12 text-weld-deep' },
  short: { word: 'Runs short', glyph: '↓', chip: 'border-madder bg-madder/10 text-madder-deep' },
  skewed: { word: 'Out of square', glyph: '◇', chip: 'border-plum bg-plum/10 text-plum' },
};

export const verdictOrder: VerdictName[] = ['true', 'trim', 'short', 'skewed'];

/**
 * A verdict chip, optionally with a count. `estimated` marks a size taken from a photo rather than a
 * ruler: it gets its own small camera mark.
 */
export function VerdictBadge({ verdict, count, estimated }: { verdict: VerdictName; count?: number; estimated?: boolean }) {
  const look = verdictLook[verdict];
  return (
    <span className={`inline-flex items-center gap-1 rounded-full border px-2 py-0.5 text-base font-semibold whitespace-nowrap ${look.chip}`}>
      <span aria-hidden="true">{look.glyph}</span>
      {count !== undefined && <span>{count}</span>}
      <span>{look.word}</span>
      {estimated && (
        <span title="Estimated from a photo">
          <span aria-hidden="true">📷</span>
          <span className="sr-only">(estimated from a photo)</span>
        </span>
      )}
    </span>
  );
}

/** The verdict counts that are not zero, or a dash. */
export function VerdictCounts({ counts }: { counts: Record<VerdictName, number> }) {
  const shown = verdictOrder.filter((v) => counts[v] > 0);
  if (shown.length === 0) return <span className="text-walnut-soft">—</span>;
  return (
    <span className="flex flex-wrap gap-1">
      {shown.map((v) => <VerdictBadge key={v} verdict={v} count={counts[v]} />)}
    </span>
  );
}
