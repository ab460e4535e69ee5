/**
 * zod schemas for the engine's inputs at an API or form boundary. Lengths may be numbers of inches
 * or any text parseLength reads; they come out as numbers of inches.
 */
import { z } from 'zod';
import { LengthParseError, MAX_LENGTH_TEXT, parseLengthExact } from './lengths';
import { HST_METHODS } from './units';

/** A length: a number of inches ≥ 0 or text such as "8 1/2", "8½″" or "216 mm". */
export const lengthSchema = z
  .union([z.number(), z.string().max(MAX_LENGTH_TEXT, `A length needs at most ${MAX_LENGTH_TEXT} characters.`)])
  .transform((value, ctx) => {
    try {
      return parseLengthExact(value).valueOf();
    } catch (error) {
      ctx.addIssue({ code: 'custom', message: error instanceof LengthParseError ? error.message : 'Enter a length.' });
      return z.NEVER;
    }
  });

/** A length that must be more than zero. */
export const positiveLengthSchema = lengthSchema.refine((x) => x > 0, { message: 'Must be more than zero.' });

export const gridSpecSchema = z.object({
  columns: z.array(positiveLengthSchema).min(1, 'Give at least one column.').max(24),
  rows: z.array(positiveLengthSchema).min(1, 'Give at least one row.').max(24),
  seam: lengthSchema.optional(),
  roles: z.array(z.array(z.string().trim().min(1).max(40))).optional(),
});

export const hstMethodSchema = z.enum(HST_METHODS as [string, ...string[]]);

export const measurementSchema = z.object({
  width: positiveLengthSchema,
  height: positiveLengthSchema,
  diagonals: z.tuple([positiveLengthSchema, positiveLengthSchema]).optional(),
});

const point = z.tuple([z.number().finite(), z.number().finite()]);
export const quadSchema = z.tuple([point, point, point, point]);

export const photoMeasureSchema = z.object({
  reference: z.object({ corners: quadSchema, size: positiveLengthSchema }),
  block: z.object({ corners: quadSchema }),
});

export const distributionInputSchema = z.object({
  makers: z.array(z.object({ id: z.string().min(1).max(40), accepted: z.number().int().min(0) })),
  angels: z.array(z.object({ id: z.string().min(1).max(40), blocks: z.number().int().min(0) })).optional(),
});
