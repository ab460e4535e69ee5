import { HandInFields } from './hand-in-fields';
import { UndoNotice } from '@/components/ui/undo-notice';
import { useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { Link } from 'react-router';
import type { BlockDto, SwapDto } from '@shared/swap-types';
import { isBlockStateBefore } from '@shared/vocabulary';
import { PhotoGallery, PhotoUploader, blockPhotosUrl } from '@/components/photos';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { ApiError } from '@/lib/api-client';
import { paths } from '@/lib/paths';
import { useHandIn } from '../api/hand-in';
import { useMarkSewn } from '../api/mark-sewn';
import { useUndoBlock } from '@/entities/block/api/undo-block';
import { useUndoWindow } from '@/lib/use-undo-window';
import { invalidateSwapData } from '@/entities/block/api/block-keys';
import { MeasureForm } from './measure-form';
import { BlockStateText } from './state-badge';
import { NoVerdict, VerdictBadge } from '@/entities/block/components/verdict-badge';
import { CameraGlyph } from '@/components/ui/camera-glyph';

// Photo estimates are taken from sign-up until the return is confirmed.
const ESTIMATING = ['signup', 'sewing', 'collecting', 'sorting'];

/** One of the member's own blocks: its state and verdicts, and the steps the maker can take. */
export function MyBlockCard({ swap, block }: { swap: SwapDto; block: BlockDto }) {
  const queryClient = useQueryClient();
  const sewn = useMarkSewn(swap.id);
  const handIn = useHandIn(swap.id);
  const [how, setHow] = useState<'in-person' | 'post'>(block.handIn?.how ?? 'in-person');
  const [note, setNote] = useState(block.handIn?.note ?? '');
  const [open, setOpen] = useState<'hand-in' | 'measure' | null>(null);
  const [problem, setProblem] = useState('');
  const undo = useUndoBlock(swap.id);
  const undoWindow = useUndoWindow<string>();
  const active = ['signup', 'sewing', 'collecting'].includes(swap.state);
  const report = (e: unknown) => setProblem(e instanceof ApiError ? e.message : 'That did not work. Please try again.');

  return (
    <li className="seam rounded-card bg-card p-5 ring-1 ring-walnut/10">
      <div className="relative space-y-3">
        <div className="flex flex-wrap items-center justify-between gap-2">
          <h4 className="text-xl font-semibold">Block {block.sequence}</h4>
          {/* Her own block going to someone else is "shared out", not "returned" (which sounds like it came back to her). */}
          {block.state === 'returned' ? (
            <span className="font-semibold">Shared out</span>
          ) : (
            <BlockStateText state={block.state} />
          )}
        </div>
        <p className="flex flex-wrap items-center gap-2">
          <span>Coordinator’s verdict:</span>
          {block.verdict ? <VerdictBadge verdict={block.verdict} trimmed={block.trimmed} /> : <NoVerdict />}
        </p>
        {block.latest?.maker && (
          <p className="flex flex-wrap items-center gap-2">
            <span>Your own measurement:</span> <VerdictBadge verdict={block.latest.maker.verdict} source="maker" />
          </p>
        )}
        {block.photoEstimate && (
          <p className="flex flex-wrap items-center gap-2">
            <span>From your photo:</span> <VerdictBadge verdict={block.photoEstimate.verdict} source="photo" />
          </p>
        )}
        {block.handIn && (
          <p>
            Handed in {block.handIn.how === 'post' ? 'by post' : 'at a meeting'}
            {block.handIn.note && ` — ${block.handIn.note}`}
          </p>
        )}
        {block.recipient && (
          <p>
            In the return, this block of yours goes to <span className="font-semibold">{block.recipient.displayName}</span>.
          </p>
        )}
        {block.decision && (
          <p>
            <span className="font-semibold">Accepted by decision</span> of the coordinator: “{block.decision.reason}”. It counts
            for the return as it is.
          </p>
        )}
        {block.state === 'measured' && !block.accepted && (
          <p className="text-walnut-soft">
            {block.verdict === 'trim'
              ? 'It is a little big: once it is trimmed to size it counts for the return.'
              : swap.distributionConfirmedAt
                ? 'This block is not part of the return; the coordinator will talk to you about it.'
                : 'This block does not count for the return as it is; the coordinator will talk to you about it.'}
          </p>
        )}
        {problem && <Alert tone="error">{problem}</Alert>}
        {undoWindow.current && (
          <UndoNotice
            message={undoWindow.current}
            pending={undo.isPending}
            onUndo={() => {
              setProblem('');
              undo.mutate(block.id, { onSuccess: () => undoWindow.clear(), onError: report });
            }}
          />
        )}

        {block.photos.length > 0 && (
          <PhotoGallery photos={block.photos} subject={`Block ${block.sequence} by ${block.maker.displayName}`} />
        )}
        {block.photos.length > 0 && ESTIMATING.includes(swap.state) && !swap.distributionConfirmedAt && (
          <p className="flex flex-wrap gap-x-4">
            {block.photos.map((p, i) => (
              <Link
                key={p.id}
                className="inline-flex min-h-11 items-center font-semibold text-indigo underline underline-offset-4"
                to={paths.photoMeasure(swap.guildId, swap.id, block.id, p.id)}
              >
                <CameraGlyph className="mr-1.5" />
                Measure from {block.photos.length > 1 ? `photo ${i + 1}` : 'this photo'}
              </Link>
            ))}
          </p>
        )}

        {active && isBlockStateBefore(block.state, 'received') && (
          <div className="flex flex-wrap gap-2">
            {block.state === 'pledged' && (
              <Button
                variant="secondary"
                pending={sewn.isPending}
                onClick={() => {
                  setProblem('');
                  sewn.mutate(block.id, {
                    onError: report,
                    onSuccess: () => undoWindow.offer(`Block ${block.sequence} marked sewn`),
                  });
                }}
              >
                Mark sewn
              </Button>
            )}
            {swap.state !== 'signup' && (
              <Button
                variant="secondary"
                onClick={() => setOpen(open === 'hand-in' ? null : 'hand-in')}
                aria-expanded={open === 'hand-in'}
              >
                {block.state === 'handed_in' ? 'Change hand-in' : 'Hand it in'}
              </Button>
            )}
            <Button
              variant="quiet"
              onClick={() => setOpen(open === 'measure' ? null : 'measure')}
              aria-expanded={open === 'measure'}
            >
              Enter my own measurement
            </Button>
          </div>
        )}

        {open === 'hand-in' && (
          <form
            className="space-y-3 rounded-lg bg-linen p-4"
            onSubmit={(e) => {
              e.preventDefault();
              setProblem('');
              handIn.mutate(
                { blockId: block.id, how, ...(note.trim() ? { note } : {}) },
                {
                  onError: report,
                  onSuccess: () => {
                    setOpen(null);
                    undoWindow.offer(`Block ${block.sequence} handed in`);
                  },
                },
              );
            }}
          >
            <HandInFields how={how} note={note} onHowChange={setHow} onNoteChange={setNote} />
            <Button type="submit" pending={handIn.isPending}>
              Save hand-in
            </Button>
          </form>
        )}
        {open === 'measure' && (
          <div className="rounded-lg bg-linen p-4">
            <MeasureForm swap={swap} blockId={block.id} source="maker" label={`Your measurement of block ${block.sequence}`} />
          </div>
        )}
        {active && isBlockStateBefore(block.state, 'received') && (
          <details>
            <summary className="min-h-11 cursor-pointer py-2 font-semibold text-indigo">Add photos of this block</summary>
            <PhotoUploader
              uploadUrl={blockPhotosUrl(block.id)}
              label="Photos of the finished block"
              onUploaded={() => void invalidateSwapData(queryClient, swap.id)}
            />
          </details>
        )}
      </div>
    </li>
  );
}
