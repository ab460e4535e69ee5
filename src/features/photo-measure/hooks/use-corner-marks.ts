import { useCallback, useState } from 'react';
import type { Point, Quad } from '@shared/quilt';
import { CORNER_NAMES } from '@shared/schemas/photo-estimates';

/** Eight marks: the reference square's corners (0–3), then the block's (4–7), each TL, TR, BR, BL. */
export const MARKS = [
  ...CORNER_NAMES.map((corner) => ({ group: 'reference' as const, corner, label: `reference ${corner}` })),
  ...CORNER_NAMES.map((corner) => ({ group: 'block' as const, corner, label: `block ${corner}` })),
];

export type Marks = (Point | null)[];

export interface CornerMarks {
  points: Marks;
  /** the next mark a tap places, or null when all eight are placed */
  next: number | null;
  selected: number | null;
  select(index: number | null): void;
  place(p: Point): void;
  move(index: number, p: Point): void;
  nudge(index: number, dx: number, dy: number): void;
  /** Puts every unplaced mark at a starting spot, to be dragged or nudged into place. */
  placeRest(): void;
  load(reference: Quad, block: Quad): void;
  clear(): void;
  quads: { reference: Quad; block: Quad } | null;
}

const empty = (): Marks => Array.from({ length: 8 }, () => null);

/** The marks on a photo of `width` × `height` pixels; every mark stays on the photo. */
export function useCornerMarks(width: number, height: number): CornerMarks {
  const [points, setPoints] = useState<Marks>(empty);
  const [selected, select] = useState<number | null>(null);
  const clamp = useCallback(
    ([x, y]: Point): Point => [Math.min(width, Math.max(0, x)), Math.min(height, Math.max(0, y))],
    [width, height],
  );
  const next = points.findIndex((p) => p === null);

  const set = (index: number, p: Point) => setPoints((old) => old.map((q, i) => (i === index ? clamp(p) : q)));

  const placeRest = () => {
    // A square on the left third and a larger one on the right: roughly where people lay them out.
    const s = Math.min(width, height);
    const square = (cx: number, cy: number, side: number): Point[] => [
      [cx - side / 2, cy - side / 2],
      [cx + side / 2, cy - side / 2],
      [cx + side / 2, cy + side / 2],
      [cx - side / 2, cy + side / 2],
    ];
    const start = [...square(width * 0.25, height / 2, s * 0.3), ...square(width * 0.65, height / 2, s * 0.5)];
    setPoints((old) => old.map((q, i) => q ?? clamp(start[i]!)));
  };

  const complete = points.every((p) => p !== null);
  return {
    points,
    next: next === -1 ? null : next,
    selected,
    select,
    place: (p) => {
      if (next === -1) return;
      set(next, p);
      select(next);
    },
    move: set,
    nudge: (index, dx, dy) => {
      const p = points[index];
      if (p) set(index, [p[0] + dx, p[1] + dy]);
    },
    placeRest,
    load: (reference, block) => setPoints([...reference, ...block].map(clamp)),
    clear: () => {
      setPoints(empty());
      select(null);
    },
    quads: complete ? { reference: points.slice(0, 4) as Quad, block: points.slice(4) as Quad } : null,
  };
}
