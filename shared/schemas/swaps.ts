/**
 * Swap bodies, states and the moves between them, shared by the API's validation and the client's
 * set-up form. Lengths are numbers of inches or text parseLength reads; dates are ISO 8601.
 */
import { z } from 'zod';
import { lengthSchema } from '@shared/quilt';
import { blockSpecSchema } from './blocks';
import { swapFeesSchema } from './payments';
import { idParam } from './ids';

export const swapStates = ['draft', 'signup', 'sewing', 'collecting', 'sorting', 'complete', 'cancelled'] as const;
export type SwapState = (typeof swapStates)[number];

export const swapStateLabels: Record<SwapState, string> = {
  draft: 'Draft (only officers see it)',
  signup: 'Open for sign-up',
  sewing: 'Sewing',
  collecting: 'Collecting blocks',
  sorting: 'Sorting and measuring done, planning the return',
  complete: 'Complete',
  cancelled: 'Cancelled',
};

/** Short names for badges and timelines. */
export const swapStateShort: Record<SwapState, string> = {
  draft: 'Draft',
  signup: 'Sign-up open',
  sewing: 'Sewing',
  collecting: 'Collecting',
  sorting: 'Sorting',
  complete: 'Complete',
  cancelled: 'Cancelled',
};

/** The forward path; cancelled is reachable from any state but complete. */
export const swapPath: readonly SwapState[] = ['draft', 'signup', 'sewing', 'collecting', 'sorting', 'complete'];

/** Every move a coordinator may ask for; the server checks each move's conditions too. */
export const swapMoves: Readonly<Record<SwapState, readonly SwapState[]>> = {
  draft: ['signup', 'cancelled'],
  // Back to draft only while nobody has signed up (the server checks).
  signup: ['sewing', 'draft', 'cancelled'],
  // Reopening sign-up is allowed while nobody has started handing blocks in.
  sewing: ['collecting', 'signup', 'cancelled'],
  // Back to sewing only while no block has been taken in (the server checks).
  collecting: ['sorting', 'sewing', 'cancelled'],
  // A late block can still be taken in before the return is confirmed.
  sorting: ['complete', 'collecting', 'cancelled'],
  complete: [],
  cancelled: [],
};

export const moveLabels: Partial<Record<`${SwapState}>${SwapState}`, string>> = {
  'draft>signup': 'Open sign-up',
  'signup>sewing': 'Close sign-up and start sewing',
  'signup>draft': 'Back to draft',
  'sewing>signup': 'Reopen sign-up',
  'sewing>collecting': 'Start collecting blocks',
  'collecting>sorting': 'Start sorting',
  'collecting>sewing': 'Back to sewing',
  'sorting>collecting': 'Back to collecting',
  'sorting>complete': 'Mark the swap complete',
};

// A block's states, their words and order: one list for engine, server and client.
export { blockStates, blockStateLabels, type BlockState } from '../vocabulary';

export const swapModes = ['return', 'gift'] as const;
export type SwapMode = (typeof swapModes)[number];

const inchesUpTo = (max: number, what: string) =>
  lengthSchema.refine((x) => x <= max, { message: `${what} must be at most ${max}″.` });

const isoDate = (what: string) =>
  z.iso
    .datetime({ offset: true, error: `Give ${what} as a date and time.` })
    .max(40, `Give ${what} as a date and time.`)
    .transform((s) => new Date(s))
    .refine((d) => d.getUTCFullYear() >= 2000 && d.getUTCFullYear() <= 2200, { message: `${what} is not a sensible date.` });

export const colourRuleSchema = z.object({
  role: z
    .string({ error: 'Name the fabric role, such as light or dark.' })
    .trim()
    .min(1, 'Name the fabric role, such as light or dark.')
    .max(40, 'Keep the role under 40 characters.'),
  note: z.string().trim().max(300, 'Keep the note under 300 characters.').default(''),
});

// Without defaults: a PATCH must hold only what the caller sent (zod 4 applies defaults inside optional).
const swapFields = {
  title: z
    .string({ error: 'Give the swap a title.' })
    .trim()
    .min(2, 'Give the swap a title of at least 2 characters.')
    .max(120, 'Keep the title under 120 characters.'),
  description: z.string().trim().max(4000, 'Keep the description under 4000 characters.'),
  block: blockSpecSchema,
  tolerance: inchesUpTo(2, 'The tolerance'),
  squareness: inchesUpTo(2, 'The squareness limit'),
  colourRules: z.array(colourRuleSchema).max(12, 'Use at most 12 colour rules.'),
  quota: z.object({
    min: z
      .number({ error: 'Give the fewest blocks a member may pledge.' })
      .int('Use a whole number.')
      .min(1, 'At least 1 block.')
      .max(50, 'At most 50 blocks.'),
    max: z
      .number({ error: 'Give the most blocks a member may pledge.' })
      .int('Use a whole number.')
      .min(1, 'At least 1 block.')
      .max(50, 'At most 50 blocks.'),
  }),
  signupClosesAt: isoDate('the sign-up close'),
  dueAt: isoDate('the due date'),
  signupReminderDays: z.number().int('Use a whole number of days.').min(0, 'Use 0 or more days.').max(60, 'At most 60 days.'),
  dueReminderDays: z.number().int('Use a whole number of days.').min(0, 'Use 0 or more days.').max(60, 'At most 60 days.'),
  mode: z.enum(swapModes, { error: 'Choose return (makers get blocks back) or gift (all to one recipient).' }),
  /** gift mode: a guild member who receives every block … */
  giftRecipientId: z.number().int().positive().nullable().optional(),
  /** … or a name, such as a charity */
  giftRecipientName: z.string().trim().max(120, 'Keep the name under 120 characters.').nullable().optional(),
  /** Entry fee and return postage in the guild currency's minor unit (cents); 0 or absent is none. */
  fees: swapFeesSchema,
};

/** Defaults for a new swap: ±⅛″ tolerance and ¼″ between diagonals (DESIGN defaults). */
const createFields = {
  ...swapFields,
  description: swapFields.description.default(''),
  tolerance: swapFields.tolerance.default(0.125),
  squareness: swapFields.squareness.default(0.25),
  colourRules: swapFields.colourRules.default([]),
  signupReminderDays: swapFields.signupReminderDays.default(7),
  dueReminderDays: swapFields.dueReminderDays.default(2),
  mode: swapFields.mode.default('return'),
  fees: swapFields.fees.optional(),
};

export type SwapShape = {
  quota: { min: number; max: number };
  signupClosesAt: Date;
  dueAt: Date;
  mode: SwapMode;
  giftRecipientId?: number | null;
  giftRecipientName?: string | null;
};

/** Problems across fields as `{ field: message }`; also run on a PATCH merged onto the stored swap. */
export function swapRuleProblems(s: SwapShape): Record<string, string> {
  const problems: Record<string, string> = {};
  if (s.quota.max < s.quota.min) problems['quota.max'] = 'The most blocks cannot be fewer than the fewest.';
  if (s.dueAt.getTime() <= s.signupClosesAt.getTime()) problems.dueAt = 'Blocks must be due after sign-up closes.';
  const named = Boolean(s.giftRecipientName?.trim());
  if (s.mode === 'gift' && !s.giftRecipientId && !named) {
    problems.giftRecipientName = 'Say who receives the blocks: a member or a name such as a charity.';
  }
  if (s.giftRecipientId && named) problems.giftRecipientName = 'Choose either a member or a name, not both.';
  return problems;
}

function checkSwapRules(s: SwapShape, ctx: z.RefinementCtx) {
  for (const [field, message] of Object.entries(swapRuleProblems(s)))
    ctx.addIssue({ code: 'custom', path: field.split('.'), message });
}

export const createSwapSchema = z.object(createFields).strict().superRefine(checkSwapRules);
export type CreateSwapInput = z.input<typeof createSwapSchema>;
export type CreateSwap = z.output<typeof createSwapSchema>;

/** PATCH: any subset; the server merges it onto the stored swap and checks the rules again. */
export const updateSwapSchema = z
  .object(swapFields)
  .partial()
  .strict()
  .refine((o) => Object.keys(o).length > 0, { message: 'Nothing to change.' });
export type UpdateSwapInput = z.input<typeof updateSwapSchema>;
export type UpdateSwap = z.output<typeof updateSwapSchema>;

/** Fields that may still change once sewing has started (the block and its tolerance may not). */
export const scheduleFields = [
  'title',
  'description',
  'signupClosesAt',
  'dueAt',
  'signupReminderDays',
  'dueReminderDays',
] as const;

export const transitionSchema = z
  .object({
    to: z.enum(swapStates, { error: `Choose one of: ${swapStates.join(', ')}.` }),
    reason: z.string().trim().max(500, 'Keep the reason under 500 characters.').optional(),
  })
  .strict();
export type TransitionInput = z.infer<typeof transitionSchema>;

/** `GET /swaps/:swapId/transitions/preview?to=`: what a move would do, before it is made. */
export const transitionPreviewQuerySchema = z
  .object({ to: z.enum(swapStates, { error: `Choose one of: ${swapStates.join(', ')}.` }) })
  .strict();
export type TransitionPreviewQuery = z.infer<typeof transitionPreviewQuerySchema>;

/** True when a move goes back along the path (a step taken back), not forward or to cancelled. */
export function isStepBack(from: SwapState | null, to: SwapState): boolean {
  return from !== null && to !== 'cancelled' && swapPath.indexOf(to) < swapPath.indexOf(from);
}

export const signupSchema = z
  .object({
    blocks: z
      .number({ error: 'Say how many blocks you will make.' })
      .int('Use a whole number of blocks.')
      .min(1, 'Pledge at least 1 block.')
      .max(50, 'At most 50 blocks.'),
  })
  .strict();
export type SignupInput = z.infer<typeof signupSchema>;

export const swapParamsSchema = z.object({ swapId: idParam });

export const blocksQuerySchema = z
  .object({
    maker: z.union([z.literal('me'), idParam], { error: 'maker is "me" or a member id.' }).optional(),
    recipient: z.literal('me', { error: 'recipient can only be "me".' }).optional(),
  })
  .strict();
export type BlocksQuery = z.infer<typeof blocksQuerySchema>;

export const transferSchema = z.object({
  from: z.number({ error: 'Each transfer needs the maker who sends.' }).int().positive(),
  /** null only in gift mode to a named (non-member) recipient */
  to: z.number({ error: 'Each transfer needs the member who receives.' }).int().positive().nullable(),
  count: z
    .number({ error: 'Each transfer needs a number of blocks.' })
    .int('Use a whole number of blocks.')
    .min(1, 'Send at least 1 block, or remove the line.'),
});

export const confirmDistributionSchema = z
  .object({ transfers: z.array(transferSchema).min(1, 'There is nothing to confirm.').max(5000) })
  .strict();
export type ConfirmDistributionInput = z.infer<typeof confirmDistributionSchema>;

/** `GET /swaps/:swapId/distribution?by=recipient|maker`: the confirmed return, grouped. */
export const distributionQuerySchema = z
  .object({ by: z.enum(['recipient', 'maker'], { error: 'by is "recipient" or "maker".' }).default('recipient') })
  .strict();
export type DistributionQuery = z.infer<typeof distributionQuerySchema>;
