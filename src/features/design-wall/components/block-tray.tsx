import { useDraggable, useDroppable } from '@dnd-kit/core';
import type { DesignBlockDto } from '@shared/schemas/designs';
import type { Shape } from '../lib/block-drawing';
import { blockLabel } from './wall-board';
import { TileFace } from './tile-face';

function TrayTile({
  block,
  shapes,
  picked,
  valueView,
  greyUrl,
  onPick,
}: {
  block: DesignBlockDto;
  shapes: Shape[];
  picked: boolean;
  valueView: boolean;
  greyUrl?: string;
  onPick: () => void;
}) {
  const { setNodeRef, listeners, isDragging } = useDraggable({ id: `block-${block.id}`, data: { blockId: block.id } });
  return (
    <li className="w-24">
      <button
        type="button"
        ref={setNodeRef}
        {...listeners}
        aria-pressed={picked}
        aria-label={`${blockLabel(block)}, not on the wall${picked ? ', picked up' : ''}`}
        onClick={onPick}
        className={`block aspect-square w-24 touch-manipulation ring-1 ring-walnut/20 focus-visible:outline-4 focus-visible:outline-indigo ${picked ? 'outline-4 outline-madder' : ''} ${isDragging ? 'opacity-40' : ''}`}
      >
        <TileFace block={block} rotation={0} shapes={shapes} valueView={valueView} greyUrl={greyUrl} />
      </button>
      <p className="mt-1 text-sm leading-tight">
        Block {block.sequence} · {block.maker.displayName}
        {block.own ? ' (yours)' : ''}
      </p>
    </li>
  );
}

/** Blocks not on the wall; dropping a tile here takes it off the wall. */
export function BlockTray(props: {
  blocks: DesignBlockDto[];
  shapes: Shape[];
  picked: number | null;
  valueView: boolean;
  greyUrls: Map<number, string>;
  onPick: (blockId: number) => void;
}) {
  const { setNodeRef, isOver } = useDroppable({ id: 'tray' });
  return (
    <section
      aria-labelledby="tray-title"
      ref={setNodeRef}
      className={`rounded-card border-2 border-dashed p-4 ${isOver ? 'border-indigo bg-indigo/5' : 'border-walnut/25'}`}
    >
      <h3 id="tray-title" className="text-xl font-semibold">
        Not on the wall ({props.blocks.length})
      </h3>
      {props.blocks.length === 0 ? (
        <p className="text-walnut-soft">
          Every block is on the wall. Drag a tile here (or pick it up and choose “Take off the wall”) to set it aside.
        </p>
      ) : (
        <ul className="mt-3 flex flex-wrap gap-3">
          {props.blocks.map((b) => (
            <TrayTile
              key={b.id}
              block={b}
              shapes={props.shapes}
              picked={props.picked === b.id}
              valueView={props.valueView}
              greyUrl={props.greyUrls.get(b.id)}
              onPick={() => props.onPick(b.id)}
            />
          ))}
        </ul>
      )}
    </section>
  );
}
