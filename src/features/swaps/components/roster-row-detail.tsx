import { UndoNotice } from '@/components/ui/undo-notice';
import { useState } from 'react';
import type { RosterBlockDto, RosterRowDto, SwapDto } from '@shared/swap-types';
import { isBlockStateBefore } from '@shared/vocabulary';
import { useQueryClient } from '@tanstack/react-query';
import { Link } from 'react-router';
import { PhotoGallery, PhotoUploader, blockPhotosUrl } from '@/components/photos';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { ApiError } from '@/lib/api-client';
import { formatInZone } from '@/lib/dates';
import { paths } from '@/lib/paths';
import { useMeasurements } from '@/entities/block/api/get-measurements';
import { useMe } from '@/entities/me/api/get-me';
import { unitsFor } from '@/entities/me/api/units';
import { useReceiveBlock } from '@/entities/block/api/receive-block';
import { invalidateSwapData } from '@/entities/block/api/block-keys';
import { useTrimBlock } from '../api/trim-block';
import { useAcceptBlock } from '../api/accept-block';
import { useUndoBlock } from '@/entities/block/api/undo-block';
import { useUndoWindow } from '@/lib/use-undo-window';
import { TextField } from '@/components/ui/fields';
import { MeasureForm } from './measure-form';
import { sizeText } from '@/lib/lengths';
import { BlockStateText } from './state-badge';
import { NoVerdict, VerdictBadge } from '@/entities/block/components/verdict-badge';
import { CameraGlyph } from '@/components/ui/camera-glyph';

const MEASURABLE = ['received', 'measured'];

function History({ swap, blockId }: { swap: SwapDto; blockId: number }) {
  const history = useMeasurements(blockId);
  const units = unitsFor(useMe().data, swap.guildId);
  if (history.isPending) return <p>Loading…</p>;
  if (history.isError || history.data.length === 0) return <p className="text-walnut-soft">No measurements yet.</p>;
  return (
    <ol className="space-y-1">
      {history.data.map((m) => (
        <li key={m.id} className="flex flex-wrap items-center gap-2">
          <time dateTime={m.at}>{formatInZone(m.at, swap.guild.timeZone)}</time> {sizeText(m, units)}
          <VerdictBadge verdict={m.verdict} source={m.source} />
          {m.measuredBy && <span className="text-walnut-soft">by {m.measuredBy.displayName}</span>}
          {m.withdrawnAt && <span className="font-semibold text-madder-deep">withdrawn (undone)</span>}
        </li>
      ))}
    </ol>
  );
}

function BlockLine({ swap, maker, block }: { swap: SwapDto; maker: string; block: RosterBlockDto }) {
  const queryClient = useQueryClient();
  const receive = useReceiveBlock(swap.id);
  const trim = useTrimBlock(swap.id);
  const [panel, setPanel] = useState<'measure' | 'history' | 'accept' | null>(null);
  const accept = useAcceptBlock(swap.id);
  const undo = useUndoBlock(swap.id);
  const undoWindow = useUndoWindow<string>();
  const [reason, setReason] = useState('');
  const [reasonError, setReasonError] = useState('');
  const offAndOpen =
    block.state === 'measured' &&
    !block.acceptedByDecision &&
    block.verdict !== 'true' &&
    !(block.verdict === 'trim' && block.trimmed);
  const [problem, setProblem] = useState('');
  const report = (e: unknown) => setProblem(e instanceof ApiError ? e.message : 'That did not work. Please try again.');
  const intake = swap.canManage && ['sewing', 'collecting', 'sorting'].includes(swap.state) && !swap.distributionConfirmedAt;

  return (
    <li className="rounded-lg bg-card p-4 ring-1 ring-walnut/10">
      <div className="flex flex-wrap items-center gap-3">
        <span className="font-semibold">Block {block.sequence}</span>
        <BlockStateText state={block.state} />
        {block.verdict ? <VerdictBadge verdict={block.verdict} trimmed={block.trimmed} /> : <NoVerdict />}
        {block.photoEstimate && <VerdictBadge verdict={block.photoEstimate.verdict} source="photo" />}
        {block.acceptedByDecision && (
          <span className="rounded-full bg-lichen/15 px-3 py-1 font-semibold text-lichen-deep">
            <span aria-hidden="true">✓ </span>Accepted by decision
          </span>
        )}
        {block.handIn && (
          <span className="text-walnut-soft">
            {block.handIn.how === 'post' ? 'Posted' : 'Handed in at a meeting'}
            {block.handIn.note && `: ${block.handIn.note}`}
          </span>
        )}
      </div>
      {problem && (
        <div className="mt-2">
          <Alert tone="error">{problem}</Alert>
        </div>
      )}
      {undoWindow.current && (
        <UndoNotice
          className="mt-2"
          message={undoWindow.current}
          pending={undo.isPending}
          undoLabel={`on block ${block.sequence} of ${maker}`}
          onUndo={() => {
            setProblem('');
            undo.mutate(block.id, { onSuccess: () => undoWindow.clear(), onError: report });
          }}
        />
      )}
      {block.photos.length > 0 && (
        <div className="mt-3">
          <PhotoGallery photos={block.photos} subject={`Block ${block.sequence} by ${maker}`} />
        </div>
      )}
      {block.photos.length > 0 &&
        swap.canManage &&
        ['signup', 'sewing', 'collecting', 'sorting'].includes(swap.state) &&
        !swap.distributionConfirmedAt && (
          <p className="mt-2 flex flex-wrap gap-x-4">
            {block.photos.map((p, i) => (
              <Link
                key={p.id}
                className="inline-flex min-h-11 items-center font-semibold text-indigo underline underline-offset-4"
                to={paths.photoMeasure(swap.guildId, swap.id, block.id, p.id)}
              >
                <CameraGlyph className="mr-1.5" />
                Measure from {block.photos.length > 1 ? `photo ${i + 1}` : 'this photo'}
                <span className="sr-only">
                  {' '}
                  (block {block.sequence} of {maker})
                </span>
              </Link>
            ))}
          </p>
        )}
      {swap.canManage && (
        <div className="mt-3 flex flex-wrap gap-2">
          {intake && isBlockStateBefore(block.state, 'received') && swap.state !== 'sorting' && (
            <Button
              variant="secondary"
              pending={receive.isPending}
              onClick={() => {
                setProblem('');
                receive.mutate(block.id, {
                  onError: report,
                  onSuccess: () => undoWindow.offer(`Block ${block.sequence} of ${maker} taken in`),
                });
              }}
            >
              Mark received
              <span className="sr-only">
                {' '}
                block {block.sequence} of {maker}
              </span>
            </Button>
          )}
          {intake && MEASURABLE.includes(block.state) && (
            <Button
              variant={block.state === 'received' ? 'primary' : 'secondary'}
              aria-expanded={panel === 'measure'}
              onClick={() => setPanel(panel === 'measure' ? null : 'measure')}
            >
              {block.state === 'measured' ? 'Measure again' : 'Measure'}
              <span className="sr-only">
                {' '}
                block {block.sequence} of {maker}
              </span>
            </Button>
          )}
          {intake && block.verdict === 'trim' && !block.trimmed && block.state === 'measured' && (
            <Button
              variant="secondary"
              pending={trim.isPending}
              onClick={() => {
                setProblem('');
                trim.mutate(block.id, {
                  onError: report,
                  onSuccess: () => undoWindow.offer(`Block ${block.sequence} of ${maker} marked trimmed`),
                });
              }}
            >
              Mark trimmed to size
            </Button>
          )}
          {intake && offAndOpen && (
            <Button
              variant="secondary"
              aria-expanded={panel === 'accept'}
              onClick={() => setPanel(panel === 'accept' ? null : 'accept')}
            >
              Accept anyway…
              <span className="sr-only">
                {' '}
                block {block.sequence} of {maker}
              </span>
            </Button>
          )}
          <Button
            variant="quiet"
            aria-expanded={panel === 'history'}
            onClick={() => setPanel(panel === 'history' ? null : 'history')}
          >
            Measurements
          </Button>
        </div>
      )}
      {panel === 'measure' && (
        <div className="mt-3 rounded-lg bg-linen p-4">
          <MeasureForm
            swap={swap}
            blockId={block.id}
            source="ruler"
            label={`Measure block ${block.sequence} of ${maker}`}
            onSaved={() => undoWindow.offer(`Block ${block.sequence} of ${maker} measured`)}
          />
        </div>
      )}
      {panel === 'accept' && (
        <form
          className="mt-3 space-y-3 rounded-lg bg-linen p-4"
          onSubmit={(e) => {
            e.preventDefault();
            setProblem('');
            setReasonError('');
            if (reason.trim().length < 3) return setReasonError('Say in a few words why the block is accepted.');
            accept.mutate(
              { blockId: block.id, reason: reason.trim() },
              {
                onSuccess: () => {
                  setPanel(null);
                  setReason('');
                  undoWindow.offer(`Block ${block.sequence} of ${maker} accepted by decision`);
                },
                onError: (err) =>
                  err instanceof ApiError && err.fields.reason ? setReasonError(err.fields.reason) : report(err),
              },
            );
          }}
        >
          <p>The block takes part in the return as if it were true to size. The maker and other officers see your reason.</p>
          <TextField
            label="Why it is accepted"
            hint="For example: only a little short; the sashing hides it."
            value={reason}
            maxLength={500}
            error={reasonError}
            onChange={(e) => setReason(e.target.value)}
          />
          <Button type="submit" pending={accept.isPending} pendingLabel="Accepting…">
            Accept block {block.sequence}
          </Button>
        </form>
      )}
      {panel === 'history' && (
        <div className="mt-3">
          <History swap={swap} blockId={block.id} />
        </div>
      )}
      {swap.canManage && block.state !== 'returned' && (
        <details className="mt-2">
          <summary className="min-h-11 cursor-pointer py-2 font-semibold text-indigo">
            Add photos
            <span className="sr-only">
              {' '}
              of block {block.sequence} of {maker}
            </span>
          </summary>
          <PhotoUploader
            uploadUrl={blockPhotosUrl(block.id)}
            label={`Photos of block ${block.sequence} by ${maker}`}
            onUploaded={() => void invalidateSwapData(queryClient, swap.id)}
          />
        </details>
      )}
    </li>
  );
}

/** One member's blocks in the roster, with intake actions for officers. */
export function RosterRowDetail({ swap, row }: { swap: SwapDto; row: RosterRowDto }) {
  return (
    <div className="space-y-3">
      {row.mailingAddress !== undefined && (
        <p>
          <span className="font-semibold">Mailing address:</span>{' '}
          {row.mailingAddress || <span className="text-walnut-soft">not given</span>}
        </p>
      )}
      <ul className="space-y-3">
        {row.blocks.map((b) => (
          <BlockLine key={b.id} swap={swap} maker={row.displayName} block={b} />
        ))}
      </ul>
    </div>
  );
}
