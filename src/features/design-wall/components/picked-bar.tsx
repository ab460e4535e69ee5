import type { DesignBlockDto } from '@shared/schemas/designs';
import { Button } from '@/components/ui/button';
import { indexOfBlock, takeOff, togglePin, turn, type Layout } from '../lib/layout';
import { blockLabel } from './wall-board';

interface PickedBarProps {
  layout: Layout;
  picked: number | null;
  byId: Map<number, DesignBlockDto>;
  square: boolean;
  update: (next: Layout, message?: string) => void;
  onDone: () => void;
}

/** Buttons for the tile in hand, for those who tap rather than drag or use keys. */
export function PickedBar({ layout, picked, byId, square, update, onDone }: PickedBarProps) {
  if (picked === null) return null;
  const pickedIndex = indexOfBlock(layout, picked);
  const pickedCell = pickedIndex >= 0 ? layout.cells[pickedIndex] : undefined;
  if (pickedCell && pickedCell.blockId !== null) {
    return (
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
          <Button variant="secondary" onClick={() => (update(takeOff(layout, pickedIndex), 'Taken off the wall.'), onDone())}>
            Take off the wall
          </Button>
        )}
        <Button variant="quiet" onClick={onDone}>
          Done
        </Button>
      </div>
    );
  }
  if (pickedIndex >= 0) return null;
  return (
    <div className="flex flex-wrap items-center gap-2 rounded-lg bg-madder/8 p-3 ring-1 ring-madder">
      <p className="font-semibold">Placing {blockLabel(byId.get(picked))}: tap a cell on the wall.</p>
      <Button variant="quiet" onClick={onDone}>
        Cancel
      </Button>
    </div>
  );
}
