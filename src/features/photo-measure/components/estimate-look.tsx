import { VERDICT_LABELS, formatDeviation, formatLength, type Verdict } from '@shared/quilt';

export type Units = 'in' | 'mm';

const chip: Record<Verdict, string> = {
  true: 'bg-lichen/15 text-lichen-deep ring-lichen',
  trim: 'bg-weld/15 text-weld-deep ring-weld',
  short: 'bg-madder/10 text-madder-deep ring-madder',
  skewed: 'bg-plum/10 text-plum ring-plum',
};

/** "likely runs short": a photo estimate never says more than likely. */
export const likely = (verdict: Verdict) => `likely ${VERDICT_LABELS[verdict].label.toLowerCase()}`;

/** A length in the person's units: inches to the nearest 1/16″, or millimetres. */
export const lengthIn = (units: Units) => (x: number) => formatLength(x, units === 'mm' ? { unit: 'mm' } : { denominator: 16 });
export const deviationIn = (units: Units) => (x: number) => formatDeviation(x, units === 'mm' ? { unit: 'mm' } : { denominator: 16 });

/** An expected error in words: "about ±0.06″ (under 1/16″)". */
export function expectedErrorText(inches: number, units: Units): string {
  const amount = units === 'mm' ? `${(inches * 25.4).toFixed(1)} mm` : `${inches.toFixed(2)}″`;
  const sixteenths = Math.ceil(inches * 16 - 1e-9);
  const words = inches < 1 / 16 ? 'under 1/16″' : sixteenths < 16 ? `about ${sixteenths}/16″` : 'an inch or more';
  return `about ±${amount} (${words})`;
}

/** A small camera, drawn rather than an emoji so it shows on every device. */
export function CameraMark({ className = '' }: { className?: string }) {
  return (
    <svg viewBox="0 0 24 24" aria-hidden="true" className={`inline-block h-[1.1em] w-[1.1em] fill-none stroke-current ${className}`} strokeWidth={2} strokeLinejoin="round">
      <path d="M3 8h4l2-3h6l2 3h4v11H3z" />
      <circle cx="12" cy="13" r="3.5" />
    </svg>
  );
}

/** The camera mark, the verdict's glyph and its words, in the verdict's colour. */
export function EstimateBadge({ verdict, className = '' }: { verdict: Verdict; className?: string }) {
  const v = VERDICT_LABELS[verdict];
  return (
    <span className={`inline-flex max-w-full items-center gap-1.5 rounded-xl px-3 py-0.5 font-semibold ring-1 ${chip[verdict]} ${className}`}>
      <CameraMark />
      <span aria-hidden="true">{v.glyph}</span>
      <span>Photo estimate: {likely(verdict)}</span>
    </span>
  );
}
