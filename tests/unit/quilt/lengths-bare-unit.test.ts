/** A bare number read as millimetres when the person works in millimetres. */
import { describe, expect, it } from 'vitest';
import { LengthParseError, parseLength, parseLengthExact } from '@shared/quilt';

describe('parseLength with bareUnit', () => {
  it('reads a bare number as millimetres in millimetre mode (1 in = 25.4 mm exactly, NIST SP 811, Appendix B.8)', () => {
    expect(parseLengthExact('254', { bareUnit: 'mm' }).equals(10)).toBe(true);
    expect(parseLength('64', { bareUnit: 'mm' })).toBeCloseTo(64 / 25.4, 12);
    expect(parseLengthExact('6.35', { bareUnit: 'mm' }).equals(0.25)).toBe(true);
  });

  it('keeps a unit that was typed: inches stay inches, centimetres stay centimetres', () => {
    expect(parseLength('2"', { bareUnit: 'mm' })).toBe(2);
    expect(parseLength('2 in', { bareUnit: 'mm' })).toBe(2);
    expect(parseLength('2½″', { bareUnit: 'mm' })).toBe(2.5);
    expect(parseLengthExact('2.54 cm', { bareUnit: 'mm' }).equals(1)).toBe(true);
  });

  it('still reads a bare number as inches by default', () => {
    expect(parseLength('64')).toBe(64);
    expect(parseLength('64', { bareUnit: 'in' })).toBe(64);
  });

  it('still refuses what it refused before', () => {
    expect(() => parseLength('-3', { bareUnit: 'mm' })).toThrow(LengthParseError);
    expect(() => parseLength('1/', { bareUnit: 'mm' })).toThrow(LengthParseError);
  });
});
