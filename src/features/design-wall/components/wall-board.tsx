import type { CSSProperties, KeyboardEvent, ReactNode } from 'react';
import { useDraggable, useDroppable } from '@dnd-kit/core';
import type { DesignBlockDto, DesignCell } from '@shared/schemas/designs';
import type { Shape } from '../lib/block-drawing';
import { isPlain, type Layout } from '../lib/layout';
import { borderColour, SETTING_COLOURS } from '../lib/palette';
import { greyOf } from '../lib/value-view';
import { TileFace } from './tile-face';

export interface BoardProps {
  layout: Layout;
  block: { width: number; height: number };
  blocks: Map<number, DesignBlockDto>;
  shapes: Shape[];
  valueView: boolean;
  greyUrls: Map<number, string>;
  /** the block picked up to move (by tap or keyboard) */
  picked: number | null;
  onActivate: (index: number) => void;
  onKey: (index: number, event: KeyboardEvent<HTMLButtonElement>) => void;
  registerCell: (index: number, node: HTMLButtonElement | null) => void;
}

export function blockLabel(b: DesignBlockDto | undefined): string {
  if (!b) return 'a block';
  return `block ${b.sequence} by ${b.maker.displayName}${b.own ? ' (yours)' : ''}`;
}

export function cellLabel(layout: Layout, index: number, cell: DesignCell, b: DesignBlockDto | undefined): string {
  const where = `Row ${Math.floor(index / layout.columns) + 1}, column ${(index % layout.columns) + 1}`;
  if (isPlain(layout, index)) return `${where}: plain alternate block`;
  if (cell.blockId === null) return `${where}: empty`;
  return `${where}: ${blockLabel(b)}${cell.rotation ? `, turned ${cell.rotation}°` : ''}${cell.pinned ? ', pinned' : ''}`;
}

function Cell({ index, cell, props, style }: { index: number; cell: DesignCell; props: BoardProps; style: CSSProperties }) {
  const { layout, blocks, picked, valueView } = props;
  const plain = isPlain(layout, index);
  const b = cell.blockId === null ? undefined : blocks.get(cell.blockId);
  const { setNodeRef: setDropRef, isOver } = useDroppable({ id: `cell-${index}`, disabled: plain, data: { index } });
  const {
    setNodeRef: setDragRef,
    listeners,
    isDragging,
  } = useDraggable({
    id: `block-${cell.blockId ?? `none-${index}`}`,
    disabled: cell.blockId === null || Boolean(cell.pinned),
    data: { blockId: cell.blockId },
  });
  if (plain) {
    return (
      <div
        role="img"
        aria-label={cellLabel(layout, index, cell, b)}
        style={{ ...style, background: valueView ? greyOf(SETTING_COLOURS.plain.hex) : SETTING_COLOURS.plain.hex }}
        className="flex items-center justify-center ring-1 ring-walnut/15"
      >
        <span className="text-sm text-walnut-soft">Plain</span>
      </div>
    );
  }
  const isPicked = cell.blockId !== null && cell.blockId === picked;
  return (
    <div ref={setDropRef} style={style} className={`relative min-h-11 ${isOver ? 'outline-4 outline-indigo' : ''}`}>
      <button
        type="button"
        ref={(node) => {
          setDragRef(node);
          props.registerCell(index, node);
        }}
        {...(cell.blockId !== null ? listeners : {})}
        aria-label={cellLabel(layout, index, cell, b)}
        aria-pressed={isPicked}
        data-cell={index}
        onClick={() => props.onActivate(index)}
        onKeyDown={(e) => props.onKey(index, e)}
        className={`block h-full w-full touch-manipulation focus-visible:outline-4 focus-visible:outline-offset-2 focus-visible:outline-indigo ${
          cell.blockId === null ? 'border-2 border-dashed border-walnut/40 bg-white/70' : ''
        } ${isPicked ? 'outline-4 outline-madder' : ''} ${isDragging ? 'opacity-40' : ''}`}
      >
        {b ? (
          <TileFace
            block={b}
            rotation={cell.rotation}
            shapes={props.shapes}
            valueView={valueView}
            greyUrl={props.greyUrls.get(b.id)}
          />
        ) : (
          <span className="text-sm text-walnut-soft">{picked !== null ? 'Put here' : 'Empty'}</span>
        )}
        {cell.pinned && <span className="absolute top-0 left-0 bg-card/90 px-1 text-sm font-semibold text-walnut">Pinned</span>}
        {isPicked && <span className="absolute top-0 right-0 bg-madder px-1 text-sm font-semibold text-white">Moving</span>}
      </button>
    </div>
  );
}

/** The quilt top to scale: borders, sashing and cornerstones around a grid of cells. */
export function WallBoard(props: BoardProps) {
  const { layout: l, block, valueView } = props;
  const s = l.sashing;
  const borderTotal = l.borders.reduce((a, b) => a + b, 0);
  const centreW = l.columns * block.width + (l.columns + 1) * s;
  const centreH = l.rows * block.height + (l.rows + 1) * s;
  const W = centreW + 2 * borderTotal;
  const H = centreH + 2 * borderTotal;
  const paint = (hex: string) => (valueView ? greyOf(hex) : hex);
  const track = (n: number, size: number) =>
    s > 0 ? [`${s}fr`, ...Array.from({ length: n }, () => [`${size}fr`, `${s}fr`]).flat()].join(' ') : `repeat(${n}, 1fr)`;
  const insets = l.borders.map((_, i) => l.borders.slice(0, i).reduce((a, b) => a + b, 0));
  const borderLayers = insets.map((inset, i) => (
    <div
      key={i}
      aria-hidden="true"
      className="absolute"
      style={{
        left: `${(inset / W) * 100}%`,
        right: `${(inset / W) * 100}%`,
        top: `${(inset / H) * 100}%`,
        bottom: `${(inset / H) * 100}%`,
        background: paint(borderColour(i).hex),
      }}
    />
  ));
  const extras: ReactNode[] = [];
  if (s > 0) {
    for (let r = 0; r <= 2 * l.rows; r += 1) {
      for (let c = 0; c <= 2 * l.columns; c += 1) {
        const sashRow = r % 2 === 0;
        const sashCol = c % 2 === 0;
        if (!sashRow && !sashCol) continue;
        const corner = sashRow && sashCol;
        const colour = corner && l.cornerstones ? SETTING_COLOURS.cornerstones.hex : SETTING_COLOURS.sashing.hex;
        extras.push(
          <div key={`s${r}-${c}`} aria-hidden="true" style={{ gridRow: r + 1, gridColumn: c + 1, background: paint(colour) }} />,
        );
      }
    }
  }
  return (
    <div className="overflow-x-auto pb-2">
      <div
        className="relative mx-auto w-full max-w-3xl"
        style={{ aspectRatio: `${W} / ${H}`, minWidth: `${Math.max(l.columns * 48, 280)}px` }}
      >
        {borderLayers}
        <div
          role="group"
          aria-label={`Design wall: ${l.rows} rows of ${l.columns} cells`}
          className={`absolute grid ${s > 0 ? '' : 'gap-0.5 bg-walnut/20'}`}
          style={{
            left: `${(borderTotal / W) * 100}%`,
            right: `${(borderTotal / W) * 100}%`,
            top: `${(borderTotal / H) * 100}%`,
            bottom: `${(borderTotal / H) * 100}%`,
            gridTemplateColumns: track(l.columns, block.width),
            gridTemplateRows: track(l.rows, block.height),
          }}
        >
          {extras}
          {l.cells.map((cell, i) => {
            const r = Math.floor(i / l.columns);
            const c = i % l.columns;
            const style: CSSProperties =
              s > 0 ? { gridRow: 2 * r + 2, gridColumn: 2 * c + 2 } : { gridRow: r + 1, gridColumn: c + 1 };
            return <Cell key={i} index={i} cell={cell} props={props} style={style} />;
          })}
        </div>
      </div>
    </div>
  );
}
