import type { RosterBlockDto } from '@shared/swap-types';
import { VERDICT_LABELS, blockStateLabels, likelyVerdict } from '@shared/vocabulary';
import { verdictTone } from '@/entities/block/components/verdict-badge';
import { CameraGlyph } from '@/components/ui/camera-glyph';

// A photo estimate is an early warning: shown with its own camera mark until a ruler verdict exists.
const estimateOf = (block: RosterBlockDto) => (block.verdict ? null : block.photoEstimate);

/** One small mark per block: its number, and its verdict (or state while not measured). */
export function BlockMarkers({ blocks }: { blocks: RosterBlockDto[] }) {
  if (blocks.length === 0) return null;
  return (
    <ul className="mt-1 flex flex-wrap gap-1" aria-label="Blocks">
      {blocks.map((b) => {
        const look = b.verdict ? { ...VERDICT_LABELS[b.verdict], chip: verdictTone(b.verdict).panel } : null;
        const estimate = estimateOf(b);
        const label = `Block ${b.sequence}: ${blockStateLabels[b.state]}${look ? `, ${look.label}` : ''}${b.trimmed ? ', trimmed' : ''}${estimate ? `, photo estimate ${likelyVerdict(estimate.verdict, true)}` : ''}`;
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
              <span
                aria-hidden="true"
                className={`ml-0.5 border-l border-walnut/25 pl-1 font-semibold ${verdictTone(estimate.verdict).text}`}
              >
                <CameraGlyph className="mr-0.5" />
                {likelyVerdict(estimate.verdict, true)}
              </span>
            )}
          </li>
        );
      })}
    </ul>
  );
}
