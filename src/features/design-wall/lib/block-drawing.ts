/**
 * The swap's block drawn as plain shapes (finished size, no seam allowance) for tiles of blocks
 * without a photo, in the dye colours of the app's palette. Used by the SVG tile and the canvas.
 */
import { gridBlock } from '@shared/quilt';
import type { BlockSpec } from '@shared/schemas/blocks';

export interface Shape {
  /** polygon points in 0–1 of the block's width and height */
  points: [number, number][];
  fill: string;
  name: string;
}

// The dyes of the palette, in the order fabrics are named; a pale-sounding fabric gets undyed linen.
const DYES = [
  { hex: '#2f4b7c', name: 'indigo' },
  { hex: '#b5462f', name: 'madder red' },
  { hex: '#c8920f', name: 'weld yellow' },
  { hex: '#5f7a5a', name: 'lichen green' },
  { hex: '#6b3f69', name: 'plum' },
];
const UNDYED = { hex: '#ece5d6', name: 'undyed linen' };
const PALE = /light|pale|background|sky|cream|white|ivory|neutral|corner/i;

function colours(names: string[]): { hex: string; name: string }[] {
  let next = 0;
  let undyed = false;
  return names.map((n) => {
    if (PALE.test(n) && !undyed) {
      undyed = true;
      return UNDYED;
    }
    return DYES[next++ % DYES.length]!;
  });
}

const rect = (x0: number, y0: number, x1: number, y1: number): [number, number][] => [
  [x0, y0],
  [x1, y0],
  [x1, y1],
  [x0, y1],
];

/** Shapes of the block, with a colour per fabric and the fabric's name. */
export function blockShapes(spec: BlockSpec): Shape[] {
  if (spec.kind === 'grid') {
    try {
      const g = gridBlock({
        columns: spec.columns,
        rows: spec.rows,
        seam: spec.seam ?? 0.25,
        ...(spec.roles ? { roles: spec.roles } : {}),
      });
      const roles = spec.roles ? [...new Set(spec.roles.flat())] : ['light', 'dark'];
      const dye = colours(roles);
      const widths = g.patches.filter((p) => p.row === 0).map((p) => p.visibleInUnfinished.width);
      const heights = g.patches.filter((p) => p.col === 0).map((p) => p.visibleInUnfinished.height);
      const W = widths.reduce((a, b) => a + b, 0);
      const H = heights.reduce((a, b) => a + b, 0);
      const xs = [0];
      const ys = [0];
      widths.forEach((w) => xs.push(xs.at(-1)! + w / W));
      heights.forEach((h) => ys.push(ys.at(-1)! + h / H));
      return g.patches.map((p) => {
        const i = p.role ? Math.max(0, roles.indexOf(p.role)) : (p.row + p.col) % 2;
        const c = dye[i % dye.length]!;
        return { points: rect(xs[p.col]!, ys[p.row]!, xs[p.col + 1]!, ys[p.row + 1]!), fill: c.hex, name: p.role ?? c.name };
      });
    } catch {
      return [{ points: rect(0, 0, 1, 1), fill: UNDYED.hex, name: 'block' }];
    }
  }
  const [a, b] = colours(['dark', 'light']) as [{ hex: string; name: string }, { hex: string; name: string }];
  switch (spec.kind) {
    case 'hst':
      return [
        {
          points: [
            [0, 0],
            [1, 0],
            [0, 1],
          ],
          fill: a.hex,
          name: 'dark',
        },
        {
          points: [
            [1, 0],
            [1, 1],
            [0, 1],
          ],
          fill: b.hex,
          name: 'light',
        },
      ];
    case 'qst':
      return [
        {
          points: [
            [0, 0],
            [1, 0],
            [0.5, 0.5],
          ],
          fill: a.hex,
          name: 'dark',
        },
        {
          points: [
            [1, 0],
            [1, 1],
            [0.5, 0.5],
          ],
          fill: b.hex,
          name: 'light',
        },
        {
          points: [
            [1, 1],
            [0, 1],
            [0.5, 0.5],
          ],
          fill: a.hex,
          name: 'dark',
        },
        {
          points: [
            [0, 1],
            [0, 0],
            [0.5, 0.5],
          ],
          fill: b.hex,
          name: 'light',
        },
      ];
    case 'flying-geese':
      return [
        { points: rect(0, 0, 1, 1), fill: b.hex, name: 'sky' },
        {
          points: [
            [0, 1],
            [0.5, 0],
            [1, 1],
          ],
          fill: a.hex,
          name: 'goose',
        },
      ];
    case 'square-in-square':
      return [
        { points: rect(0, 0, 1, 1), fill: b.hex, name: 'corners' },
        {
          points: [
            [0.5, 0],
            [1, 0.5],
            [0.5, 1],
            [0, 0.5],
          ],
          fill: a.hex,
          name: 'centre',
        },
      ];
    default:
      return [{ points: rect(0, 0, 1, 1), fill: a.hex, name: 'block' }];
  }
}
