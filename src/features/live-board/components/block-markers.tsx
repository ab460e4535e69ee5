import { blockStateLabels } from '@shared/schemas/swaps';
import type { RosterBlockDto, VerdictName } from '@shared/swap-types';
import { verdictLook } from './verdict-badge';

// A photo estimate is an early warning: shown with its own camera mark until a ruler verdict exists.
const estimateOf = (block: RosterBlockDto) => (block.verdict ? null : block.photoEstimate);
const likely: Record<VerdictName, { words: string; text: string }> = {
  true: { words: 'likely true', text: 'text-lichen-deep' },
  trim: { words: 'likely trim', text: 'text-weld-deep' },
  short: { words: 'likely short', text: 'text-madder-deep' },
  skewed: { words: 'likely out of square', text: 'text-plum' },
};

/** One small mark per block: its number, and its verdict (or state while not measured). */
export function BlockMarkers({ blocks }: { blocks: RosterBlockDto[] }) {
  if (blocks.length === 0) return null;
  return (
    <ul className="mt-1 flex flex-wrap gap-1" aria-label="Blocks">
      {blocks.map((b) => {
        const look = b.verdict ? verdictLook[b.verdict] : null;
        const estimate = estimateOf(b);
        const label = `Block ${b.sequence}: ${blockStateLabels[b.state]}${look ? `, ${look.word}` : ''}${b.trimmed ? ', trimmed' : ''}${estimate ? `, photo estimate ${likely[estimate.verdict].words}` : ''}`;
        return (
          <li
            key={b.id}
            title={label}
            className={`inline-flex min-w-9 items-center justify-center gap-0.5 rounded border px-1 text-sm ${look ? look.chip : 'border-walnut/25 bg-linen text-walnut-soft'}`}
          >
            <span className="sr-only">{label}</span>
            <span aria-hidden="true">
              {b.sequence}
              {look ? look.glyph : b.state === 'pledged' ? '' : '•'}
            </span>
            {estimate && (
              <span aria-hidden="true" className={`ml-0.5 border-l border-walnut/25 pl-1 font-semibold ${likely[estimate.verdict].text}`}>
                📷 {likely[estimate.verdict].words}
              </span>
            )}
          </li>
        );
      })}
    </ul>
  );
}
