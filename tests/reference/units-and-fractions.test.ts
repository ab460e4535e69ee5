/**
 * Lengths checked against outside references: the exact inch (NIST SP 811), mathjs unit
 * conversion (exact Fraction mode) and fraction.js's reading of mixed numbers.
 */
import fc from 'fast-check';
import Fraction from 'fraction.js';
import { type FactoryFunctionMap, all, create } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { formatLength, inchesToMm, parseLength, parseLengthExact } from '@shared/quilt';

const exactMath = create(all as FactoryFunctionMap, { number: 'Fraction' });
/** mathjs's exact conversion of `value` `unit` into inches, as "n/d". */
const mathjsInches = (value: string, unit: string): string =>
  (exactMath.unit(exactMath.fraction(value), unit).toNumeric('inch') as unknown as { toFraction(): string }).toFraction();

describe('the inch is exactly 25.4 mm', () => {
  it('1 in = 25.4 mm exactly (NIST SP 811, Appendix B.8: inch = 2.54 E−02 m, exact)', () => {
    expect(parseLengthExact('25.4 mm').equals(1)).toBe(true);
    expect(inchesToMm(1)).toBe(25.4);
    expect(formatLength(1, { unit: 'mm' })).toBe('25.4 mm');
  });

  it('1 yd = 0.9144 m exactly (NIST SP 811 App. B.8; Addendum to NBS Circular 572, 1959)', () => {
    expect(parseLengthExact('0.9144 m').equals(36)).toBe(true);
    expect(parseLengthExact('1 yd').equals(parseLengthExact('914.4 mm'))).toBe(true);
  });

  it('¼″ = 6.35 mm and 12½″ = 317.5 mm (NIST SP 811, Appendix B.8: the inch is exactly 25.4 mm)', () => {
    expect(inchesToMm(0.25)).toBe(6.35);
    expect(inchesToMm(12.5)).toBe(317.5);
    expect(parseLength('6.35 mm')).toBe(0.25);
    expect(parseLength('317.5 mm')).toBe(12.5);
  });
});

describe('metric input agrees with mathjs (reference library, exact Fraction mode)', () => {
  it.each([
    ['216', 'mm'],
    ['21.6', 'cm'],
    ['0.25', 'yard'],
    ['8.5', 'inch'],
    ['3', 'm'],
  ])('%s %s', (value, unit) => {
    const ours = parseLengthExact(`${value} ${unit === 'yard' ? 'yd' : unit === 'inch' ? 'in' : unit}`);
    expect(ours.toFraction()).toBe(mathjsInches(value, unit));
  });

  it('for any millimetre value to 0.1 mm', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 100_000 }), (tenths) => {
        const mm = (tenths / 10).toFixed(1);
        expect(parseLengthExact(`${mm} mm`).toFraction()).toBe(mathjsInches(mm, 'mm'));
      }),
    );
  });
});

describe('mixed numbers agree with fraction.js (reference library)', () => {
  const mixed = fc
    .tuple(fc.integer({ min: 0, max: 120 }), fc.integer({ min: 2, max: 64 }))
    .chain(([whole, d]) => fc.integer({ min: 1, max: d - 1 }).map((n) => ({ whole, n, d })));

  it('reads "w n/d" as fraction.js does', () => {
    fc.assert(
      fc.property(mixed, ({ whole, n, d }) => {
        const text = `${whole} ${n}/${d}`;
        expect(parseLengthExact(text).equals(new Fraction(text))).toBe(true);
        expect(parseLengthExact(`${whole}-${n}/${d}"`).equals(new Fraction(text))).toBe(true);
      }),
    );
  });

  it('writes sixteenths that fraction.js reads back to the same value', () => {
    const vulgar: Record<string, string> = {
      '½': ' 1/2',
      '¼': ' 1/4',
      '¾': ' 3/4',
      '⅛': ' 1/8',
      '⅜': ' 3/8',
      '⅝': ' 5/8',
      '⅞': ' 7/8',
    };
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 16 * 100 }), (k) => {
        const ascii = formatLength(k / 16, { denominator: 16 })
          .replace(/[½¼¾⅛⅜⅝⅞]/g, (c) => vulgar[c] ?? c)
          .replace('⁄', '/')
          .replace('″', '')
          .trim();
        expect(new Fraction(ascii).equals(new Fraction(k, 16))).toBe(true);
      }),
    );
  });
});
