/**
 * Exact rational helpers. Every length inside the engine is a Fraction of an inch so that ⅛″ and
 * 1/16″ steps never drift; numbers only appear at the public boundary.
 */
import Fraction from 'fraction.js';

export { Fraction };
export type Q = Fraction;

/** Thrown for an argument the engine cannot work with; `field` names the argument for forms. */
export class QuiltInputError extends RangeError {
  readonly field: string;
  constructor(field: string, message: string) {
    super(message);
    this.name = 'QuiltInputError';
    this.field = field;
  }
}

const DECIMAL = /^(-?)(\d*)(?:\.(\d*))?(?:e([+-]?\d+))?$/i;

/**
 * The exact value of a finite JS number, read as the shortest decimal that prints for it
 * (0.1 → 1/10, 8.5 → 17/2). A number therefore means what it looks like, never its binary noise.
 */
export function fromNumber(x: number): Fraction {
  const m = DECIMAL.exec(String(x));
  if (!m || !Number.isFinite(x)) throw new RangeError(`${x} is not a finite number`);
  const [, sign = '', whole = '', frac = '', exp = '0'] = m;
  let n = BigInt((whole || '0') + frac);
  let d = 10n ** BigInt(frac.length);
  const e = Number(exp);
  if (e > 0) n *= 10n ** BigInt(e);
  else if (e < 0) d *= 10n ** BigInt(-e);
  return new Fraction(sign ? -n : n, d);
}

/** Exact value of a decimal string such as "8.5" or ".125" (digits only, no sign). */
export function fromDecimalString(s: string): Fraction {
  const [whole = '', frac = ''] = s.split('.');
  return new Fraction(BigInt((whole || '0') + frac), 10n ** BigInt(frac.length));
}

export const q = (n: number | bigint, d: number | bigint = 1): Fraction => new Fraction(n, d);
export const num = (x: Fraction): number => x.valueOf();
export const ZERO = q(0);

/** Smallest multiple of `step` that is ≥ x. */
export function ceilTo(x: Fraction, step: Fraction): Fraction {
  return x.div(step).ceil().mul(step);
}

/** Largest multiple of `step` that is ≤ x. */
export function floorTo(x: Fraction, step: Fraction): Fraction {
  return x.div(step).floor().mul(step);
}

/** Nearest multiple of `step`, halves away from zero. */
export function roundTo(x: Fraction, step: Fraction): Fraction {
  return x.roundTo(step);
}

/**
 * Smallest multiple of `step` that is ≥ √x, decided exactly: m² ≥ x is compared in rationals,
 * so a cut size like S√2 + ⅞ is never rounded down by floating-point error.
 */
export function ceilSqrtTo(x: Fraction, step: Fraction): Fraction {
  if (x.s < 0n) throw new RangeError('square root of a negative number');
  let k = Math.ceil(Math.sqrt(x.valueOf()) / step.valueOf());
  while (
    k > 0 &&
    step
      .mul(k - 1)
      .pow(2)
      .gte(x)
  )
    k -= 1;
  while (step.mul(k).pow(2).lt(x)) k += 1;
  return step.mul(k);
}

export const minQ = (a: Fraction, b: Fraction): Fraction => (a.lte(b) ? a : b);
export const maxQ = (a: Fraction, b: Fraction): Fraction => (a.gte(b) ? a : b);
export const sumQ = (xs: readonly Fraction[]): Fraction => xs.reduce((s, x) => s.add(x), ZERO);

interface LengthRule {
  /** allow exactly zero (tolerances, seams) */
  zero?: boolean;
}

/** A length argument in inches: finite, not negative, and (unless `zero`) above zero. */
export function lengthArg(field: string, x: unknown, rule: LengthRule = {}): Fraction {
  if (typeof x !== 'number' || !Number.isFinite(x)) {
    throw new QuiltInputError(field, `${label(field)} must be a number of inches (got ${show(x)}).`);
  }
  if (x < 0) throw new QuiltInputError(field, `${label(field)} cannot be negative (got ${x}).`);
  if (x === 0 && !rule.zero) {
    throw new QuiltInputError(field, `${label(field)} must be more than zero.`);
  }
  return fromNumber(x);
}

/** A whole count: an integer ≥ `min`. */
export function countArg(field: string, x: unknown, min = 0): number {
  if (typeof x !== 'number' || !Number.isInteger(x) || x < min) {
    throw new QuiltInputError(field, `${label(field)} must be a whole number of at least ${min} (got ${show(x)}).`);
  }
  return x;
}

/** A non-empty list of positive lengths. */
export function lengthListArg(field: string, xs: unknown): Fraction[] {
  if (!Array.isArray(xs) || xs.length === 0) {
    throw new QuiltInputError(field, `${label(field)} needs at least one length.`);
  }
  return xs.map((x, i) => lengthArg(`${field}[${i}]`, x));
}

/** "bindingWidth" → "Binding width" for messages a person reads. */
function label(field: string): string {
  const words = field
    .replace(/\[\d+\]/g, (m) => ` ${Number(m.slice(1, -1)) + 1}`)
    .replace(/([a-z])([A-Z])/g, '$1 $2')
    .replace(/\./g, ' ');
  const lower = words.toLowerCase();
  return lower.charAt(0).toUpperCase() + lower.slice(1);
}

function show(x: unknown): string {
  if (typeof x === 'string') return JSON.stringify(x);
  if (typeof x === 'number') return String(x);
  return x === null ? 'nothing' : typeof x;
}
