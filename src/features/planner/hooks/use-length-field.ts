import { formatLength, inchesToMm, LengthParseError, parseLength } from '@shared/quilt';

export type Units = 'in' | 'mm';

export interface ParseLengthOptions {
  /** Zero (or an empty field) is allowed, e.g. "no sashing". */
  allowZero?: boolean;
  /** What a number typed without a unit means. */
  units?: Units;
}

const NEGATIVE = /^\s*[-‐‑‒–−]/;

/** One typed length ("8 1/2", "8½", "216 mm"): inches, or an error that says what is allowed. */
export function parseOne(text: string, opts: ParseLengthOptions = {}): { value: number | null; error?: string } {
  const allowed = opts.allowZero ? 'Enter a length of zero or more' : 'Enter a length greater than zero';
  if (opts.allowZero && text.trim() === '') return { value: 0 };
  if (NEGATIVE.test(text)) return { value: null, error: `${allowed}; “${text.trim()}” is negative.` };
  try {
    const value = parseLength(text, { bareUnit: opts.units ?? 'in' });
    if (value === 0 && !opts.allowZero) return { value: null, error: `${allowed}.` };
    return { value };
  } catch (error) {
    return { value: null, error: error instanceof LengthParseError ? error.message : 'Enter a length such as 3½ or 3 1/2.' };
  }
}

/** A comma-separated list of lengths: "4, 3, 2, 1". An empty entry between commas is pointed at, not dropped. */
export function parseList(
  text: string,
  opts: { allowEmpty?: boolean; units?: Units } = {},
): { values: number[] | null; error?: string } {
  if (text.trim() === '')
    return opts.allowEmpty ? { values: [] } : { values: null, error: 'Enter at least one length, separated by commas.' };
  const parts = text.split(/[,;]/).map((p) => p.trim());
  // One trailing comma is what a person leaves while typing the next entry; it is not an empty entry.
  if (parts.length > 1 && parts.at(-1) === '') parts.pop();
  const values: number[] = [];
  for (const [i, part] of parts.entries()) {
    if (part === '') return { values: null, error: `Entry ${i + 1} is empty: type a length there or remove the extra comma.` };
    const { value, error } = parseOne(part, { units: opts.units });
    if (value === null) return { values: null, error: `Entry ${i + 1} (“${part}”): ${error}` };
    values.push(value);
  }
  return { values };
}

/** A length written back as a person would type it in `units`: "3 1/2" or "88.9" (no unit mark). */
export function typedLength(inches: number, units: Units): string {
  // Hundredths keep ¼″ (6.35 mm) and every ⅛″ step exact enough to read back to the same plan.
  if (units === 'mm') return String(Number(inchesToMm(inches).toFixed(2)));
  const text = formatLength(inches, { denominator: 16 }).replace('″', '');
  return text;
}

/** Rewrites a typed length (or list) into the other unit, keeping its meaning; text that does not read is left alone. */
export function convertTyped(text: string, from: Units, to: Units, list = false): string {
  if (from === to || text.trim() === '') return text;
  if (list) {
    const parsed = parseList(text, { units: from, allowEmpty: true });
    return parsed.values ? parsed.values.map((v) => typedLength(v, to)).join(', ') : text;
  }
  const parsed = parseOne(text, { units: from, allowZero: true });
  return parsed.value === null ? text : typedLength(parsed.value, to);
}
