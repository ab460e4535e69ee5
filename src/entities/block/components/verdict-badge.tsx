import type { MeasurementSource } from '@shared/swap-types';
import { VERDICTS, VERDICT_LABELS, likelyVerdict, type Verdict, type VerdictColour } from '@shared/vocabulary';

// Class names written out in full so the stylesheet build finds them; keyed by the vocabulary's colour token.
const tones: Record<VerdictColour, { chip: string; panel: string; text: string }> = {
  lichen: {
    chip: 'bg-lichen/15 text-lichen-deep ring-lichen',
    panel: 'border-lichen bg-lichen/12 text-lichen-deep',
    text: 'text-lichen-deep',
  },
  weld: { chip: 'bg-weld/15 text-weld-deep ring-weld', panel: 'border-weld bg-weld/12 text-weld-deep', text: 'text-weld-deep' },
  madder: {
    chip: 'bg-madder/10 text-madder-deep ring-madder',
    panel: 'border-madder bg-madder/10 text-madder-deep',
    text: 'text-madder-deep',
  },
  plum: { chip: 'bg-plum/10 text-plum ring-plum', panel: 'border-plum bg-plum/10 text-plum', text: 'text-plum' },
};

/** A verdict's classes: `chip` for badges, `panel` for a bordered area, `text` for coloured words. */
export const verdictTone = (verdict: Verdict) => tones[VERDICT_LABELS[verdict].colour];

/** A small camera, drawn rather than an emoji so it shows on every device. */
export function CameraMark({ className = '' }: { className?: string }) {
  return (
    <svg
      viewBox="0 0 24 24"
      aria-hidden="true"
      className={`inline-block h-[1.1em] w-[1.1em] fill-none stroke-current ${className}`}
      strokeWidth={2}
      strokeLinejoin="round"
    >
      <path d="M3 8h4l2-3h6l2 3h4v11H3z" />
      <circle cx="12" cy="13" r="3.5" />
    </svg>
  );
}

interface VerdictBadgeProps {
  verdict: Verdict;
  /** `estimate`: a size worked out from a photo — "Photo estimate: likely runs short", with a camera. */
  variant?: 'measured' | 'estimate';
  /** how many blocks have this verdict, shown before the words */
  count?: number;
  /** a trim verdict whose block has been trimmed since */
  trimmed?: boolean;
  /** who measured: the maker's own measurement and a photo estimate say so */
  source?: MeasurementSource;
  className?: string;
}

/**
 * A verdict as glyph, words and colour together ("✓ True to size" in lichen, "✂ Trim to size" in weld,
 * "↓ Runs short" in madder, "◇ Out of square" in plum): colour is never the only signal.
 */
export function VerdictBadge({ verdict, variant = 'measured', count, trimmed, source, className = '' }: VerdictBadgeProps) {
  const v = VERDICT_LABELS[verdict];
  const chip = `inline-flex items-center gap-1.5 font-semibold ring-1 ${verdictTone(verdict).chip}`;
  if (variant === 'estimate')
    return (
      <span className={`${chip} max-w-full rounded-xl px-3 py-0.5 ${className}`}>
        <CameraMark />
        <span aria-hidden="true">{v.glyph}</span>
        <span>Photo estimate: {likelyVerdict(verdict)}</span>
      </span>
    );
  return (
    <span className={`${chip} whitespace-nowrap rounded-full px-3 py-0.5 ${className}`}>
      <span aria-hidden="true">{v.glyph}</span>
      {count !== undefined && <span className="tabular-nums">{count}</span>}
      {v.label}
      {verdict === 'trim' && trimmed && <span className="font-normal">(trimmed)</span>}
      {source === 'maker' && <span className="font-normal">· maker’s own</span>}
      {source === 'photo' && (
        <span className="inline-flex items-center gap-1 font-normal">
          · <CameraMark /> photo estimate
        </span>
      )}
    </span>
  );
}

/** The verdict counts that are not zero, in the usual order, or `none` when there are none. */
export function VerdictCounts({ counts, none = '—' }: { counts: Record<Verdict, number>; none?: string }) {
  const shown = VERDICTS.filter((v) => counts[v] > 0);
  if (shown.length === 0) return <span className="text-walnut-soft">{none}</span>;
  return (
    <span className="flex flex-wrap gap-1">
      {shown.map((v) => (
        <VerdictBadge key={v} verdict={v} count={counts[v]} />
      ))}
    </span>
  );
}

export function NoVerdict({ children = 'Not measured yet' }: { children?: string }) {
  return (
    <span className="inline-flex items-center rounded-full px-3 py-0.5 text-walnut-soft ring-1 ring-walnut/25">{children}</span>
  );
}
