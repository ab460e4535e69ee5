import type { PhotoEstimateDto } from '@shared/schemas/photo-estimates';
import { Button } from '@/components/ui/button';
import { relativeTime } from '@/lib/dates';
import { expectedErrorText, lengthIn, type Units } from './estimate-look';
import { VerdictBadge } from '@/entities/block/components/verdict-badge';

interface Props {
  estimates: PhotoEstimateDto[];
  photoId: number;
  units: Units;
  /** Puts a saved estimate's marks back on the photo, to look at or adjust. */
  onShow(estimate: PhotoEstimateDto): void;
}

/** Every saved photo estimate of the block, newest first. */
export function EstimateHistory({ estimates, photoId, units, onShow }: Props) {
  const len = lengthIn(units);
  if (estimates.length === 0) return <p className="text-walnut-soft">No photo estimates saved for this block yet.</p>;
  return (
    <ol className="space-y-3" aria-label="Saved photo estimates, newest first">
      {estimates.map((e) => (
        <li key={e.id} className="rounded-lg bg-linen p-3 ring-1 ring-walnut/10">
          <div className="flex flex-wrap items-center gap-2">
            <VerdictBadge variant="estimate" verdict={e.verdict} />
            <span>
              {len(e.width)} × {len(e.height)}
            </span>
            <span className="text-walnut-soft">error {expectedErrorText(e.expectedError, units)}</span>
          </div>
          <p className="mt-1 text-walnut-soft">
            <time dateTime={e.at} title={new Date(e.at).toLocaleString()}>
              {relativeTime(e.at)}
            </time>
            {e.measuredBy && ` by ${e.measuredBy.displayName}`}, against a {len(e.reference.size)} reference square
            {e.photoId === null
              ? ' (its photo was removed)'
              : e.photoId !== photoId
                ? ` on photo ${e.photoId}`
                : ' on this photo'}
          </p>
          {e.photoId === photoId && (
            <Button variant="quiet" onClick={() => onShow(e)}>
              Show these marks<span className="sr-only"> on the photo</span>
            </Button>
          )}
        </li>
      ))}
    </ol>
  );
}
