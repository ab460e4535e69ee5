/**
 * The set-up form's values (what people type, all text) and their mapping to the API body checked
 * by the shared createSwapSchema. Field paths map both ways so server messages land beside fields.
 * Lengths are typed in the person's unit: in millimetre mode a bare number gets " mm" written after
 * it in the body, so the schema (which reads a bare number as inches) reads millimetres.
 */
import { formatLength, parseLength } from '@shared/quilt';
import type { Units } from '@shared/schemas/auth';
import { withUnit } from '@/entities/me/api/units';
import { blockSpecSchema, type BlockKind, type BlockSpec } from '@shared/schemas/blocks';
import { createSwapSchema, type CreateSwapInput, type UpdateSwapInput } from '@shared/schemas/swaps';
import { zodFields } from '@shared/schemas/errors';
import type { SwapDto } from '@shared/swap-types';
import { isoToZonedLocal, zonedLocalToIso } from '../../hooks/zoned-time';
import { minorDigits, parseMoney } from '@shared/schemas/payments';

export interface SetupValues {
  title: string;
  description: string;
  block: {
    kind: BlockKind;
    columns: { value: string }[];
    rows: { value: string }[];
    seam: string;
    finished: string;
    finishedWidth: string;
    finishedHeight: string;
    hstMethod: 'two-at-a-time' | 'trim' | 'four-at-a-time' | 'eight-at-a-time';
    geeseMethod: 'no-waste' | 'stitch-and-flip';
    cutList: string;
    /** fabric of each grid cell, '' when not chosen */
    roles: string[][];
  };
  tolerance: string;
  squareness: string;
  colourRules: { role: string; note: string }[];
  quotaMin: number;
  quotaMax: number;
  signupCloses: string;
  due: string;
  signupReminderDays: number;
  dueReminderDays: number;
  mode: 'return' | 'gift';
  recipientKind: 'member' | 'name';
  giftRecipientId: string;
  giftRecipientName: string;
  /** Fees as typed, in the guild's currency ("5" or "5.00"); empty is none. */
  fees: { entry: string; postage: string; currency: string };
}

const DAY = 86_400_000;
const cells = (n: number, value: string) => Array.from({ length: n }, () => ({ value }));

/** A new column or row before anything is typed: 3½″, or 88.9 mm (1 in = 25.4 mm exactly, NIST SP 811). */
export const defaultCell = (units: Units = 'in') => (units === 'mm' ? '88.9' : '3 1/2');

/** A stored fee (minor units) as people type it: 500 usd → "5.00"; 0 → empty. */
function feeText(amount: number, currency: string): string {
  if (!amount) return '';
  const digits = minorDigits(currency);
  return (amount / 10 ** digits).toFixed(digits);
}

export function defaultValues(timeZone: string, currency = 'usd', units: Units = 'in', now = Date.now()): SetupValues {
  // Millimetre starting values are the same lengths: 3½″, 3″, ¼″ and ⅛″ at 25.4 mm to the inch (NIST SP 811).
  const mm = units === 'mm';
  const at18 = (days: number) => `${isoToZonedLocal(new Date(now + days * DAY).toISOString(), timeZone).slice(0, 10)}T18:00`;
  return {
    title: '',
    description: '',
    block: {
      kind: 'grid',
      columns: cells(3, defaultCell(units)),
      rows: cells(3, defaultCell(units)),
      seam: mm ? '6.35' : '1/4',
      finished: mm ? '76.2' : '3',
      finishedWidth: '',
      finishedHeight: '',
      hstMethod: 'two-at-a-time',
      geeseMethod: 'no-waste',
      cutList: '',
      roles: [],
    },
    tolerance: mm ? '3.175' : '1/8',
    squareness: mm ? '6.35' : '1/4',
    colourRules: [
      { role: 'light', note: '' },
      { role: 'dark', note: '' },
    ],
    quotaMin: 1,
    quotaMax: 6,
    signupCloses: at18(21),
    due: at18(63),
    signupReminderDays: 7,
    dueReminderDays: 2,
    mode: 'return',
    recipientKind: 'name',
    giftRecipientId: '',
    giftRecipientName: '',
    fees: { entry: '', postage: '', currency },
  };
}

/**
 * A stored length (inches) as people write it: 3½″ when that reads back exactly, else the decimal.
 * In millimetre mode the bare millimetres (88.9) when they read back exactly, else the inches with
 * their unit written out so they are not taken for millimetres.
 */
export function lengthTextIn(x: number | undefined, units: Units = 'in'): string {
  if (x === undefined) return '';
  if (units === 'mm') {
    const mm = String(Number((x * 25.4).toFixed(4)));
    return parseLength(mm, { bareUnit: 'mm' }) === x ? mm : `${x} in`;
  }
  const text = formatLength(x, { denominator: 16 });
  return parseLength(text) === x ? text : String(x);
}

/** A typed length read back with its unit (⅛″, or 3.2 mm); left as typed if it does not read. */
export function lengthBack(text: string, units: Units): string {
  try {
    const x = parseLength(text, { bareUnit: units });
    return units === 'mm' ? formatLength(x, { unit: 'mm' }) : formatLength(x);
  } catch {
    return text;
  }
}

export function valuesFromSwap(swap: SwapDto, currency = 'usd', units: Units = 'in'): SetupValues {
  const tz = swap.guild.timeZone;
  const base = defaultValues(tz, currency, units);
  const lengthText = (x: number | undefined) => lengthTextIn(x, units);
  const b = swap.block;
  const block = { ...base.block, kind: b.kind };
  if (b.kind === 'grid') {
    Object.assign(block, {
      columns: b.columns.map((c) => ({ value: lengthText(c) })),
      rows: b.rows.map((r) => ({ value: lengthText(r) })),
      seam: lengthText(b.seam ?? 0.25),
      roles: b.roles ?? [],
    });
  } else if (b.kind === 'flying-geese' || b.kind === 'custom') {
    Object.assign(block, { finishedWidth: lengthText(b.finished.width), finishedHeight: lengthText(b.finished.height) });
    if (b.kind === 'flying-geese') block.geeseMethod = b.method;
    else Object.assign(block, { cutList: b.cutList, seam: lengthText(b.seam ?? 0.25) });
  } else {
    block.finished = lengthText(b.finished);
    if (b.kind === 'hst') block.hstMethod = b.method;
  }
  return {
    title: swap.title,
    description: swap.description,
    block,
    tolerance: lengthText(swap.tolerance),
    squareness: lengthText(swap.squareness),
    colourRules: swap.colourRules.length ? swap.colourRules : base.colourRules,
    quotaMin: swap.quota.min,
    quotaMax: swap.quota.max,
    signupCloses: isoToZonedLocal(swap.signupClosesAt, tz),
    due: isoToZonedLocal(swap.dueAt, tz),
    signupReminderDays: swap.signupReminderDays,
    dueReminderDays: swap.dueReminderDays,
    mode: swap.mode,
    recipientKind: swap.giftRecipient?.userId ? 'member' : 'name',
    giftRecipientId: swap.giftRecipient?.userId ? String(swap.giftRecipient.userId) : '',
    giftRecipientName: swap.giftRecipient && !swap.giftRecipient.userId ? swap.giftRecipient.name : '',
    fees: { entry: feeText(swap.fees.entry, currency), postage: feeText(swap.fees.postage, currency), currency },
  };
}

/** The block part of the body, as typed (the schema parses the lengths); bare numbers in mm mode get " mm". */
export function blockBody(v: SetupValues['block'], units: Units = 'in'): Record<string, unknown> {
  const u = (text: string) => withUnit(text, units);
  switch (v.kind) {
    case 'grid': {
      const roles = v.roles.slice(0, v.rows.length).map((r) => r.slice(0, v.columns.length));
      const anyRole = roles.some((r) => r.some(Boolean));
      return {
        kind: 'grid',
        columns: v.columns.map((c) => u(c.value)),
        rows: v.rows.map((r) => u(r.value)),
        seam: u(v.seam),
        ...(anyRole ? { roles } : {}),
      };
    }
    case 'hst':
      return { kind: 'hst', finished: u(v.finished), method: v.hstMethod };
    case 'qst':
      return { kind: 'qst', finished: u(v.finished) };
    case 'square-in-square':
      return { kind: 'square-in-square', finished: u(v.finished) };
    case 'flying-geese':
      return {
        kind: 'flying-geese',
        finished: { width: u(v.finishedWidth), height: u(v.finishedHeight) },
        method: v.geeseMethod,
      };
    case 'custom':
      return {
        kind: 'custom',
        finished: { width: u(v.finishedWidth), height: u(v.finishedHeight) },
        seam: u(v.seam),
        cutList: v.cutList,
      };
  }
}

/** The parsed block, or the first reason it cannot be read yet (for the live size). */
export function parseBlock(v: SetupValues['block'], units: Units = 'in'): { spec: BlockSpec | null; problem: string | null } {
  const parsed = blockSpecSchema.safeParse(blockBody(v, units));
  return parsed.success
    ? { spec: parsed.data, problem: null }
    : { spec: null, problem: parsed.error.issues[0]?.message ?? 'Check the block.' };
}

export function toBody(v: SetupValues, timeZone: string, units: Units = 'in'): CreateSwapInput {
  const gift = v.mode === 'gift';
  return {
    title: v.title,
    description: v.description,
    block: blockBody(v.block, units) as CreateSwapInput['block'],
    tolerance: withUnit(v.tolerance, units),
    squareness: withUnit(v.squareness, units),
    colourRules: v.colourRules.filter((r) => r.role.trim() || r.note.trim()),
    quota: { min: v.quotaMin, max: v.quotaMax },
    signupClosesAt: zonedLocalToIso(v.signupCloses, timeZone) || v.signupCloses,
    dueAt: zonedLocalToIso(v.due, timeZone) || v.due,
    signupReminderDays: v.signupReminderDays,
    dueReminderDays: v.dueReminderDays,
    mode: v.mode,
    giftRecipientId: gift && v.recipientKind === 'member' && v.giftRecipientId ? Number(v.giftRecipientId) : null,
    giftRecipientName: gift && v.recipientKind === 'name' ? v.giftRecipientName : null,
    // A fee that does not read as money is left out here; validateValues points at it.
    fees: { entry: feeAmount(v.fees.entry, v.fees.currency) ?? 0, postage: feeAmount(v.fees.postage, v.fees.currency) ?? 0 },
  };
}

/** "5" or "5.00" → minor units; empty → 0; null when it is not an amount. */
function feeAmount(text: string, currency: string): number | null {
  return text.trim() === '' ? 0 : parseMoney(text, currency);
}

/** Once sewing starts only these may change (the server says the same). */
export function scheduleBody(v: SetupValues, timeZone: string): UpdateSwapInput {
  const b = toBody(v, timeZone);
  return {
    title: b.title,
    description: b.description,
    signupClosesAt: b.signupClosesAt,
    dueAt: b.dueAt,
    signupReminderDays: b.signupReminderDays,
    dueReminderDays: b.dueReminderDays,
  };
}

/** API field path → form field name. */
export function fieldName(path: string, kind: BlockKind): string {
  const p = path.split('.');
  if (p[0] === 'quota') return p[1] === 'max' ? 'quotaMax' : 'quotaMin';
  if (path === 'signupClosesAt') return 'signupCloses';
  if (path === 'dueAt') return 'due';
  if (p[0] !== 'block') return p.length > 2 ? p.slice(0, 3).join('.') : path;
  if (p[1] === 'columns' || p[1] === 'rows') return p[2] !== undefined ? `block.${p[1]}.${p[2]}.value` : `block.${p[1]}`;
  if (p[1] === 'finished') {
    if (p[2] === 'height') return 'block.finishedHeight';
    return kind === 'flying-geese' || kind === 'custom' ? 'block.finishedWidth' : 'block.finished';
  }
  if (p[1] === 'method') return kind === 'hst' ? 'block.hstMethod' : 'block.geeseMethod';
  if (p[1] === 'roles') return 'block.roles';
  if (p[1] === 'seam' || p[1] === 'cutList') return `block.${p[1]}`;
  return 'block.kind';
}

/** Every problem the shared schema finds, keyed by form field name. */
export function validateValues(v: SetupValues, timeZone: string, units: Units = 'in'): Record<string, string> {
  const out: Record<string, string> = {};
  for (const kind of ['entry', 'postage'] as const) {
    if (feeAmount(v.fees[kind], v.fees.currency) === null) {
      out[`fees.${kind}`] =
        `Give the fee as an amount such as 5 or 5.00 (${v.fees.currency.toUpperCase()}), or leave it empty for none.`;
    }
  }
  const parsed = createSwapSchema.safeParse(toBody(v, timeZone, units));
  if (parsed.success) return out;
  for (const [path, message] of Object.entries(zodFields(parsed.error))) out[fieldName(path, v.block.kind)] ??= message;
  return out;
}

/** Which step holds a field, to jump back to it after a failed save. */
export function stepOf(field: string): number {
  if (field === 'title' || field === 'description') return 0;
  if (field.startsWith('block.roles') || field.startsWith('colourRules')) return 2;
  if (field.startsWith('block') || field === 'tolerance' || field === 'squareness') return 1;
  return 3;
}
