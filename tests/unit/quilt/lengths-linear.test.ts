/**
 * The length reader on hostile input: long text is refused before anything reads it, and the
 * one-pass split of number and unit agrees with the pattern it replaced on every short string.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { LengthParseError, parseLength } from '@shared/quilt';
import { MAX_LENGTH_TEXT, splitLengthText } from '../../../shared/quilt/lengths';

// The pattern the reader used before: right on short strings, but it backtracks on long runs of dots.
// eslint-disable-next-line regexp/no-super-linear-backtracking -- the oracle, run only on short strings
const OLD_SHAPE = /^([\d.,/ -]*[\d.])\s*([a-z"'.]*)$/;

function oldSplit(s: string): [string, string] | null {
  const m = OLD_SHAPE.exec(s);
  return m ? [m[1]!, m[2]!] : null;
}

describe('splitLengthText', () => {
  it.each([
    ['8.5in.', ['8.5', 'in.']],
    ['8.', ['8.', '']],
    ['8 in', ['8', 'in']],
    ['8 1/2 "', ['8 1/2', '"']],
    ['8..', ['8..', '']],
    ['8 -', null],
    ['in', null],
    ['8 1/2 in 3', null],
  ])('splits %j into %j', (text, expected) => {
    expect(splitLengthText(text)).toEqual(expected);
  });

  it('agrees with the former pattern on every short string of the characters it reads', () => {
    const alphabet = fc.constantFrom(...'0123456789.,/ -inmcyd"\'x'.split(''));
    fc.assert(
      fc.property(
        fc.array(alphabet, { maxLength: 14 }).map((chars) => chars.join('').trim().replace(/ +/g, ' ')),
        (s) => {
          expect(splitLengthText(s)).toEqual(oldSplit(s));
        },
      ),
      { numRuns: 5000 },
    );
  });
});

describe('parseLength on long input', () => {
  const pathological = {
    dots: '.'.repeat(100_000) + '!',
    digits: '9'.repeat(100_000),
    spaces: `8${' '.repeat(100_000)}!`,
    slashes: `1${'/2'.repeat(50_000)}`,
    hyphens: `8${' - 1'.repeat(25_000)}/2`,
    unit: `8 ${'in.'.repeat(30_000)}`,
    vulgar: '½'.repeat(50_000),
  };

  it.each(Object.entries(pathological))('refuses a long run of %s with a plain reason', (_name, text) => {
    let error: unknown;
    try {
      parseLength(text);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(LengthParseError);
    expect((error as LengthParseError).message).toBe(
      `A length needs at most ${MAX_LENGTH_TEXT} characters; for example 8 1/2, 8½″, 8.5 in or 216 mm.`,
    );
    expect((error as LengthParseError).input.length).toBe(MAX_LENGTH_TEXT);
  });

  it('still reads a length written out at the longest allowed', () => {
    const text = `12 1/2 inches${' '.repeat(MAX_LENGTH_TEXT - 13)}`;
    expect(text.length).toBe(MAX_LENGTH_TEXT);
    expect(parseLength(text)).toBe(12.5);
    expect(() => parseLength(`${text} `)).toThrow(LengthParseError);
  });
});
