import { useState } from 'react';
import { LengthParseError, parseLength } from '@shared/quilt';

export interface LengthField {
  text: string;
  setText(text: string): void;
  value: number | null;
  error?: string;
}

/** A length typed in any accepted form ("8 1/2", "8½", "216 mm"); keeps the text, parses it live. */
export function useLengthField(initial: string, opts: { allowZero?: boolean } = {}): LengthField {
  const [text, setText] = useState(initial);
  const { value, error } = parseOne(text, opts.allowZero);
  return { text, setText, value, error };
}

export function parseOne(text: string, allowZero = false): { value: number | null; error?: string } {
  if (allowZero && text.trim() === '') return { value: 0 };
  try {
    const value = parseLength(text);
    if (value === 0 && !allowZero) return { value: null, error: 'Enter a length greater than zero.' };
    return { value };
  } catch (error) {
    return { value: null, error: error instanceof LengthParseError ? error.message : 'Enter a length such as 3½ or 3 1/2.' };
  }
}

/** A comma-separated list of lengths: "4, 3, 2, 1". */
export function parseList(text: string, allowEmpty = false): { values: number[] | null; error?: string } {
  const parts = text
    .split(/[,;]/)
    .map((p) => p.trim())
    .filter(Boolean);
  if (parts.length === 0)
    return allowEmpty ? { values: [] } : { values: null, error: 'Enter at least one length, separated by commas.' };
  const values: number[] = [];
  for (const [i, part] of parts.entries()) {
    const { value, error } = parseOne(part);
    if (value === null) return { values: null, error: `Entry ${i + 1} (“${part}”): ${error}` };
    values.push(value);
  }
  return { values };
}
