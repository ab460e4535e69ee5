/**
 * sRGB (IEC 61966-2-1) to CIE 1976 L*a*b* with the D65 white, checked against worked values and an
 * npm colour library.
 */
import Color from 'colorjs.io';
import { describe, expect, it } from 'vitest';
import { colourStatistics, greyForLightness, parseHex, seededRandom, srgbToLab } from '@shared/colour';

describe('sRGB to L*a*b* (D65): worked values', () => {
  // From memory, and reproduced by colorjs.io below: mid greys on the IEC 61966-2-1 curve.
  it('gives mid grey #777777 an L* of about 50.03 and #808080 about 53.59, with a* = b* = 0', () => {
    const [L1, a1, b1] = srgbToLab('#777777');
    expect(L1).toBeCloseTo(50.03, 2);
    expect(Math.abs(a1)).toBeLessThan(1e-9);
    expect(Math.abs(b1)).toBeLessThan(1e-9);
    expect(srgbToLab('#808080')[0]).toBeCloseTo(53.59, 2);
  });

  it('puts white at L* 100 and black at 0', () => {
    const white = srgbToLab('#ffffff');
    expect(white[0]).toBeCloseTo(100, 9);
    expect(Math.abs(white[1]) + Math.abs(white[2])).toBeLessThan(1e-9);
    expect(srgbToLab('#000')).toEqual([0, 0, 0]);
  });

  it('reads #rgb, #rrggbb and refuses anything else', () => {
    expect(parseHex('#abc')).toEqual([0xaa, 0xbb, 0xcc]);
    expect(parseHex('2F4B7C')).toEqual([0x2f, 0x4b, 0x7c]);
    expect(() => srgbToLab('#12345')).toThrow(RangeError);
    expect(() => srgbToLab('red')).toThrow(RangeError);
  });
});

describe('sRGB to L*a*b* against colorjs.io 0.7.1 (npm), its "lab-d65" space', () => {
  it('agrees within 0.02 on every coordinate for 1 000 random colours', () => {
    // colorjs.io derives its matrix from the primaries at full precision; ours is the standard's
    // four-decimal matrix, so the last digits differ slightly.
    const random = seededRandom(61966);
    for (let i = 0; i < 1000; i += 1) {
      const hex = `#${Math.floor(random() * 0x1000000)
        .toString(16)
        .padStart(6, '0')}`;
      const ours = srgbToLab(hex);
      const theirs = new Color(hex).to('lab-d65').coords as number[];
      for (let k = 0; k < 3; k += 1) expect(Math.abs(ours[k]! - theirs[k]!)).toBeLessThan(0.02);
    }
  });

  it('turns a lightness back into the grey of that lightness', () => {
    for (const hex of ['#000000', '#404040', '#777777', '#808080', '#c0c0c0', '#ffffff']) {
      expect(greyForLightness(srgbToLab(hex)[0])).toBe(hex);
    }
  });
});

describe('colour statistics of pixels', () => {
  it('gives the mean L*a*b* and lightness percentiles', () => {
    // 9 black pixels and 1 white: p10 and p50 black, p90 black (nearest rank 9 of 10), mean L* 10.
    const pixels = new Uint8Array(30);
    pixels.fill(255, 27, 30);
    const stats = colourStatistics(pixels, 3);
    expect(stats.meanLab[0]).toBeCloseTo(10, 2);
    expect(stats.lightness).toEqual({ p10: 0, p50: 0, p90: 0 });
    const grey = colourStatistics(new Uint8Array([0x77, 0x77, 0x77, 255]), 4);
    expect(grey.lightness.p50).toBeCloseTo(50.03, 2);
  });
});
