/**
 * The block spec of a swap and the block-level bodies (hand-in, measurement), shared by the server's
 * validation and the client's forms. Lengths are numbers of inches or text parseLength reads.
 */
import { z } from 'zod';
import { gridBlock, lengthSchema, unfinishedSize } from '@shared/quilt';
import { idParam } from './ids';

/** Largest length we accept anywhere in a swap: larger values are typing slips, not blocks. */
export const MAX_INCHES = 120;
const QUARTER = 0.25;

const sized = (what: string) =>
  lengthSchema
    .refine((x) => x > 0, { message: `${what} must be more than zero.` })
    .refine((x) => x <= MAX_INCHES, { message: `${what} must be at most ${MAX_INCHES}″.` });

const seamSchema = lengthSchema.refine((x) => x > 0 && x < 1, {
  message: 'Use a seam allowance between 0 and 1″ (¼″ is usual).',
});

// Unit formulas (+⅞″ for HSTs, +1¼″ for QSTs …) are worked out for a ¼″ seam, so unit blocks keep it.
const quarterSeam = lengthSchema
  .refine((x) => x === QUARTER, { message: 'Unit blocks use a ¼″ seam allowance; their cut formulas assume it.' })
  .optional();

export const hstMethodSchema = z.enum(['two-at-a-time', 'trim', 'four-at-a-time', 'eight-at-a-time'], {
  error: 'Choose how the HSTs are made.',
});
export const geeseMethodSchema = z.enum(['no-waste', 'stitch-and-flip'], { error: 'Choose how the flying geese are made.' });

const roleName = z.string().trim().min(1, 'Name the fabric.').max(40, 'Keep fabric names under 40 characters.');

export const gridBlockSpecSchema = z
  .object({
    kind: z.literal('grid'),
    columns: z.array(sized('A column width')).min(1, 'Give at least one column.').max(12, 'Use at most 12 columns.'),
    rows: z.array(sized('A row height')).min(1, 'Give at least one row.').max(12, 'Use at most 12 rows.'),
    seam: seamSchema.optional(),
    /** fabric role of every cell, roles[row][col] */
    roles: z.array(z.array(roleName)).optional(),
  })
  .superRefine((spec, ctx) => {
    const seam = spec.seam ?? QUARTER;
    spec.columns.forEach((w, i) => {
      if (w <= 2 * seam)
        ctx.addIssue({
          code: 'custom',
          path: ['columns', i],
          message: `A ${w}″ column disappears into its two seams; cut it wider than ${2 * seam}″.`,
        });
    });
    spec.rows.forEach((h, i) => {
      if (h <= 2 * seam)
        ctx.addIssue({
          code: 'custom',
          path: ['rows', i],
          message: `A ${h}″ row disappears into its two seams; cut it wider than ${2 * seam}″.`,
        });
    });
    if (spec.roles && (spec.roles.length !== spec.rows.length || spec.roles.some((r) => r.length !== spec.columns.length))) {
      ctx.addIssue({
        code: 'custom',
        path: ['roles'],
        message: `Name a fabric for every cell: ${spec.rows.length} rows of ${spec.columns.length}.`,
      });
    }
  });

export const hstBlockSpecSchema = z.object({
  kind: z.literal('hst'),
  finished: sized('The finished size'),
  method: hstMethodSchema.default('two-at-a-time'),
  seam: quarterSeam,
});

export const qstBlockSpecSchema = z.object({ kind: z.literal('qst'), finished: sized('The finished size'), seam: quarterSeam });

export const geeseBlockSpecSchema = z
  .object({
    kind: z.literal('flying-geese'),
    finished: z.object({ width: sized('The finished width'), height: sized('The finished height') }),
    method: geeseMethodSchema.default('no-waste'),
    seam: quarterSeam,
  })
  .refine((s) => s.finished.width === 2 * s.finished.height, {
    path: ['finished', 'width'],
    message: 'Flying geese are twice as wide as they are tall.',
  });

export const squareInSquareBlockSpecSchema = z.object({
  kind: z.literal('square-in-square'),
  finished: sized('The finished size'),
  seam: quarterSeam,
});

export const customBlockSpecSchema = z.object({
  kind: z.literal('custom'),
  finished: z.object({ width: sized('The finished width'), height: sized('The finished height') }),
  seam: seamSchema.optional(),
  cutList: z
    .string()
    .trim()
    .min(1, 'Write the cut list so makers know what to cut.')
    .max(4000, 'Keep the cut list under 4000 characters.'),
});

export const blockSpecSchema = z.discriminatedUnion(
  'kind',
  [
    gridBlockSpecSchema,
    hstBlockSpecSchema,
    qstBlockSpecSchema,
    geeseBlockSpecSchema,
    squareInSquareBlockSpecSchema,
    customBlockSpecSchema,
  ],
  { error: 'Choose a kind of block: grid, HST, QST, flying geese, square-in-a-square or custom.' },
);

export type BlockSpecInput = z.input<typeof blockSpecSchema>;
export type BlockSpec = z.output<typeof blockSpecSchema>;
export type BlockKind = BlockSpec['kind'];

export const blockKindLabels: Record<BlockKind, string> = {
  grid: 'Grid block',
  hst: 'Half-square triangle (HST)',
  qst: 'Quarter-square triangle (QST)',
  'flying-geese': 'Flying geese',
  'square-in-square': 'Square-in-a-square',
  custom: 'Custom',
};

export interface BlockSizes {
  seam: number;
  finished: { width: number; height: number };
  unfinished: { width: number; height: number };
}

/** Finished and unfinished size of a parsed spec, from the engine (unfinished = finished + 2 × seam). */
export function blockSizes(spec: BlockSpec): BlockSizes {
  if (spec.kind === 'grid') {
    const g = gridBlock({ columns: spec.columns, rows: spec.rows, seam: spec.seam ?? QUARTER });
    return { seam: g.seam, finished: g.finished, unfinished: g.unfinished };
  }
  const seam = spec.seam ?? QUARTER;
  const finished =
    spec.kind === 'flying-geese' || spec.kind === 'custom' ? spec.finished : { width: spec.finished, height: spec.finished };
  return {
    seam,
    finished: { ...finished },
    unfinished: { width: unfinishedSize(finished.width, seam), height: unfinishedSize(finished.height, seam) },
  };
}

// ---- block actions ----

export const handInSchema = z.object({
  how: z.enum(['in-person', 'post'], { error: 'Say whether you handed it in in person or posted it.' }),
  note: z.string().trim().max(500, 'Keep the note under 500 characters.').optional(),
});
export type HandInInput = z.infer<typeof handInSchema>;

/** `POST /swaps/:swapId/handed-in`: the maker hands several of their blocks in at once. */
export const handInManySchema = z
  .object({
    blockIds: z
      .array(z.number({ error: 'Each block is a number.' }).int().positive(), { error: 'Choose the blocks you hand in.' })
      .min(1, 'Choose at least one block.')
      .max(50, 'At most 50 blocks at once.'),
    how: handInSchema.shape.how,
    note: handInSchema.shape.note,
  })
  .strict();
export type HandInManyInput = z.infer<typeof handInManySchema>;

/** `POST /blocks/:blockId/accept`: an officer accepts an off-size block anyway, and says why. */
export const acceptBlockSchema = z
  .object({
    reason: z
      .string({ error: 'Say why the block is accepted.' })
      .trim()
      .min(3, 'Say in a few words why the block is accepted.')
      .max(500, 'Keep the reason under 500 characters.'),
  })
  .strict();
export type AcceptBlockInput = z.infer<typeof acceptBlockSchema>;

export const clientIdSchema = z.uuid({ error: 'clientId must be a UUID.' }).max(36, 'clientId must be a UUID.').optional();

export const receiveSchema = z.object({ clientId: clientIdSchema });
export type ReceiveInput = z.infer<typeof receiveSchema>;

const measured = (what: string) =>
  lengthSchema
    .refine((x) => x > 0, { message: `${what} must be more than zero.` })
    .refine((x) => x <= MAX_INCHES, { message: `${what} must be at most ${MAX_INCHES}″.` });

export const measurementBodySchema = z.object({
  width: measured('The width'),
  height: measured('The height'),
  diagonals: z
    .tuple([measured('The first diagonal'), measured('The second diagonal')], { error: 'Give both diagonals, or neither.' })
    .optional(),
  /** 'ruler' (coordinator at intake) or 'maker' (the maker's own); chosen from the caller's role when left out */
  source: z.enum(['ruler', 'maker'], { error: 'Source is "ruler" or "maker".' }).optional(),
  note: z.string().trim().max(500, 'Keep the note under 500 characters.').optional(),
  clientId: clientIdSchema,
});
// Not strict on purpose: an offline client may send its own verdict along; it is dropped, never read.
export type MeasurementBodyInput = z.input<typeof measurementBodySchema>;
export type MeasurementBody = z.output<typeof measurementBodySchema>;

export const blockParamsSchema = z.object({ blockId: idParam });
