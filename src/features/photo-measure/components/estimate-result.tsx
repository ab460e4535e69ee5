import { QuiltInputError, type Quad } from '@shared/quilt';
import { estimateFromCorners, type PhotoEstimateResult, type PhotoEstimatesDto } from '@shared/schemas/photo-estimates';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { ApiError } from '@/lib/api-client';
import { useSavePhotoEstimate } from '../api/save-photo-estimate';
import { deviationIn, expectedErrorText, lengthIn, type Units } from './estimate-look';
import { VerdictBadge } from '@/entities/block/components/verdict-badge';

interface Props {
  data: PhotoEstimatesDto;
  photoId: number;
  quads: { reference: Quad; block: Quad } | null;
  referenceSize: { text: string; value: number | null };
  units: Units;
}

function preview(
  data: PhotoEstimatesDto,
  quads: Props['quads'],
  size: number | null,
): { result?: PhotoEstimateResult; problem?: string } {
  if (!quads || size === null) return {};
  try {
    const { unfinished, tolerance, squareness } = data.swap;
    return {
      result: estimateFromCorners(
        { corners: quads.reference, size },
        { corners: quads.block },
        { ...unfinished, tolerance, squareness },
      ),
    };
  } catch (error) {
    return { problem: error instanceof QuiltInputError ? error.message : 'These marks cannot be measured; check their order.' };
  }
}

/** The estimate worked out as the marks move (the same engine the server uses), and saving it. */
export function EstimateResult({ data, photoId, quads, referenceSize, units }: Props) {
  const save = useSavePhotoEstimate(data.block.id);
  const { result, problem } = preview(data, quads, referenceSize.value);
  const len = lengthIn(units);
  const dev = deviationIn(units);
  const target = data.swap.unfinished;

  if (!quads) return <p className="text-walnut-soft">Place all eight marks to see the estimate.</p>;
  if (problem || !result)
    return (
      <Alert tone="warning" title="These marks cannot be measured yet">
        {problem ?? 'Enter the size of the reference square.'}
      </Alert>
    );

  const onSave = () =>
    save.mutate({ photoId, reference: { corners: quads.reference, size: referenceSize.text }, block: { corners: quads.block } });

  return (
    <div className="space-y-4" aria-live="polite">
      <VerdictBadge variant="estimate" verdict={result.verdict} className="text-lg" />
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1">
        <dt className="font-semibold">Width</dt>
        <dd>
          {len(result.width)}{' '}
          <span className="text-walnut-soft">
            ({dev(result.deviations.width)} against {len(target.width)})
          </span>
        </dd>
        <dt className="font-semibold">Height</dt>
        <dd>
          {len(result.height)}{' '}
          <span className="text-walnut-soft">
            ({dev(result.deviations.height)} against {len(target.height)})
          </span>
        </dd>
        <dt className="font-semibold">Diagonals</dt>
        <dd>
          {len(result.diagonals[0])} and {len(result.diagonals[1])}{' '}
          <span className="text-walnut-soft">
            (differ by {len(Math.abs(result.deviations.diagonal))}; up to {len(data.swap.squareness)} allowed)
          </span>
        </dd>
        <dt className="font-semibold">Expected error</dt>
        <dd>{expectedErrorText(result.expectedError, units)}, for marks placed to about 2 pixels</dd>
      </dl>
      {result.turned && <p>The block lies sideways in the photo, so its long side is compared with the swap’s long side.</p>}
      {result.borderline && (
        <Alert tone="warning" title="Close to a limit">
          The size is within the expected error of the tolerance, so the verdict could go either way. A ruler will tell.
        </Alert>
      )}
      {result.warnings.length > 0 && (
        <Alert tone="warning" title="This photo limits the estimate">
          <ul className="list-disc pl-5">
            {result.warnings.map((w) => (
              <li key={w}>{w}</li>
            ))}
          </ul>
        </Alert>
      )}
      <p className="text-walnut-soft">
        A photo estimate is an early warning only. The coordinator’s ruler measurement, taken when the block is handed in,
        decides.
      </p>
      {data.canEstimate ? (
        <div className="flex flex-wrap items-center gap-3">
          <Button onClick={onSave} pending={save.isPending} pendingLabel="Saving…">
            Save this estimate
          </Button>
          {save.isSuccess && (
            <span role="status" className="font-semibold text-lichen-deep">
              ✓ Saved. It is listed below and shows on the swap’s board.
            </span>
          )}
        </div>
      ) : (
        <p>This swap no longer takes photo estimates; you can still try the marks here.</p>
      )}
      {save.isError && (
        <Alert tone="error" title="The estimate was not saved">
          {save.error instanceof ApiError ? save.error.message : 'Please try again.'} Your marks are kept.
        </Alert>
      )}
    </div>
  );
}
