import { useState } from 'react';
import { Link, useParams } from 'react-router';
import { LengthParseError, parseLength } from '@shared/quilt';
import {
  DEFAULT_REFERENCE_SIZE,
  MAX_REFERENCE_SIZE,
  type PhotoEstimateDto,
  type PhotoEstimatesDto,
} from '@shared/schemas/photo-estimates';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { TextField } from '@/components/ui/fields';
import { Loading, PageHeader, QueryError } from '@/components/ui/page';
import { Alert } from '@/components/ui/alert';
import { paths } from '@/lib/paths';
import { usePhotoEstimates } from '../api/get-photo-estimates';
import { MARKS, useCornerMarks } from '../hooks/use-corner-marks';
import { CornerCanvas } from './corner-canvas';
import { EstimateHistory } from './estimate-history';
import { EstimateResult } from './estimate-result';
import { lengthIn, type Units } from './estimate-look';

/** The reference square's side; a bare number is in the person's unit. */
function readSize(text: string, units: Units): { value: number | null; error?: string } {
  try {
    const value = parseLength(text, { bareUnit: units });
    if (value <= 0) return { value: null, error: 'Enter a size greater than zero.' };
    if (value > MAX_REFERENCE_SIZE) return { value: null, error: `Use a square of at most ${MAX_REFERENCE_SIZE}″.` };
    return { value };
  } catch (error) {
    return { value: null, error: error instanceof LengthParseError ? error.message : 'Enter a size such as 6, 6″ or 152 mm.' };
  }
}

/** The measuring view: route params give the block and the photo. */
export function PhotoMeasurePage({ units = 'in' }: { units?: Units }) {
  const params = useParams();
  const blockId = Number(params.blockId);
  const photoId = Number(params.photoId);
  const query = usePhotoEstimates(blockId);
  if (query.isPending) return <Loading />;
  if (query.isError) return <QueryError error={query.error} what="this block’s photos" />;
  const photo = query.data.photos.find((p) => p.id === photoId);
  if (!photo) {
    return (
      <Alert tone="error" title="That photo is not one of this block’s photos">
        It may have been removed.{' '}
        <Link className="underline" to={paths.swap(query.data.block.guildId, query.data.block.swapId)}>
          Back to the swap
        </Link>
      </Alert>
    );
  }
  // Keyed by photo, so moving to another photo starts with fresh marks.
  return <MeasureView key={photo.id} data={query.data} photo={photo} units={units} />;
}

function MeasureView({
  data,
  photo,
  units,
}: {
  data: PhotoEstimatesDto;
  photo: PhotoEstimatesDto['photos'][number];
  units: Units;
}) {
  const marks = useCornerMarks(photo.width, photo.height);
  const [sizeText, setSizeText] = useState(() =>
    units === 'mm' ? String((DEFAULT_REFERENCE_SIZE * 254) / 10) : String(DEFAULT_REFERENCE_SIZE),
  );
  const size = readSize(sizeText, units);
  const len = lengthIn(units);
  const { block, swap } = data;
  const next = marks.next !== null ? MARKS[marks.next]! : null;

  const show = (e: PhotoEstimateDto) => {
    marks.load(e.reference.corners, e.block.corners);
    setSizeText(String(e.reference.size));
  };

  return (
    <div>
      <nav aria-label="Back" className="mb-2 flex flex-wrap gap-x-4">
        <Link
          className="min-h-11 py-2 font-semibold text-indigo underline underline-offset-4"
          to={paths.swap(block.guildId, block.swapId)}
        >
          ← {swap.title}
        </Link>
        <Link
          className="min-h-11 py-2 font-semibold text-indigo underline underline-offset-4"
          to={paths.swapBoard(block.guildId, block.swapId)}
        >
          Swap board
        </Link>
      </nav>
      <PageHeader
        title={`Measure block ${block.sequence} from its photo`}
        lead={`${block.maker.displayName}’s block. The swap asks for ${len(swap.unfinished.width)} × ${len(swap.unfinished.height)} unfinished, within ±${len(swap.tolerance)}.`}
      />
      {data.photos.length > 1 && (
        <nav aria-label="Photos of this block" className="mb-4 flex flex-wrap gap-2">
          {data.photos.map((p, i) => (
            <Link
              key={p.id}
              to={paths.photoMeasure(block.guildId, block.swapId, block.id, p.id)}
              aria-current={p.id === photo.id ? 'page' : undefined}
              className={`block overflow-hidden rounded-lg ring-2 ${p.id === photo.id ? 'ring-madder' : 'ring-transparent hover:ring-indigo'}`}
            >
              <img src={p.thumbUrl} alt={`Photo ${i + 1} of ${data.photos.length}`} className="h-16 w-16 object-cover" />
            </Link>
          ))}
        </nav>
      )}
      <div className="grid grid-cols-1 gap-6 lg:grid-cols-5">
        <div className="min-w-0 space-y-3 lg:col-span-3">
          <p role="status" aria-live="polite" className="rounded-lg bg-card px-4 py-2 font-semibold ring-1 ring-walnut/10">
            {next ? (
              <>
                Next: tap the{' '}
                <span className={next.group === 'reference' ? 'text-indigo-deep' : 'text-madder-deep'}>{next.label}</span> corner
                ({marks.points.filter(Boolean).length} of 8 placed).
              </>
            ) : (
              'All eight corners are placed. Drag any mark to adjust it.'
            )}
          </p>
          <CornerCanvas
            src={photo.url}
            alt={`Block ${block.sequence} by ${block.maker.displayName} on the cutting mat`}
            width={photo.width}
            height={photo.height}
            marks={marks}
          />
          <div className="flex flex-wrap gap-2">
            {next && (
              <Button variant="secondary" onClick={marks.placeRest}>
                Place the rest for me to adjust
              </Button>
            )}
            <Button variant="quiet" onClick={marks.clear}>
              Start again
            </Button>
          </div>
        </div>
        <div className="min-w-0 space-y-6 lg:col-span-2">
          <Card title="How to mark">
            <ol className="list-decimal space-y-1 pl-5">
              <li>
                Find a square of the mat’s grid whose size you know (<span className="text-indigo-deep">R1–R4</span>). A square
                that goes right round the block gives the best estimate.
              </li>
              <li>Tap its corners in order: top-left, top-right, bottom-right, bottom-left.</li>
              <li>
                Then the block’s four corners (<span className="text-madder-deep">B1–B4</span>), in the same order.
              </li>
              <li>
                Drag a mark to adjust it; a magnifier shows while you drag. With a keyboard, Tab to a mark and use the arrow keys.
              </li>
              <li>On a phone, one finger on the photo marks; scroll with a finger beside it.</li>
            </ol>
            <TextField
              wrapperClassName="mt-4"
              label="Size of the reference square"
              hint={
                units === 'mm'
                  ? 'The side of the square you marked: 152.4, 304.8 or 6″.'
                  : 'The side of the square you marked: 6, 12, 6″ or 152 mm.'
              }
              inputMode="decimal"
              unit={units}
              value={sizeText}
              onChange={(e) => setSizeText(e.target.value)}
              error={size.error}
            />
          </Card>
          <Card title="Estimate">
            <EstimateResult
              key={JSON.stringify([marks.quads, sizeText])}
              data={data}
              photoId={photo.id}
              quads={marks.quads}
              referenceSize={{ text: sizeText, value: size.value }}
              units={units}
            />
          </Card>
        </div>
      </div>
      <Card title="Saved photo estimates" className="mt-6">
        <EstimateHistory estimates={data.estimates} photoId={photo.id} units={units} onShow={show} />
      </Card>
    </div>
  );
}
