/**
 * Meeting-night intake: label sheets, resolving a scanned or typed label, and the swap data the
 * intake view keeps on the device. Shared by the server's validation and the client.
 */
import { z } from 'zod';
import type { BlockState, SwapState } from './swaps';
import type { VerdictName } from '../swap-types';
import { idParam } from './guilds';
import { MAX_INCHES } from './blocks';
import { LengthParseError, MAX_LENGTH_TEXT, parseLength } from '../quilt';

export const resolveBodySchema = z
  .object({
    swapId: idParam,
    reference: z
      .string()
      .trim()
      .min(1, 'Scan the label again: the code was empty.')
      .max(200, 'That is not a Blockpost label.')
      .optional(),
    shortCode: z
      .string()
      .trim()
      .min(1, 'Type the short code under the QR code.')
      .max(20, 'A short code has 8 characters, like K7QM-3XWD.')
      .optional(),
  })
  .refine((b) => (b.reference === undefined) !== (b.shortCode === undefined), {
    path: ['reference'],
    message: 'Send either the scanned reference or the typed short code.',
  });
export type ResolveBody = z.infer<typeof resolveBodySchema>;

/** Whose labels: `me` (default), `all` (officers), or one maker's user id (officers, or yourself). */
export const labelsQuerySchema = z.object({
  maker: z.union([z.enum(['me', 'all']), idParam], { error: 'maker is "me", "all" or a member’s id.' }).default('me'),
});
export type LabelsQuery = z.infer<typeof labelsQuerySchema>;

function readSide(what: string, text: string, ctx: z.RefinementCtx): number | undefined {
  let inches: number;
  try {
    inches = parseLength(text);
  } catch (error) {
    ctx.addIssue({
      code: 'custom',
      message: error instanceof LengthParseError ? error.message : `Type the ${what} as a length, e.g. 9 1/2.`,
    });
    return undefined;
  }
  if (inches <= 0) ctx.addIssue({ code: 'custom', message: `The ${what} must be more than zero.` });
  else if (inches > MAX_INCHES) ctx.addIssue({ code: 'custom', message: `The ${what} must be at most ${MAX_INCHES}″.` });
  else return inches;
  return undefined;
}

const sideSchema = (what: string) =>
  z
    .string()
    .max(MAX_LENGTH_TEXT, `Type the ${what} in at most ${MAX_LENGTH_TEXT} characters, e.g. 9 1/2.`)
    .transform((text, ctx) => {
      if (text.trim() === '') {
        ctx.addIssue({ code: 'custom', message: `Type the ${what}, e.g. 9 1/2 or 241 mm.` });
        return z.NEVER;
      }
      return readSide(what, text, ctx) ?? z.NEVER;
    });

const optionalSide = (what: string) =>
  z
    .string()
    .max(MAX_LENGTH_TEXT, `Type the ${what} in at most ${MAX_LENGTH_TEXT} characters, e.g. 9 1/2.`)
    .transform((text, ctx) => (text.trim() === '' ? undefined : (readSide(what, text, ctx) ?? z.NEVER)));

/**
 * The measuring card: width and height in any format parseLength reads, diagonals optional but in
 * pairs. Gives the body of a ruler measurement in inches.
 */
export const measuringFormSchema = z
  .object({
    width: sideSchema('width'),
    height: sideSchema('height'),
    diagonal1: optionalSide('first diagonal'),
    diagonal2: optionalSide('second diagonal'),
  })
  .superRefine((v, ctx) => {
    if ((v.diagonal1 === undefined) !== (v.diagonal2 === undefined)) {
      const missing = v.diagonal1 === undefined ? 'diagonal1' : 'diagonal2';
      ctx.addIssue({ code: 'custom', path: [missing], message: 'Give both diagonals, or neither.' });
    }
  })
  .transform(({ width, height, diagonal1, diagonal2 }) => ({
    width,
    height,
    ...(diagonal1 !== undefined && diagonal2 !== undefined ? { diagonals: [diagonal1, diagonal2] as [number, number] } : {}),
  }));
/** What the card's four text boxes hold. */
export interface MeasuringFormInput {
  width: string;
  height: string;
  diagonal1: string;
  diagonal2: string;
}
export type MeasuringFormOutput = z.output<typeof measuringFormSchema>;

export const labelSheetIds = ['a4-21', 'a4-14', 'letter-30', 'letter-10', 'single'] as const;
export const labelSheetSchema = z.enum(labelSheetIds, { error: 'Choose a label sheet.' });
export type LabelSheetId = z.infer<typeof labelSheetSchema>;

/** One block as the intake view sees it. */
export interface IntakeBlockDto {
  id: number;
  swapId: number;
  maker: { id: number; displayName: string };
  /** place among the maker's blocks, 1-based, and how many they have: "Block 3 of 4" */
  ordinal: number;
  of: number;
  state: BlockState;
  verdict: VerdictName | null;
  /** 8 characters, shown as K7QM-3XWD */
  shortCode: string;
}

/** Everything the intake view needs to keep working offline for one swap. */
export interface IntakePackDto {
  swap: {
    id: number;
    guildId: number;
    title: string;
    state: SwapState;
    unfinished: { width: number; height: number };
    tolerance: number;
    squareness: number;
  };
  /** each block with its signed reference, so a scan can be matched on the device without the network */
  blocks: (IntakeBlockDto & { reference: string })[];
  generatedAt: string;
}

export interface ResolveAnswerDto {
  block: IntakeBlockDto;
  /** how the block was named: the QR code or the typed short code */
  via: 'reference' | 'shortCode';
}

export interface LabelDto {
  blockId: number;
  ordinal: number;
  of: number;
  makerName: string;
  reference: string;
  shortCode: string;
  /** the QR code as an SVG data URL */
  qr: string;
}

export interface LabelSheetDataDto {
  swap: { id: number; guildId: number; title: string; guildName: string; state: SwapState };
  labels: LabelDto[];
}
