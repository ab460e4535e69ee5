import { VERDICT_LABELS, type Verdict } from '@shared/quilt';

// Colour is never the only signal: each verdict carries its word and glyph.
const tone: Record<Verdict, string> = {
  true: 'bg-lichen/15 text-lichen-deep ring-lichen',
  trim: 'bg-weld/15 text-weld-deep ring-weld',
  short: 'bg-madder/10 text-madder-deep ring-madder',
  skewed: 'bg-plum/10 text-plum ring-plum',
};

/** "✓ True to size" in lichen, "✂ Trim to size" in weld, "↓ Runs short" in madder, "◇ Out of square" in plum. */
export function VerdictBadge({ verdict, trimmed, source, className = '' }: { verdict: Verdict; trimmed?: boolean; source?: 'ruler' | 'maker' | 'photo'; className?: string }) {
  const v = VERDICT_LABELS[verdict];
  return (
    <span className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-full px-3 py-0.5 font-semibold ring-1 ${tone[verdict]} ${className}`}>
      <span aria-hidden="true">{v.glyph}</span>
      {v.label}
      {verdict === 'trim' && trimmed && <span className="font-normal">(trimmed)</span>}
      {source === 'maker' && <span className="font-normal">· maker’s own</span>}
      {source === 'photo' && (
        <span className="font-normal">
          · <span aria-hidden="true">📷</span> photo estimate
        </span>
      )}
    </span>
  );
}

export function NoVerdict({ children = 'Not measured yet' }: { children?: string }) {
  return <span className="inline-flex items-center rounded-full px-3 py-0.5 text-walnut-soft ring-1 ring-walnut/25">{children}</span>;
}
