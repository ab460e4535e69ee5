import { blockStateLabels } from '@shared/schemas/swaps';
import type { RosterBlockDto } from '@shared/swap-types';
import { verdictLook } from './verdict-badge';

// A later measurement source ('photo') arrives on the block as `source`; it is read here when present.
const isPhotoEstimate = (block: RosterBlockDto) => (block as RosterBlockDto & { source?: string }).source === 'photo';

/** One small mark per block: its number, and its verdict (or state while not measured). */
export function BlockMarkers({ blocks }: { blocks: RosterBlockDto[] }) {
  if (blocks.length === 0) return null;
  return (
    <ul className="mt-1 flex flex-wrap gap-1" aria-label="Blocks">
      {blocks.map((b) => {
        const look = b.verdict ? verdictLook[b.verdict] : null;
        const label = `Block ${b.sequence}: ${blockStateLabels[b.state]}${look ? `, ${look.word}` : ''}${b.trimmed ? ', trimmed' : ''}`;
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
              {isPhotoEstimate(b) ? '📷' : ''}
            </span>
          </li>
        );
      })}
    </ul>
  );
}
