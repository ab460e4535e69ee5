import { useMemo, useState } from 'react';
import { useParams } from 'react-router';
import { DndContext, DragOverlay } from '@dnd-kit/core';
import { finishingPlan } from '@shared/design/finishing-plan';
import { isPlainCell, type DesignBlockDto, type DesignDto } from '@shared/schemas/designs';
import { Alert } from '@/components/ui/alert';
import { Card } from '@/components/ui/card';
import { EmptyState, Loading, QueryError } from '@/components/ui/page';
import { useDesign } from '../api/get-design';
import { useGreyPhotos } from '../hooks/use-grey-photos';
import { useLayoutAutosave } from '../hooks/use-layout-autosave';
import { usePrintPicture } from '../hooks/use-print-picture';
import { useWallMoves } from '../hooks/use-wall-moves';
import { blockShapes } from '../lib/block-drawing';
import { sizeText } from '@/lib/lengths';
import { indexOfBlock, resize, setAlternate, trayBlocks, type Layout } from '../lib/layout';
import { renderWall } from '../lib/render-wall';
import { BlockTray } from './block-tray';
import { FinishingList } from './finishing-list';
import { KeepAndShare } from './keep-and-share';
import { PickedBar } from './picked-bar';
import { PrintPlan } from './print-plan';
import { SaveFailed, SaveStatus } from './save-status';
import { SettingPanel } from './setting-panel';
import { TileFace } from './tile-face';
import { WallBoard } from './wall-board';
import { WallToolbar } from './wall-toolbar';

export function DesignWallPage() {
  const swapId = Number(useParams().swapId);
  const design = useDesign(swapId);
  if (design.isPending) return <Loading label="Loading your design wall…" />;
  if (design.isError) return <QueryError error={design.error} what="your design wall" />;
  return <DesignWall key={swapId} swapId={swapId} initial={design.data} />;
}

function DesignWall({ swapId, initial }: { swapId: number; initial: DesignDto }) {
  const { layout, change, saveState, saveNow } = useLayoutAutosave(swapId, initial);
  const [valueView, setValueView] = useState(false);
  const [announce, setAnnounce] = useState('');
  const [notice, setNotice] = useState<string | null>(null);

  const blocks = initial.blocks;
  const byId = useMemo(() => new Map(blocks.map((b) => [b.id, b])), [blocks]);
  const shapes = useMemo(() => blockShapes(initial.block.spec), [initial.block.spec]);
  const greyUrls = useGreyPhotos(blocks, valueView);
  const square = initial.block.finished.width === initial.block.finished.height;
  const tray = trayBlocks(layout, blocks);

  const update = (next: Layout, message?: string) => {
    if (change(next) && message) setAnnounce(message);
  };
  const moves = useWallMoves({ layout, update, announce: setAnnounce, byId, square });

  const plan = useMemo(() => {
    let plain = 0;
    let empty = 0;
    layout.cells.forEach((c, i) => {
      if (isPlainCell(i, layout.columns, layout.alternate)) plain += 1;
      else if (c.blockId === null) empty += 1;
    });
    return finishingPlan({
      block: initial.block.finished,
      seam: initial.block.seam,
      columns: layout.columns,
      rows: layout.rows,
      plain,
      empty,
      sashing: layout.sashing,
      cornerstones: layout.cornerstones,
      borders: layout.borders,
    });
  }, [layout, initial.block]);

  const picture = () => renderWall({ layout, blocks, spec: initial.block.spec, block: initial.block.finished, valueView });
  const { printUrl, print } = usePrintPicture(picture);
  const dragging = moves.dragging;

  return (
    <DndContext {...moves.dnd}>
      <div className="space-y-6 print:hidden">
        <div className="flex flex-wrap items-end justify-between gap-3">
          <div>
            <h3 className="text-2xl font-semibold text-indigo-deep">Design wall</h3>
            <p className="max-w-2xl text-walnut-soft">
              Lay out the blocks that came back to you{initial.swap.mode === 'gift' ? ' (or the whole gift)' : ''} and your own.
              Drag a tile, or tap it and then tap a cell. With a keyboard: Enter picks up and puts down, the arrow keys move, R
              turns, P pins, Delete takes a tile off.
            </p>
          </div>
          <SaveStatus state={saveState} />
        </div>
        <SaveFailed state={saveState} onRetry={saveNow} />
        {blocks.length === 0 && (
          <EmptyState title="No blocks to lay out yet.">
            The wall fills with the blocks returned to you once the coordinator confirms the return, and with blocks you made for
            this swap.
          </EmptyState>
        )}
        <p className="sr-only" aria-live="assertive">
          {announce}
        </p>

        <WallToolbar
          swapId={swapId}
          layout={layout}
          update={update}
          announce={setAnnounce}
          valueView={valueView}
          onValueView={setValueView}
          canSpread={blocks.length >= 2}
        />

        <PickedBar
          layout={layout}
          picked={moves.picked}
          byId={byId}
          square={square}
          update={update}
          onDone={() => moves.setPicked(null)}
        />
        {notice && <Alert tone="warning">{notice}</Alert>}

        <WallBoard
          layout={layout}
          block={initial.block.finished}
          blocks={byId}
          shapes={shapes}
          valueView={valueView}
          greyUrls={greyUrls}
          picked={moves.picked}
          onActivate={moves.onActivate}
          onKey={moves.onKey}
          registerCell={moves.registerCell}
        />
        <p className="text-base text-walnut-soft">
          Finished {sizeText(plan.finished)}. Colours of the setting are stand-ins, named beside each setting; the blocks are your
          photos.
        </p>

        <BlockTray
          blocks={tray}
          shapes={shapes}
          picked={moves.picked}
          valueView={valueView}
          greyUrls={greyUrls}
          onPick={moves.onPickFromTray}
        />

        <div className="grid gap-6 lg:grid-cols-2">
          <Card title="Setting">
            <SettingPanel
              layout={layout}
              square={square}
              onResize={(c, r) => {
                const { layout: next, offWall } = resize(layout, c, r);
                setNotice(
                  offWall ? `${offWall} ${offWall === 1 ? 'block went' : 'blocks went'} back to “Not on the wall”.` : null,
                );
                update(next);
              }}
              onChange={(patch) => update({ ...layout, ...patch })}
              onAlternate={(on) => update(setAlternate(layout, on))}
            />
          </Card>
          <Card title="Finishing">
            <FinishingList plan={plan} />
          </Card>
        </div>

        <KeepAndShare
          swapId={swapId}
          swapTitle={initial.swap.title}
          picture={picture}
          shareText={`My design wall for ${initial.swap.title}: ${sizeText(plan.finished)} finished.`}
          onPrint={() => void print()}
        />
      </div>

      <DragOverlay>
        {dragging !== null && byId.get(dragging) ? (
          <span className="block h-24 w-24 shadow-lg ring-2 ring-indigo">
            <TileFace
              block={byId.get(dragging) as DesignBlockDto}
              rotation={layout.cells[indexOfBlock(layout, dragging)]?.rotation ?? 0}
              shapes={shapes}
              valueView={valueView}
              greyUrl={greyUrls.get(dragging)}
            />
          </span>
        ) : null}
      </DragOverlay>

      <PrintPlan title={initial.swap.title} layout={layout} plan={plan} printUrl={printUrl} />
    </DndContext>
  );
}
