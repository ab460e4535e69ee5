/**
 * The design wall: a member's layout of the blocks that came back to them, its body and answers,
 * and the colour statistics of a photo.
 */
import { z } from 'zod';
import { lengthSchema } from '@shared/quilt';
import type { BlockSpec } from './blocks';
import type { FinishingPlan } from '../design/finishing-plan';

export const MAX_DESIGN_SIDE = 30;
export const MAX_BORDERS = 6;
export const MAX_SASHING = 12;
export const MAX_BORDER = 24;
export const rotations = [0, 90, 180, 270] as const;
export type Rotation = (typeof rotations)[number];

const idParam = z.coerce.number({ error: 'Expected a number.' }).int().positive('Expected a positive id.');
export const designParamsSchema = z.object({ swapId: idParam });
export const photoColourParamsSchema = z.object({ photoId: idParam });

/** A length in inches (a number, or text such as `2 1/2`), at most `max`. */
const inches = (what: string, max: number, zero: boolean) =>
  z
    .union([z.number().finite(), z.string().trim().max(40, `${what}: keep it under 40 characters.`)])
    .pipe(lengthSchema)
    .refine((x) => (zero ? x >= 0 : x > 0), { message: `${what} must be ${zero ? 'zero or more' : 'more than zero'}.` })
    .refine((x) => x <= max, { message: `${what} must be at most ${max}″.` });

const side = (what: string) =>
  z
    .number({ error: `Give the number of ${what}.` })
    .int(`The number of ${what} must be a whole number.`)
    .min(1, `Use at least 1 of ${what}.`)
    .max(MAX_DESIGN_SIDE, `Use at most ${MAX_DESIGN_SIDE} ${what}.`);

export const designCellSchema = z
  .object({
    blockId: z.number().int().positive('Expected a block id.').nullable(),
    rotation: z.union(
      rotations.map((r) => z.literal(r)) as [z.ZodLiteral<0>, z.ZodLiteral<90>, z.ZodLiteral<180>, z.ZodLiteral<270>],
      {
        error: 'Turn a block by 0, 90, 180 or 270 degrees.',
      },
    ),
    pinned: z.boolean().optional(),
  })
  .strict();
export type DesignCell = z.infer<typeof designCellSchema>;

export const designBodySchema = z
  .object({
    columns: side('columns'),
    rows: side('rows'),
    sashing: inches('Sashing width', MAX_SASHING, true).optional(),
    cornerstones: z.boolean().optional(),
    borders: z
      .array(inches('A border', MAX_BORDER, false))
      .max(MAX_BORDERS, `Use at most ${MAX_BORDERS} borders.`)
      .optional(),
    alternate: z.boolean().optional(),
    cells: z.array(designCellSchema).max(MAX_DESIGN_SIDE * MAX_DESIGN_SIDE, 'Too many cells.'),
  })
  .strict()
  .superRefine((d, ctx) => {
    if (d.cells.length !== d.columns * d.rows) {
      ctx.addIssue({
        code: 'custom',
        path: ['cells'],
        message: `The grid is ${d.columns} × ${d.rows} = ${d.columns * d.rows} cells, but ${d.cells.length} ${d.cells.length === 1 ? 'cell was' : 'cells were'} sent.`,
      });
    }
    const seen = new Set<number>();
    d.cells.forEach((c, i) => {
      if (c.blockId === null) return;
      if (seen.has(c.blockId))
        ctx.addIssue({
          code: 'custom',
          path: ['cells', i, 'blockId'],
          message: `Block ${c.blockId} is placed twice; a block can be in one cell only.`,
        });
      seen.add(c.blockId);
    });
  });
export type DesignBody = z.infer<typeof designBodySchema>;
export type DesignInput = z.input<typeof designBodySchema>;

/** The arrange call takes the layout on screen (unsaved changes included), or uses the saved one. */
export const arrangeBodySchema = z.union([designBodySchema, z.object({}).strict()]);

/** In a checkerboard setting, the cells that hold plain alternate blocks (the first cell holds a block). */
export function isPlainCell(index: number, columns: number, alternate: boolean | undefined): boolean {
  if (!alternate) return false;
  const r = Math.floor(index / columns);
  const c = index % columns;
  return (r + c) % 2 === 1;
}

export interface ColourStatisticsDto {
  meanLab: [number, number, number];
  lightness: { p10: number; p50: number; p90: number };
}

export interface DesignBlockDto {
  id: number;
  sequence: number;
  maker: { id: number; displayName: string };
  /** the caller made it */
  own: boolean;
  photo: { id: number; url: string; thumbUrl: string; width: number; height: number } | null;
  colour: ColourStatisticsDto | null;
}

export interface DesignDto {
  columns: number;
  rows: number;
  sashing?: number;
  cornerstones?: boolean;
  borders?: number[];
  alternate?: boolean;
  cells: DesignCell[];
  plan: FinishingPlan;
  /** null until the design is first saved */
  savedAt: string | null;
  swap: { id: number; guildId: number; title: string; mode: 'return' | 'gift' };
  block: {
    spec: BlockSpec;
    finished: { width: number; height: number };
    unfinished: { width: number; height: number };
    seam: number;
  };
  /** every block the caller may place */
  blocks: DesignBlockDto[];
}

export interface ArrangeDto {
  cells: DesignCell[];
  score: number;
  before: number;
}
