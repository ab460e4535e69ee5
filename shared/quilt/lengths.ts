/**
 * Reading and writing lengths the way quilters type them: mixed fractions, Unicode fractions,
 * decimals, and metric. 1 in = 25.4 mm exactly (NIST SP 811, Appendix B.8).
 */
import { type Fraction, fromDecimalString, fromNumber, q, roundTo } from './rational';

export const MM_PER_INCH = q(254, 10);
const UNIT_FACTORS: Record<string, Fraction> = {
  in: q(1),
  mm: q(10, 254),
  cm: q(100, 254),
  m: q(10000, 254),
  yd: q(36),
  ft: q(12),
};

/** Every spelling of a unit we accept, mapped to its canonical name. */
const UNIT_WORDS: Record<string, string> = {
  '': 'in',
  '"': 'in',
  "''": 'in',
  in: 'in',
  'in.': 'in',
  inch: 'in',
  inches: 'in',
  mm: 'mm',
  millimetre: 'mm',
  millimetres: 'mm',
  millimeter: 'mm',
  millimeters: 'mm',
  cm: 'cm',
  centimetre: 'cm',
  centimetres: 'cm',
  centimeter: 'cm',
  centimeters: 'cm',
  m: 'm',
  metre: 'm',
  metres: 'm',
  meter: 'm',
  meters: 'm',
  yd: 'yd',
  yds: 'yd',
  yard: 'yd',
  yards: 'yd',
  ft: 'ft',
  foot: 'ft',
  feet: 'ft',
};

const VULGAR: Record<string, [number, number]> = {
  '½': [1, 2],
  '⅓': [1, 3],
  '⅔': [2, 3],
  '¼': [1, 4],
  '¾': [3, 4],
  '⅕': [1, 5],
  '⅖': [2, 5],
  '⅗': [3, 5],
  '⅘': [4, 5],
  '⅙': [1, 6],
  '⅚': [5, 6],
  '⅐': [1, 7],
  '⅛': [1, 8],
  '⅜': [3, 8],
  '⅝': [5, 8],
  '⅞': [7, 8],
  '⅑': [1, 9],
  '⅒': [1, 10],
};
const SUPERSCRIPT = '⁰¹²³⁴⁵⁶⁷⁸⁹';
const SUBSCRIPT = '₀₁₂₃₄₅₆₇₈₉';
const EXAMPLES = 'for example 8 1/2, 8½″, 8.5 in or 216 mm';

/** A length a person typed that cannot be read; the message says why in plain words. */
export class LengthParseError extends Error {
  readonly input: string;
  constructor(input: string, message: string) {
    super(message);
    this.name = 'LengthParseError';
    this.input = input;
  }
}

/** Rewrites typographic variants (½, ³⁄₁₆, ″, ”, NBSP, fraction slash) into plain ASCII. */
function normalise(text: string): string {
  let out = '';
  let prev = '';
  for (const ch of text) {
    const sup = SUPERSCRIPT.indexOf(ch);
    const sub = SUBSCRIPT.indexOf(ch);
    const vulgar = VULGAR[ch];
    if (vulgar) out += ` ${vulgar[0]}/${vulgar[1]} `;
    else if (sup >= 0) out += (/\d/.test(prev) ? ' ' : '') + String(sup);
    else if (sub >= 0) out += String(sub);
    else if ('⁄∕÷'.includes(ch)) out += '/';
    else if ('″“”＂'.includes(ch)) out += '"';
    else if ('′’‘'.includes(ch)) out += "'";
    else if ('‐‑‒–−'.includes(ch)) out += '-';
    else if (/\s/u.test(ch)) out += ' ';
    else out += ch;
    prev = ch;
  }
  return out.trim().replace(/\s+/g, ' ').toLowerCase();
}

/** Longest text parseLength reads; a length needs far fewer characters, and long input is refused unread. */
export const MAX_LENGTH_TEXT = 40;

const NUMBER_CHARS = new Set('0123456789.,/ -');
const UNIT_TAIL = /^[a-z"'.]*$/;

/**
 * Splits normalised text (lower case, single spaces) into its number and its unit word in one pass,
 * or null when it has no such shape. A dot may belong to either (`8.` and `in.`): the number takes
 * every dot it can, as a greedy pattern would, but nothing is ever tried twice.
 */
export function splitLengthText(s: string): [string, string] | null {
  let end = 0;
  while (end < s.length && NUMBER_CHARS.has(s[end]!)) end += 1;
  const unit = s.slice(end);
  if (!UNIT_TAIL.test(unit)) return null;
  let last = end;
  while (last > 0 && s[last - 1] === ' ') last -= 1;
  const tail = s[last - 1];
  if (tail === undefined || !(tail === '.' || (tail >= '0' && tail <= '9'))) return null;
  return [s.slice(0, last), unit];
}
const INTEGER = /^\d+$/;
const DECIMAL = /^(\d*)[.,](\d*)$/;
const FRACTION = /^(\d+)\/(\d+)$/;
const MIXED = /^(\d+)(?: | ?- ?)(\d+)\/(\d+)$/;

function readNumber(raw: string, input: string): Fraction {
  const s = raw.trim();
  if (INTEGER.test(s)) return q(BigInt(s));
  const dec = DECIMAL.exec(s);
  if (dec && (dec[1] || dec[2])) {
    if (s.includes(',') && dec[2]?.length === 3) {
      throw new LengthParseError(
        input,
        `“${input}” is ambiguous: write ${dec[1]}${dec[2]} or ${dec[1]}.${dec[2]} without the comma.`,
      );
    }
    return fromDecimalString(`${dec[1]}.${dec[2]}`);
  }
  const frac = FRACTION.exec(s);
  const mixed = MIXED.exec(s);
  const [whole, n, d] = frac ? ['0', frac[1], frac[2]] : mixed ? [mixed[1], mixed[2], mixed[3]] : [];
  if (whole === undefined || n === undefined || d === undefined) {
    throw new LengthParseError(input, `“${input}” is not a length we can read; ${EXAMPLES}.`);
  }
  if (BigInt(d) === 0n) {
    throw new LengthParseError(input, `“${input}” divides by zero; the number under the fraction line must be 1 or more.`);
  }
  const part = q(BigInt(n), BigInt(d));
  if (mixed && part.gte(1)) {
    throw new LengthParseError(input, `In “${input}” the fraction after the whole number should be less than 1, like 8 1/2.`);
  }
  return part.add(BigInt(whole));
}

export interface ParseOptions {
  /** What a number typed with no unit means: inches (the default) or millimetres. Numbers passed as numbers are always inches. */
  bareUnit?: 'in' | 'mm';
}

/** Exact version of parseLength: the length in inches as a Fraction. */
export function parseLengthExact(text: string | number, opts: ParseOptions = {}): Fraction {
  if (typeof text === 'number') {
    if (!Number.isFinite(text)) throw new LengthParseError(String(text), 'A length must be a finite number.');
    if (text < 0) throw new LengthParseError(String(text), `${text} is negative; a length must be zero or more.`);
    return fromNumber(text);
  }
  if (typeof text !== 'string') throw new LengthParseError(String(text), `Enter a length, ${EXAMPLES}.`);
  if (text.length > MAX_LENGTH_TEXT) {
    throw new LengthParseError(
      text.slice(0, MAX_LENGTH_TEXT),
      `A length needs at most ${MAX_LENGTH_TEXT} characters; ${EXAMPLES}.`,
    );
  }
  const s = normalise(text);
  if (s === '') throw new LengthParseError(text, `Enter a length, ${EXAMPLES}.`);
  if (/^-\s*[\d.]/.test(s)) {
    throw new LengthParseError(text, `“${text.trim()}” is negative; a length must be zero or more.`);
  }
  const shape = splitLengthText(s);
  if (!shape) throw new LengthParseError(text, `“${text.trim()}” is not a length we can read; ${EXAMPLES}.`);
  const [numberPart, unitWord] = shape;
  const unit = unitWord === '' ? (opts.bareUnit ?? 'in') : UNIT_WORDS[unitWord];
  if (!unit) {
    throw new LengthParseError(text, `“${unitWord}” is not a unit we know; use in, mm, cm or yd.`);
  }
  const value = readNumber(numberPart, text.trim());
  const factor = UNIT_FACTORS[unit] ?? q(1);
  return value.mul(factor);
}

/**
 * Inches from a typed length: `8 1/2`, `8½`, `8-1/2"`, `8.5`, `8.5in`, `3/4`, `8 3⁄16″`, `216 mm`,
 * `21.6 cm`, `0.25 yd`, `12.5 inches`. Throws LengthParseError for anything else, including
 * negative lengths and a zero denominator. Zero is accepted (a tolerance may be 0).
 */
export function parseLength(text: string, opts: ParseOptions = {}): number {
  return parseLengthExact(text, opts).valueOf();
}

export interface FormatOptions {
  unit?: 'in' | 'mm';
  denominator?: 8 | 16;
}

const VULGAR_OUT: Record<string, string> = {
  '1/2': '½',
  '1/4': '¼',
  '3/4': '¾',
  '1/8': '⅛',
  '3/8': '⅜',
  '5/8': '⅝',
  '7/8': '⅞',
};

/** Exact version of formatLength. */
export function formatLengthExact(inches: Fraction, opts: FormatOptions = {}): string {
  if (inches.s < 0n) throw new RangeError('formatLength formats lengths of zero or more; use formatDeviation for signed values.');
  if (opts.unit === 'mm') {
    const tenths = roundTo(inches.mul(MM_PER_INCH), q(1, 10));
    return `${tenths.valueOf().toFixed(1)} mm`;
  }
  const denominator = opts.denominator ?? 8;
  if (denominator !== 8 && denominator !== 16) throw new RangeError('denominator must be 8 or 16');
  const steps = roundTo(inches, q(1, denominator)).mul(denominator);
  const total = steps.n; // a whole number of steps
  const whole = total / BigInt(denominator);
  const rest = q(total % BigInt(denominator), denominator);
  if (rest.n === 0n) return `${whole}″`;
  const key = `${rest.n}/${rest.d}`;
  const vulgar = VULGAR_OUT[key];
  const lead = whole === 0n ? '' : String(whole);
  if (vulgar) return `${lead}${vulgar}″`;
  return `${lead}${lead ? ' ' : ''}${rest.n}⁄${rest.d}″`;
}

/**
 * `8½″`, `8 3⁄16″` (fraction slash), rounded to the nearest ⅛″ (default) or 1/16″, halves up;
 * or millimetres to one decimal (`215.9 mm`). parseLength reads back everything written here.
 */
export function formatLength(inches: number, opts: FormatOptions = {}): string {
  if (typeof inches !== 'number' || !Number.isFinite(inches))
    throw new RangeError(`Cannot format ${String(inches)} as a length.`);
  return formatLengthExact(fromNumber(inches), opts);
}

/** A signed difference such as a measured deviation: `+⅛″`, `−3⁄16″`, `0″`, `+3.2 mm`. */
export function formatDeviation(inches: number, opts: FormatOptions = {}): string {
  const x = fromNumber(inches);
  const text = formatLengthExact(x.abs(), opts);
  if (/^0(?:\.0)?[″ ]/.test(text)) return text;
  return `${x.s < 0n ? '−' : '+'}${text}`;
}

export const inchesToMm = (inches: number): number => fromNumber(inches).mul(MM_PER_INCH).valueOf();
export const mmToInches = (mm: number): number => fromNumber(mm).div(MM_PER_INCH).valueOf();
