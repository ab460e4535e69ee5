/** Pure changes to a design-wall layout; the page keeps one working copy and saves it. */
import {
  isPlainCell,
  MAX_DESIGN_SIDE,
  type DesignCell,
  type DesignDto,
  type DesignInput,
  type Rotation,
} from '@shared/schemas/designs';

export interface Layout {
  columns: number;
  rows: number;
  sashing: number;
  cornerstones: boolean;
  borders: number[];
  alternate: boolean;
  cells: DesignCell[];
}

const EMPTY: DesignCell = { blockId: null, rotation: 0 };

export function layoutFrom(
  d: Pick<DesignDto, 'columns' | 'rows' | 'sashing' | 'cornerstones' | 'borders' | 'alternate' | 'cells'>,
): Layout {
  return {
    columns: d.columns,
    rows: d.rows,
    sashing: d.sashing ?? 0,
    cornerstones: d.cornerstones ?? true,
    borders: d.borders ?? [],
    alternate: d.alternate ?? false,
    cells: d.cells.map((c) => ({ ...c })),
  };
}

export function toBody(l: Layout): DesignInput {
  return {
    columns: l.columns,
    rows: l.rows,
    ...(l.sashing > 0 ? { sashing: l.sashing, cornerstones: l.cornerstones } : {}),
    ...(l.borders.length ? { borders: l.borders } : {}),
    ...(l.alternate ? { alternate: true } : {}),
    cells: l.cells.map((c) => ({ blockId: c.blockId, rotation: c.rotation, ...(c.pinned ? { pinned: true } : {}) })),
  };
}

export const isPlain = (l: Layout, i: number) => isPlainCell(i, l.columns, l.alternate);
export const indexOfBlock = (l: Layout, blockId: number) => l.cells.findIndex((c) => c.blockId === blockId);

/**
 * Puts a block in a cell. A block already on the wall trades places with the cell's block; one
 * from the tray sends the cell's block back to the tray. Plain cells and pinned tiles are left alone.
 */
export function placeBlock(l: Layout, blockId: number, to: number): Layout {
  if (to < 0 || to >= l.cells.length || isPlain(l, to)) return l;
  const target = l.cells[to]!;
  if (target.pinned && target.blockId !== blockId) return l;
  const from = indexOfBlock(l, blockId);
  if (from === to) return l;
  const cells = l.cells.map((c) => ({ ...c }));
  const moving = from >= 0 ? cells[from]! : { blockId, rotation: 0 as Rotation };
  if (from >= 0) cells[from] = target.blockId === null ? { ...EMPTY } : { ...target };
  cells[to] = { ...moving };
  return { ...l, cells };
}

export function takeOff(l: Layout, index: number): Layout {
  if (!l.cells[index] || l.cells[index]!.blockId === null) return l;
  return { ...l, cells: l.cells.map((c, i) => (i === index ? { ...EMPTY } : c)) };
}

export function turn(l: Layout, index: number, square: boolean): Layout {
  const c = l.cells[index];
  if (!c || c.blockId === null) return l;
  const step = square ? 90 : 180;
  const rotation = ((c.rotation + step) % 360) as Rotation;
  return { ...l, cells: l.cells.map((x, i) => (i === index ? { ...x, rotation } : x)) };
}

export function togglePin(l: Layout, index: number): Layout {
  const c = l.cells[index];
  if (!c || c.blockId === null) return l;
  return {
    ...l,
    cells: l.cells.map((x, i) =>
      i === index ? (x.pinned ? { blockId: x.blockId, rotation: x.rotation } : { ...x, pinned: true }) : x,
    ),
  };
}

/** New grid size: cells keep their row and column; blocks that no longer fit go back to the tray. */
export function resize(l: Layout, columns: number, rows: number): { layout: Layout; offWall: number } {
  const cells: DesignCell[] = [];
  let offWall = 0;
  for (let r = 0; r < rows; r += 1)
    for (let c = 0; c < columns; c += 1)
      cells.push(r < l.rows && c < l.columns ? { ...l.cells[r * l.columns + c]! } : { ...EMPTY });
  l.cells.forEach((cell, i) => {
    if (cell.blockId !== null && (Math.floor(i / l.columns) >= rows || i % l.columns >= columns)) offWall += 1;
  });
  const next = { ...l, columns, rows, cells };
  // A block that lands on a plain cell of a checkerboard goes back to the tray too.
  next.cells.forEach((cell, i) => {
    if (cell.blockId !== null && isPlain(next, i)) {
      next.cells[i] = { ...EMPTY };
      offWall += 1;
    }
  });
  return { layout: next, offWall };
}

/**
 * Turns the checkerboard setting on or off. On: the blocks, in reading order, move to the block
 * cells, with rows added as needed (up to the limit); pins are kept only where a block stays put.
 */
export function setAlternate(l: Layout, on: boolean): Layout {
  if (!on) return { ...l, alternate: false };
  const placed = l.cells.filter((c) => c.blockId !== null);
  let rows = l.rows;
  const blockCells = (r: number) =>
    Array.from({ length: r * l.columns }, (_, i) => i).filter((i) => !isPlainCell(i, l.columns, true));
  while (blockCells(rows).length < placed.length && rows < MAX_DESIGN_SIDE) rows += 1;
  const cells: DesignCell[] = Array.from({ length: rows * l.columns }, () => ({ ...EMPTY }));
  blockCells(rows).forEach((cellIndex, k) => {
    const c = placed[k];
    if (c)
      cells[cellIndex] = {
        blockId: c.blockId,
        rotation: c.rotation,
        ...(c.pinned && l.cells[cellIndex]?.blockId === c.blockId ? { pinned: true } : {}),
      };
  });
  return { ...l, alternate: true, rows, cells };
}

/** Blocks not on the wall, in the order given. */
export function trayBlocks<T extends { id: number }>(l: Layout, blocks: T[]): T[] {
  const placed = new Set(l.cells.flatMap((c) => (c.blockId === null ? [] : [c.blockId])));
  return blocks.filter((b) => !placed.has(b.id));
}
