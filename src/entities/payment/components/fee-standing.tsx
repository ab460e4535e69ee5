import type { FeeStanding } from '@shared/schemas/payments';

/** Each standing as a word, a glyph and a colour, never colour alone. */
const look: Record<FeeStanding, { word: string; glyph: string; tone: string }> = {
  paid: { word: 'Paid', glyph: '✓', tone: 'border-lichen text-lichen-deep bg-lichen/10' },
  owed: { word: 'Not paid yet', glyph: '○', tone: 'border-weld text-weld-deep bg-weld/10' },
  pending: { word: 'Waiting for confirmation', glyph: '…', tone: 'border-indigo text-indigo-deep bg-indigo/8' },
  failed: { word: 'Did not go through', glyph: '✕', tone: 'border-madder text-madder-deep bg-madder/8' },
  refunded: { word: 'Refunded', glyph: '↩', tone: 'border-plum text-plum bg-plum/8' },
  not_owed: { word: 'Not asked', glyph: '–', tone: 'border-walnut/30 text-walnut-soft bg-transparent' },
};

export const feeStandingWord = (standing: FeeStanding) => look[standing].word;

export function FeeStandingBadge({ standing }: { standing: FeeStanding }) {
  const { word, glyph, tone } = look[standing];
  return (
    <span
      className={`inline-flex items-center gap-1 rounded-full border-2 px-2.5 py-0.5 text-base font-semibold whitespace-nowrap ${tone}`}
    >
      <span aria-hidden="true">{glyph}</span>
      {word}
    </span>
  );
}
