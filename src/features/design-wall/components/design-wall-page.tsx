import { useEffect, useMemo, useRef, useState, type KeyboardEvent } from 'react';
import { useParams } from 'react-router';
import {
  DndContext,
  DragOverlay,
  MouseSensor,
  TouchSensor,
  useSensor,
  useSensors,
  type DragEndEvent,
  type DragStartEvent,
} from '@dnd-kit/core';
import { finishingPlan } from '@shared/design/finishing-plan';
import { isPlainCell, type DesignBlockDto, type DesignDto } from '@shared/schemas/designs';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { EmptyState, Loading, QueryError } from '@/components/ui/page';
import { ApiError } from '@/lib/api-client';
import { useDesign } from '../api/get-design';
import { useSaveDesign } from '../api/save-design';
import { useArrangeDesign } from '../api/arrange-design';
import { useShareToChat } from '../api/share-to-chat';
import { useGreyPhotos } from '../hooks/use-grey-photos';
import { blockShapes } from '../lib/block-drawing';
import { len, sizeText } from '../lib/format';
import {
  indexOfBlock,
  isPlain,
  layoutFrom,
  placeBlock,
  resize,
  setAlternate,
  takeOff,
  toBody,
  togglePin,
  trayBlocks,
  turn,
  type Layout,
} from '../lib/layout';
import { canvasBlob, renderWall } from '../lib/render-wall';
import { BlockTray } from './block-tray';
import { FinishingList } from './finishing-list';
import { SettingPanel } from './setting-panel';
import { TileFace } from './tile-face';
import { blockLabel, WallBoard } from './wall-board';

type SaveState =
  | { kind: 'idle' }
  | { kind: 'pending' }
  | { kind: 'saving' }
  | { kind: 'saved'; at: string }
  | { kind: 'error'; message: string };
const AUTOSAVE_MS = 800;

export function DesignWallPage() {
  const swapId = Number(useParams().swapId);
  const design = useDesign(swapId);
  if (design.isPending) return <Loading label="Loading your design wall…" />;
  if (design.isError) return <QueryError error={design.error} what="your design wall" />;
  return <DesignWall key={swapId} swapId={swapId} initial={design.data} />;
}

function DesignWall({ swapId, initial }: { swapId: number; initial: DesignDto }) {
  const [layout, setLayout] = useState<Layout>(() => layoutFrom(initial));
  const [picked, setPicked] = useState<number | null>(null);
  const [dragging, setDragging] = useState<number | null>(null);
  const [valueView, setValueView] = useState(false);
  const [announce, setAnnounce] = useState('');
  const [notice, setNotice] = useState<string | null>(null);
  const [saveState, setSaveState] = useState<SaveState>(
    initial.savedAt ? { kind: 'saved', at: initial.savedAt } : { kind: 'idle' },
  );
  const [spread, setSpread] = useState<{ score: number; before: number; previous: Layout['cells']; moved: boolean } | null>(null);
  const [printUrl, setPrintUrl] = useState<string | null>(null);
  const [shared, setShared] = useState<string | null>(null);
  const cellRefs = useRef<(HTMLButtonElement | null)[]>([]);
  const changed = useRef(false);

  const save = useSaveDesign(swapId);
  const arrange = useArrangeDesign(swapId);
  const share = useShareToChat(swapId);
  const blocks = initial.blocks;
  const byId = useMemo(() => new Map(blocks.map((b) => [b.id, b])), [blocks]);
  const shapes = useMemo(() => blockShapes(initial.block.spec), [initial.block.spec]);
  const greyUrls = useGreyPhotos(blocks, valueView);
  const square = initial.block.finished.width === initial.block.finished.height;
  const tray = trayBlocks(layout, blocks);

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

  // Save a moment after the last change; a failed save keeps the layout on screen and says so.
  const saveNow = () => {
    setSaveState({ kind: 'saving' });
    save.mutate(toBody(layout), {
      onSuccess: (d) => setSaveState({ kind: 'saved', at: d.savedAt ?? new Date().toISOString() }),
      onError: (e) =>
        setSaveState({ kind: 'error', message: e instanceof ApiError ? e.message : 'The layout could not be saved.' }),
    });
  };
  useEffect(() => {
    if (!changed.current) return;
    const timer = setTimeout(saveNow, AUTOSAVE_MS);
    return () => clearTimeout(timer);
    // saveNow reads the latest layout
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [layout]);

  const update = (next: Layout, message?: string) => {
    if (next === layout) return;
    changed.current = true;
    setLayout(next);
    setSaveState({ kind: 'pending' });
    if (message) setAnnounce(message);
  };

  const where = (i: number) => `row ${Math.floor(i / layout.columns) + 1}, column ${(i % layout.columns) + 1}`;
  const drop = (blockId: number, to: number) => {
    const target = layout.cells[to]!;
    if (isPlain(layout, to)) return setAnnounce('That cell holds a plain block; choose another.');
    if (target.pinned && target.blockId !== blockId) return setAnnounce('That tile is pinned; unpin it first to move it.');
    update(placeBlock(layout, blockId, to), `${blockLabel(byId.get(blockId))} put in ${where(to)}.`);
    setPicked(null);
  };

  const onActivate = (i: number) => {
    const cell = layout.cells[i]!;
    if (picked !== null) {
      if (cell.blockId === picked) {
        setPicked(null);
        return setAnnounce('Put down where it was.');
      }
      return drop(picked, i);
    }
    if (cell.blockId !== null) {
      setPicked(cell.blockId);
      setAnnounce(
        `Picked up ${blockLabel(byId.get(cell.blockId))}. Move with the arrow keys and press Enter to put it down, or tap a cell. Escape cancels.`,
      );
    }
  };

  const onKey = (i: number, e: KeyboardEvent<HTMLButtonElement>) => {
    const moves: Record<string, number> = { ArrowLeft: -1, ArrowRight: 1, ArrowUp: -layout.columns, ArrowDown: layout.columns };
    if (e.key in moves) {
      e.preventDefault();
      const col = i % layout.columns;
      if ((e.key === 'ArrowLeft' && col === 0) || (e.key === 'ArrowRight' && col === layout.columns - 1)) return;
      let j = i + moves[e.key]!;
      // Skip plain cells of a checkerboard: nothing can go there.
      while (j >= 0 && j < layout.cells.length && isPlain(layout, j)) j += moves[e.key]!;
      if (j < 0 || j >= layout.cells.length) return;
      cellRefs.current[j]?.focus();
      if (picked !== null) setAnnounce(`Over ${where(j)}.`);
      return;
    }
    const cell = layout.cells[i]!;
    if (e.key === 'Escape' && picked !== null) {
      setPicked(null);
      setAnnounce('Move cancelled.');
    } else if ((e.key === 'r' || e.key === 'R') && cell.blockId !== null) {
      update(turn(layout, i, square), `Turned to ${(cell.rotation + (square ? 90 : 180)) % 360}°.`);
    } else if ((e.key === 'p' || e.key === 'P') && cell.blockId !== null) {
      update(togglePin(layout, i), cell.pinned ? 'Unpinned.' : 'Pinned: spreading the colours will leave it here.');
    } else if ((e.key === 'Delete' || e.key === 'Backspace') && cell.blockId !== null && !cell.pinned) {
      update(takeOff(layout, i), `${blockLabel(byId.get(cell.blockId))} taken off the wall.`);
      setPicked(null);
    }
  };

  const sensors = useSensors(
    useSensor(MouseSensor, { activationConstraint: { distance: 6 } }),
    useSensor(TouchSensor, { activationConstraint: { delay: 180, tolerance: 8 } }),
  );
  const onDragStart = (e: DragStartEvent) => setDragging((e.active.data.current?.blockId as number | undefined) ?? null);
  const onDragEnd = (e: DragEndEvent) => {
    setDragging(null);
    const blockId = e.active.data.current?.blockId as number | undefined;
    if (blockId === undefined || !e.over) return;
    if (e.over.id === 'tray') {
      const from = indexOfBlock(layout, blockId);
      if (from >= 0 && !layout.cells[from]!.pinned)
        update(takeOff(layout, from), `${blockLabel(byId.get(blockId))} taken off the wall.`);
      return;
    }
    const to = e.over.data.current?.index as number | undefined;
    if (to !== undefined) drop(blockId, to);
  };

  const pickedIndex = picked === null ? -1 : indexOfBlock(layout, picked);
  const pickedCell = pickedIndex >= 0 ? layout.cells[pickedIndex] : undefined;

  const runSpread = () => {
    setSpread(null);
    arrange.mutate(toBody(layout), {
      onSuccess: (r) => {
        const moved = r.cells.some((c, i) => c.blockId !== layout.cells[i]?.blockId);
        setSpread({ score: r.score, before: r.before, previous: layout.cells, moved });
        if (moved) update({ ...layout, cells: r.cells }, 'Blocks rearranged to spread the colours.');
        else setAnnounce('The blocks stay where they are.');
      },
    });
  };

  const picture = () => renderWall({ layout, blocks, spec: initial.block.spec, block: initial.block.finished, valueView });
  const download = async () => {
    const blob = await canvasBlob(await picture());
    const a = document.createElement('a');
    a.href = URL.createObjectURL(blob);
    a.download = `design-wall-${initial.swap.title.replace(/[^\w-]+/g, '-').slice(0, 40)}.png`;
    a.click();
    setTimeout(() => URL.revokeObjectURL(a.href), 10_000);
  };
  const print = async () => setPrintUrl((await picture()).toDataURL('image/png'));
  useEffect(() => {
    if (!printUrl) return;
    const t = setTimeout(() => window.print(), 100);
    return () => clearTimeout(t);
  }, [printUrl]);
  const shareNow = async () => {
    setShared(null);
    const blob = await canvasBlob(await picture());
    share.mutate(
      { picture: blob, text: `My design wall for ${initial.swap.title}: ${sizeText(plan.finished)} finished.` },
      { onSuccess: () => setShared('Shared to the swap chat as a photo.') },
    );
  };

  return (
    <DndContext sensors={sensors} onDragStart={onDragStart} onDragEnd={onDragEnd} onDragCancel={() => setDragging(null)}>
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
          <p role="status" className="font-semibold">
            {(saveState.kind === 'saving' || saveState.kind === 'pending') && 'Saving…'}
            {saveState.kind === 'saved' &&
              `✓ Saved ${new Date(saveState.at).toLocaleTimeString([], { hour: '2-digit', minute: '2-digit' })}`}
            {saveState.kind === 'idle' && 'Not saved yet: changes save by themselves.'}
          </p>
        </div>
        {saveState.kind === 'error' && (
          <Alert tone="error" title="Your last change is not saved yet.">
            {saveState.message} Your layout stays on this page.{' '}
            <Button variant="quiet" onClick={saveNow}>
              Try again
            </Button>
          </Alert>
        )}
        {blocks.length === 0 && (
          <EmptyState title="No blocks to lay out yet.">
            The wall fills with the blocks returned to you once the coordinator confirms the return, and with blocks you made for
            this swap.
          </EmptyState>
        )}
        <p className="sr-only" aria-live="assertive">
          {announce}
        </p>

        <div className="flex flex-wrap items-center gap-3">
          <label className="flex min-h-11 items-center gap-3 rounded-lg bg-card px-3 ring-1 ring-walnut/20">
            <input
              type="checkbox"
              role="switch"
              className="h-6 w-6 accent-indigo"
              checked={valueView}
              onChange={(e) => setValueView(e.target.checked)}
            />
            <span className="font-semibold">Value view (lightness only)</span>
          </label>
          <Button onClick={runSpread} pending={arrange.isPending} pendingLabel="Spreading…" disabled={blocks.length < 2}>
            Spread the colours
          </Button>
          {spread?.moved && (
            <Button
              variant="secondary"
              onClick={() => (update({ ...layout, cells: spread.previous }, 'Arrangement put back.'), setSpread(null))}
            >
              Undo the spread
            </Button>
          )}
        </div>
        {valueView && (
          <p className="text-base text-walnut-soft">
            Each tile shows its mean lightness, CIE L*: 0 is black, 100 is white; under 35 reads dark, over 65 light. Tiles of
            blocks without a photo show the swap’s drawing.
          </p>
        )}
        {arrange.isError && (
          <Alert tone="error">
            {arrange.error instanceof ApiError ? arrange.error.message : 'The blocks could not be rearranged.'}
          </Alert>
        )}
        {spread && <SpreadResult score={spread.score} before={spread.before} />}

        {pickedCell && pickedCell.blockId !== null && (
          <div className="flex flex-wrap items-center gap-2 rounded-lg bg-madder/8 p-3 ring-1 ring-madder">
            <p className="w-full font-semibold">Moving {blockLabel(byId.get(pickedCell.blockId))}: tap a cell to put it there.</p>
            <Button variant="secondary" onClick={() => update(turn(layout, pickedIndex, square), 'Turned.')}>
              Turn {square ? '90°' : '180°'}
            </Button>
            <Button
              variant="secondary"
              onClick={() => update(togglePin(layout, pickedIndex), pickedCell.pinned ? 'Unpinned.' : 'Pinned.')}
            >
              {pickedCell.pinned ? 'Unpin' : 'Pin here'}
            </Button>
            {!pickedCell.pinned && (
              <Button
                variant="secondary"
                onClick={() => (update(takeOff(layout, pickedIndex), 'Taken off the wall.'), setPicked(null))}
              >
                Take off the wall
              </Button>
            )}
            <Button variant="quiet" onClick={() => setPicked(null)}>
              Done
            </Button>
          </div>
        )}
        {picked !== null && pickedIndex < 0 && (
          <div className="flex flex-wrap items-center gap-2 rounded-lg bg-madder/8 p-3 ring-1 ring-madder">
            <p className="font-semibold">Placing {blockLabel(byId.get(picked))}: tap a cell on the wall.</p>
            <Button variant="quiet" onClick={() => setPicked(null)}>
              Cancel
            </Button>
          </div>
        )}
        {notice && <Alert tone="warning">{notice}</Alert>}

        <WallBoard
          layout={layout}
          block={initial.block.finished}
          blocks={byId}
          shapes={shapes}
          valueView={valueView}
          greyUrls={greyUrls}
          picked={picked}
          onActivate={onActivate}
          onKey={onKey}
          registerCell={(i, node) => {
            cellRefs.current[i] = node;
          }}
        />
        <p className="text-base text-walnut-soft">
          Finished {sizeText(plan.finished)}. Colours of the setting are stand-ins, named beside each setting; the blocks are your
          photos.
        </p>

        <BlockTray
          blocks={tray}
          shapes={shapes}
          picked={picked}
          valueView={valueView}
          greyUrls={greyUrls}
          onPick={(id) => {
            setPicked(picked === id ? null : id);
            setAnnounce(picked === id ? 'Put back.' : `Picked up ${blockLabel(byId.get(id))}. Choose a cell on the wall.`);
            if (picked !== id) cellRefs.current.find((c) => c)?.focus();
          }}
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

        <Card title="Keep and share">
          <div className="flex flex-wrap gap-3">
            <Button variant="secondary" onClick={() => void print()}>
              Print a one-page plan
            </Button>
            <Button variant="secondary" onClick={() => void download()}>
              Download as a picture (PNG)
            </Button>
            <Button variant="secondary" onClick={() => void shareNow()} pending={share.isPending} pendingLabel="Sharing…">
              Share to the swap chat
            </Button>
          </div>
          {shared && <p className="mt-2 font-semibold text-lichen-deep">✓ {shared}</p>}
          {share.isError && (
            <Alert tone="error">
              {share.error instanceof ApiError ? share.error.message : 'The picture could not be shared.'}
            </Alert>
          )}
        </Card>
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

      <section className="hidden print:block" aria-hidden="true">
        <h1 className="text-2xl font-bold">{initial.swap.title}: design wall</h1>
        <p>
          Finished top {sizeText(plan.finished)} · {layout.columns} × {layout.rows} blocks
          {layout.sashing > 0 ? `, ${len(layout.sashing)} sashing` : ''}
          {layout.borders.length ? `, ${layout.borders.length} ${layout.borders.length === 1 ? 'border' : 'borders'}` : ''}
        </p>
        {printUrl && <img src={printUrl} alt="" className="my-2 max-h-[55vh] w-auto" />}
        <FinishingList plan={plan} compact />
      </section>
    </DndContext>
  );
}

function SpreadResult({ score, before }: { score: number; before: number }) {
  if (score === 0 && before === 0) {
    return (
      <Alert tone="info">None of the neighbouring blocks has a photo with colours yet, so there was nothing to spread.</Alert>
    );
  }
  const better = score > before + 0.005;
  return (
    <Alert tone={better ? 'success' : 'info'} title={better ? 'Colours spread out.' : 'Already well spread.'}>
      {better
        ? `The two most alike neighbours now differ by ${score.toFixed(1)}, up from ${before.toFixed(1)}${before > 0 ? ` (${(score / before).toFixed(1)} times as far apart)` : ''}.`
        : `No arrangement we tried keeps neighbours further apart: the most alike neighbours differ by ${score.toFixed(1)}.`}{' '}
      Colour difference in CIEDE2000 units: about 1 is the smallest step most eyes notice; 10 and more reads as clearly different.
    </Alert>
  );
}
