import { useRef, useState, type KeyboardEvent } from 'react';
import { MouseSensor, TouchSensor, useSensor, useSensors, type DragEndEvent, type DragStartEvent } from '@dnd-kit/core';
import type { DesignBlockDto } from '@shared/schemas/designs';
import { indexOfBlock, isPlain, placeBlock, takeOff, togglePin, turn, type Layout } from '../lib/layout';
import { blockLabel } from '../components/wall-board';

interface WallMovesInput {
  layout: Layout;
  /** Applies a layout and, when it changed, says `message` to screen readers. */
  update: (next: Layout, message?: string) => void;
  announce: (message: string) => void;
  byId: Map<number, DesignBlockDto>;
  square: boolean;
}

/**
 * Picking up, moving and putting down tiles three ways — tap then tap, the keyboard (Enter, arrows,
 * R, P, Delete, Escape) and drag and drop — with each step said aloud.
 */
export function useWallMoves({ layout, update, announce, byId, square }: WallMovesInput) {
  const [picked, setPicked] = useState<number | null>(null);
  const [dragging, setDragging] = useState<number | null>(null);
  const cellRefs = useRef<(HTMLButtonElement | null)[]>([]);

  const where = (i: number) => `row ${Math.floor(i / layout.columns) + 1}, column ${(i % layout.columns) + 1}`;
  const drop = (blockId: number, to: number) => {
    const target = layout.cells[to]!;
    if (isPlain(layout, to)) return announce('That cell holds a plain block; choose another.');
    if (target.pinned && target.blockId !== blockId) return announce('That tile is pinned; unpin it first to move it.');
    update(placeBlock(layout, blockId, to), `${blockLabel(byId.get(blockId))} put in ${where(to)}.`);
    setPicked(null);
  };

  const onActivate = (i: number) => {
    const cell = layout.cells[i]!;
    if (picked !== null) {
      if (cell.blockId === picked) {
        setPicked(null);
        return announce('Put down where it was.');
      }
      return drop(picked, i);
    }
    if (cell.blockId !== null) {
      setPicked(cell.blockId);
      announce(
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
      if (picked !== null) announce(`Over ${where(j)}.`);
      return;
    }
    const cell = layout.cells[i]!;
    if (e.key === 'Escape' && picked !== null) {
      setPicked(null);
      announce('Move cancelled.');
    } else if ((e.key === 'r' || e.key === 'R') && cell.blockId !== null) {
      update(turn(layout, i, square), `Turned to ${(cell.rotation + (square ? 90 : 180)) % 360}°.`);
    } else if ((e.key === 'p' || e.key === 'P') && cell.blockId !== null) {
      update(togglePin(layout, i), cell.pinned ? 'Unpinned.' : 'Pinned: spreading the colours will leave it here.');
    } else if ((e.key === 'Delete' || e.key === 'Backspace') && cell.blockId !== null && !cell.pinned) {
      update(takeOff(layout, i), `${blockLabel(byId.get(cell.blockId))} taken off the wall.`);
      setPicked(null);
    }
  };

  /** A tile of the tray: picked up (or put back), and the wall focused so the arrows can move it. */
  const onPickFromTray = (id: number) => {
    setPicked(picked === id ? null : id);
    announce(picked === id ? 'Put back.' : `Picked up ${blockLabel(byId.get(id))}. Choose a cell on the wall.`);
    if (picked !== id) cellRefs.current.find((c) => c)?.focus();
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

  return {
    picked,
    setPicked,
    dragging,
    onActivate,
    onKey,
    onPickFromTray,
    registerCell: (i: number, node: HTMLButtonElement | null) => {
      cellRefs.current[i] = node;
    },
    dnd: { sensors, onDragStart, onDragEnd, onDragCancel: () => setDragging(null) },
  };
}
