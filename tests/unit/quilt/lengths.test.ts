import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  LengthParseError,
  formatDeviation,
  formatLength,
  inchesToMm,
  mmToInches,
  parseLength,
  parseLengthExact,
} from '@shared/quilt';

describe('parseLength', () => {
  it.each([
    ['8 1/2', 8.5],
    ['8½', 8.5],
    ['8-1/2"', 8.5],
    ['8 - 1/2', 8.5],
    ['8-½', 8.5],
    ['8.5', 8.5],
    ['8.5in', 8.5],
    ['3/4', 0.75],
    ['8 1/2 in', 8.5],
    ['8½″', 8.5],
    ['8½”', 8.5],
    ['12.5 inches', 12.5],
    ['0.125', 0.125],
    ['.5', 0.5],
    ['1 inch', 1],
    ['0.25 yd', 9],
    ['1 yard', 36],
    ['8 3⁄16″', 8.1875],
    ['8³⁄₁₆', 8.1875],
    ['¹⁄₁₆″', 0.0625],
    ['  8 1/2  ', 8.5],
    ['8\u00a01/2', 8.5],
    ['0', 0],
  ])('reads %j as %d inches', (text, inches) => {
    expect(parseLength(text)).toBe(inches);
  });

  it('reads metric exactly: 254 mm is 10″, 21.6 cm is 216 mm', () => {
    expect(parseLength('254 mm')).toBe(10);
    expect(parseLengthExact('21.6 cm').equals(parseLengthExact('216 mm'))).toBe(true);
    expect(parseLengthExact('216 mm').toFraction()).toBe('1080/127');
    expect(parseLength('21,6 cm')).toBe(parseLength('21.6 cm'));
  });

  it.each([
    ['', /Enter a length/],
    ['   ', /Enter a length/],
    ['-3', /negative/],
    ['-1/2', /negative/],
    ['−½', /negative/],
    ['8 1/0', /divides by zero/],
    ['1/0', /divides by zero/],
    ['abc', /not a length we can read/],
    ['8 3/2', /less than 1/],
    ['8 furlongs', /not a unit we know/],
    ["8'", /not a unit we know/],
    ['1/2/3', /not a length we can read/],
    ['1,000 mm', /ambiguous/],
  ])('rejects %j with a message a person understands', (text, message) => {
    let error: unknown;
    try {
      parseLength(text);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(LengthParseError);
    expect(error).toBeInstanceOf(Error);
    expect((error as Error).message).toMatch(message);
    expect((error as LengthParseError).input).toBeTypeOf('string');
  });
});

describe('formatLength', () => {
  it.each([
    [8.5, undefined, '8½″'],
    [8, undefined, '8″'],
    [0.5, undefined, '½″'],
    [8.125, undefined, '8⅛″'],
    [8.375, undefined, '8⅜″'],
    [8.625, undefined, '8⅝″'],
    [8.875, undefined, '8⅞″'],
    [8.25, undefined, '8¼″'],
    [8.75, undefined, '8¾″'],
    [0, undefined, '0″'],
    [8.1875, 16, '8 3⁄16″'],
    [0.0625, 16, '1⁄16″'],
    [8.5, 16, '8½″'],
    [8.96875, 16, '9″'],
  ] as const)('writes %d (denominator %s) as %s', (inches, denominator, text) => {
    expect(formatLength(inches, denominator ? { denominator } : {})).toBe(text);
  });

  it('rounds to the nearest step, halves up', () => {
    expect(formatLength(8.0625)).toBe('8⅛″');
    expect(formatLength(8.06)).toBe('8″');
    expect(formatLength(8.1875)).toBe('8¼″');
    expect(formatLength(8.03125, { denominator: 16 })).toBe('8 1⁄16″');
  });

  it('writes millimetres to one decimal', () => {
    expect(formatLength(8.5, { unit: 'mm' })).toBe('215.9 mm');
    expect(formatLength(10, { unit: 'mm' })).toBe('254.0 mm');
    expect(formatLength(0.25, { unit: 'mm' })).toBe('6.4 mm');
  });

  it('refuses negative and non-finite input; deviations carry a sign', () => {
    expect(() => formatLength(-1)).toThrow(RangeError);
    expect(() => formatLength(Number.NaN)).toThrow(RangeError);
    expect(formatDeviation(-0.125)).toBe('−⅛″');
    expect(formatDeviation(0.1875, { denominator: 16 })).toBe('+3⁄16″');
    expect(formatDeviation(0)).toBe('0″');
  });
});

describe('parse ∘ format round trips', () => {
  const steps = (den: number) => fc.integer({ min: 0, max: 200 * den }).map((k) => k / den);

  it('is the identity on multiples of ⅛″', () => {
    fc.assert(fc.property(steps(8), (x) => parseLength(formatLength(x)) === x));
  });

  it('is the identity on multiples of 1/16″', () => {
    fc.assert(fc.property(steps(16), (x) => parseLength(formatLength(x, { denominator: 16 })) === x));
  });

  it('rounds any length to the nearest step and stays there', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 500, noNaN: true }), fc.constantFrom(8 as const, 16 as const), (x, denominator) => {
        const text = formatLength(x, { denominator });
        const back = parseLength(text);
        expect(Math.abs(back - x)).toBeLessThanOrEqual(1 / denominator / 2 + 1e-9);
        expect(back * denominator).toBe(Math.round(back * denominator));
        expect(formatLength(back, { denominator })).toBe(text);
      }),
    );
  });

  it('is stable through millimetres', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 50_000 }), (tenths) => {
        const text = `${(tenths / 10).toFixed(1)} mm`;
        expect(formatLength(parseLength(text), { unit: 'mm' })).toBe(text);
      }),
    );
    fc.assert(
      fc.property(fc.double({ min: 0, max: 200, noNaN: true }), (x) => {
        const text = formatLength(x, { unit: 'mm' });
        expect(formatLength(parseLength(text), { unit: 'mm' })).toBe(text);
      }),
    );
  });

  it('converts inches and millimetres both ways', () => {
    expect(inchesToMm(1)).toBe(25.4);
    expect(mmToInches(254)).toBe(10);
    fc.assert(fc.property(fc.integer({ min: 0, max: 100_000 }), (k) => mmToInches(inchesToMm(k / 64)) === k / 64));
  });
});
