/**
 * Payments: guild dues, swap entry fees and return postage. Amounts are whole numbers in the
 * currency's minor unit (cents for usd, yen for jpy); currencies are ISO 4217 codes in lower case,
 * as the hosted payments service takes them.
 */
import { z } from 'zod';
import { idParam } from './ids';

export const paymentKinds = ['dues', 'entry', 'postage'] as const;
export type PaymentKind = (typeof paymentKinds)[number];

export const paymentStatuses = ['pending', 'paid', 'refunded', 'failed'] as const;
export type PaymentStatus = (typeof paymentStatuses)[number];

/** Words people see; the status names stay in the API and the CSV's `status` column. */
export const paymentKindLabels: Record<PaymentKind, string> = {
  dues: 'Guild dues',
  entry: 'Swap entry fee',
  postage: 'Return postage',
};

export const paymentStatusLabels: Record<PaymentStatus, string> = {
  pending: 'Waiting for the payment service',
  paid: 'Paid',
  refunded: 'Refunded',
  failed: 'Did not go through',
};

/** The most any one fee or due may be, in minor units (10,000.00 in a two-decimal currency). */
export const MAX_AMOUNT = 1_000_000;

/** Currencies the runtime knows (ISO 4217), lower case. */
export function isKnownCurrency(code: string): boolean {
  if (!/^[a-z]{3}$/.test(code)) return false;
  return Intl.supportedValuesOf('currency').includes(code.toUpperCase());
}

/** How many digits the currency's minor unit has: 2 for usd and eur, 0 for jpy. */
export function minorDigits(currency: string): number {
  return (
    new Intl.NumberFormat('en', { style: 'currency', currency: currency.toUpperCase() }).resolvedOptions()
      .maximumFractionDigits ?? 2
  );
}

/** 1250 usd → "$12.50" (in the reader's locale when given). */
export function formatMoney(amount: number, currency: string, locale = 'en'): string {
  const digits = minorDigits(currency);
  return new Intl.NumberFormat(locale, { style: 'currency', currency: currency.toUpperCase() }).format(amount / 10 ** digits);
}

/**
 * "12.50" or "12" typed in major units → 1250 minor units; null when it is not a plain amount with
 * at most the currency's number of decimals.
 */
export function parseMoney(text: string, currency: string): number | null {
  const digits = minorDigits(currency);
  const match = /^(\d{1,7})(?:[.,](\d{1,3}))?$/.exec(text.trim());
  if (!match) return null;
  const fraction = match[2] ?? '';
  if (fraction.length > digits) return null;
  return Number(match[1]) * 10 ** digits + Number(fraction.padEnd(digits, '0') || '0');
}

export const currencySchema = z
  .string({ error: 'Give the currency as a three-letter code such as usd or cad.' })
  .trim()
  .max(3, 'A currency code has three letters, such as usd or cad.')
  .transform((s) => s.toLowerCase())
  .refine(isKnownCurrency, 'Give the currency as a three-letter code such as usd, cad, gbp or eur.');

const minorUnits = (what: string) =>
  z
    .number({ error: `Give ${what} as a whole number of the currency's smallest unit (cents).` })
    .int(`Give ${what} in the currency's smallest unit (cents), with no decimals.`)
    .min(0, `${what[0]!.toUpperCase()}${what.slice(1)} cannot be negative; use 0 for none.`)
    .max(
      MAX_AMOUNT,
      `${what[0]!.toUpperCase()}${what.slice(1)} is larger than Blockpost allows (${MAX_AMOUNT} in the smallest unit).`,
    );

/** A swap's fees: 0 or absent means no fee. */
export const swapFeesSchema = z
  .object({
    entry: minorUnits('the entry fee').optional(),
    postage: minorUnits('the return postage').optional(),
  })
  .strict();
export type SwapFees = z.infer<typeof swapFeesSchema>;

const thisYear = new Date().getUTCFullYear();

/** The guild's dues for one membership year; null removes the dues. */
export const duesSchema = z
  .object({
    amount: minorUnits('the dues').refine((n) => n > 0, 'Dues must be more than 0; to stop asking for dues, remove them.'),
    year: z
      .number({ error: 'Give the membership year, such as 2027.' })
      .int('Give the membership year as a whole number, such as 2027.')
      .min(2000, 'Give a membership year from 2000 on.')
      .max(thisYear + 5, `Give a membership year no later than ${thisYear + 5}.`),
  })
  .strict()
  .nullable();
export type DuesInput = z.infer<typeof duesSchema>;

/** The part of PATCH /api/guilds/:guildId that belongs to payments. */
export const guildPaymentFields = {
  currency: currencySchema.optional(),
  dues: duesSchema.optional(),
};

export const swapCheckoutSchema = z
  .object({
    kinds: z
      .array(z.enum(['entry', 'postage'], { error: 'Choose entry or postage.' }))
      .min(1, 'Choose at least one fee to pay.')
      .max(2)
      .optional(),
  })
  .strict();
export type SwapCheckoutInput = z.infer<typeof swapCheckoutSchema>;

export const duesCheckoutSchema = z.object({}).strict();

export const guildPaymentsQuerySchema = z
  .object({
    status: z.enum(paymentStatuses, { error: `Filter by one of: ${paymentStatuses.join(', ')}.` }).optional(),
    kind: z.enum(paymentKinds, { error: `Filter by one of: ${paymentKinds.join(', ')}.` }).optional(),
    swapId: idParam.optional(),
    year: z.coerce.number({ error: 'Give the year as a number.' }).int().min(2000).max(2200).optional(),
    format: z.enum(['json', 'csv'], { error: 'Choose json or csv.' }).optional(),
  })
  .strict();
export type GuildPaymentsQuery = z.infer<typeof guildPaymentsQuerySchema>;

export const myPaymentsQuerySchema = z
  .object({
    /** Only the payments started by one checkout (the return page asks for these). */
    session: z
      .string()
      .max(255, 'That checkout reference is too long.')
      .regex(/^[\w-]+$/, 'That checkout reference is not valid.')
      .optional(),
  })
  .strict();

export const paymentParamsSchema = z.object({ paymentId: idParam });

/** GET /api/me/payments: one row per payment asked of the caller. */
export interface MyPaymentDto {
  id: number;
  kind: PaymentKind;
  swapId?: number;
  amount: number;
  currency: string;
  status: PaymentStatus;
  guildId: number;
  guildName: string;
  swapTitle?: string;
  year?: number;
  createdAt: string;
  paidAt: string | null;
  refundedAt: string | null;
  /** paid, and a refund is asked for or due (its swap was cancelled) but not through yet */
  refundOnItsWay: boolean;
}

/** A row of the treasurer's view. */
export interface GuildPaymentDto extends MyPaymentDto {
  userId: number;
  displayName: string;
  statusReason: string | null;
  refundRequestedAt: string | null;
  refundError: string | null;
}

export interface PaymentTotals {
  paid: number;
  refunded: number;
  pending: number;
  failed: number;
  count: number;
}

export interface GuildPaymentsDto {
  guildName: string;
  currency: string;
  payments: GuildPaymentDto[];
  totals: {
    all: PaymentTotals;
    bySwap: (PaymentTotals & { swapId: number; title: string })[];
    byYear: (PaymentTotals & { year: number })[];
  };
}

/** Where one fee stands for one member: not asked, owed, or a payment's status. */
export type FeeStanding = 'not_owed' | 'owed' | PaymentStatus;

export interface FeeLine {
  kind: PaymentKind;
  amount: number;
  standing: FeeStanding;
}

/** GET /api/swaps/:swapId/fees */
export interface SwapFeesDto {
  swapId: number;
  currency: string;
  fees: { entry: number; postage: number };
  /** Payments are set up on this server (a key is configured). */
  enabled: boolean;
  /** A test key (or the local fake): checkout pages take no real money. */
  testMode: boolean;
  mine: FeeLine[];
  /** Officers only: every signed-up member's standing for each fee. */
  members?: { userId: number; displayName: string; entry: FeeStanding; postage: FeeStanding }[];
}

/** GET /api/guilds/:guildId/dues */
export interface GuildDuesDto {
  guildId: number;
  currency: string;
  dues: { amount: number; year: number } | null;
  enabled: boolean;
  testMode: boolean;
  mine: FeeStanding;
  /** Admins only. */
  members?: { userId: number; displayName: string; standing: FeeStanding }[];
}
