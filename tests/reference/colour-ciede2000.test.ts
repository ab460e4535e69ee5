/**
 * CIEDE2000 against the published test data, and against an npm colour library on many more pairs.
 */
import Color from 'colorjs.io';
import { describe, expect, it } from 'vitest';
import { deltaE2000, seededRandom, type Lab } from '@shared/colour';

// G. Sharma, W. Wu and E. N. Dalal, "The CIEDE2000 Color-Difference Formula: Implementation Notes,
// Supplementary Test Data, and Mathematical Observations", Color Research and Application 30(1),
// 21–30 (2005), Table 1: all 34 pairs, [L1, a1, b1, L2, a2, b2, ΔE00] to four decimals.
const SHARMA_WU_DALAL_2005: [number, number, number, number, number, number, number][] = [
  [50.0, 2.6772, -79.7751, 50.0, 0.0, -82.7485, 2.0425],
  [50.0, 3.1571, -77.2803, 50.0, 0.0, -82.7485, 2.8615],
  [50.0, 2.8361, -74.02, 50.0, 0.0, -82.7485, 3.4412],
  [50.0, -1.3802, -84.2814, 50.0, 0.0, -82.7485, 1.0],
  [50.0, -1.1848, -84.8006, 50.0, 0.0, -82.7485, 1.0],
  [50.0, -0.9009, -85.5211, 50.0, 0.0, -82.7485, 1.0],
  [50.0, 0.0, 0.0, 50.0, -1.0, 2.0, 2.3669],
  [50.0, -1.0, 2.0, 50.0, 0.0, 0.0, 2.3669],
  [50.0, 2.49, -0.001, 50.0, -2.49, 0.0009, 7.1792],
  [50.0, 2.49, -0.001, 50.0, -2.49, 0.001, 7.1792],
  [50.0, 2.49, -0.001, 50.0, -2.49, 0.0011, 7.2195],
  [50.0, 2.49, -0.001, 50.0, -2.49, 0.0012, 7.2195],
  [50.0, -0.001, 2.49, 50.0, 0.0009, -2.49, 4.8045],
  [50.0, -0.001, 2.49, 50.0, 0.001, -2.49, 4.8045],
  [50.0, -0.001, 2.49, 50.0, 0.0011, -2.49, 4.7461],
  [50.0, 2.5, 0.0, 50.0, 0.0, -2.5, 4.3065],
  [50.0, 2.5, 0.0, 73.0, 25.0, -18.0, 27.1492],
  [50.0, 2.5, 0.0, 61.0, -5.0, 29.0, 22.8977],
  [50.0, 2.5, 0.0, 56.0, -27.0, -3.0, 31.903],
  [50.0, 2.5, 0.0, 58.0, 24.0, 15.0, 19.4535],
  [50.0, 2.5, 0.0, 50.0, 3.1736, 0.5854, 1.0],
  [50.0, 2.5, 0.0, 50.0, 3.2972, 0.0, 1.0],
  [50.0, 2.5, 0.0, 50.0, 1.8634, 0.5757, 1.0],
  [50.0, 2.5, 0.0, 50.0, 3.2592, 0.335, 1.0],
  [60.2574, -34.0099, 36.2677, 60.4626, -34.1751, 39.4387, 1.2644],
  [63.0109, -31.0961, -5.8663, 62.8187, -29.7946, -4.0864, 1.263],
  [61.2901, 3.7196, -5.3901, 61.4292, 2.248, -4.962, 1.8731],
  [35.0831, -44.1164, 3.7933, 35.0232, -40.0716, 1.5901, 1.8645],
  [22.7233, 20.0904, -46.694, 23.0331, 14.973, -42.5619, 2.0373],
  [36.4612, 47.858, 18.3852, 36.2715, 50.5065, 21.2231, 1.4146],
  [90.8027, -2.0831, 1.441, 91.1528, -1.6435, 0.0447, 1.4441],
  [90.9257, -0.5406, -0.9208, 88.6381, -0.8985, -0.7239, 1.5381],
  [6.7747, -0.2908, -2.4247, 5.8714, -0.0985, -2.2286, 0.6377],
  [2.0776, 0.0795, -1.135, 0.9033, -0.0636, -0.5514, 0.9082],
];

describe('CIEDE2000: Sharma, Wu and Dalal (2005), "The CIEDE2000 Color-Difference Formula: Implementation Notes, Supplementary Test Data, and Mathematical Observations", Table 1', () => {
  it('has all 34 published pairs', () => {
    expect(SHARMA_WU_DALAL_2005).toHaveLength(34);
  });

  it.each(SHARMA_WU_DALAL_2005.map((row, i) => [i + 1, row] as const))(
    'pair %i matches to the published four decimals, both ways round',
    (_n, row) => {
      const [L1, a1, b1, L2, a2, b2, expected] = row;
      const one: Lab = [L1, a1, b1];
      const two: Lab = [L2, a2, b2];
      expect(deltaE2000(one, two)).toBeCloseTo(expected, 4);
      expect(deltaE2000(two, one)).toBeCloseTo(expected, 4);
    },
  );

  it('is zero for a colour against itself', () => {
    expect(deltaE2000([41.2, -12, 33], [41.2, -12, 33])).toBe(0);
  });
});

describe('CIEDE2000 against colorjs.io 0.7.1 (npm), deltaE2000 on its "lab" space', () => {
  it('agrees on the published pairs (the library reproduces Table 1 too)', () => {
    for (const [L1, a1, b1, L2, a2, b2, expected] of SHARMA_WU_DALAL_2005) {
      const theirs = new Color('lab', [L1, a1, b1]).deltaE2000(new Color('lab', [L2, a2, b2]));
      expect(theirs).toBeCloseTo(expected, 4);
    }
  });

  it('agrees to 1e-9 on 2 000 random pairs across the L*a*b* range', () => {
    const random = seededRandom(2005);
    const lab = (): Lab => [random() * 100, random() * 250 - 125, random() * 250 - 125];
    for (let i = 0; i < 2000; i += 1) {
      const one = lab();
      const two = lab();
      const theirs = new Color('lab', [...one]).deltaE2000(new Color('lab', [...two]));
      expect(Math.abs(deltaE2000(one, two) - theirs)).toBeLessThan(1e-9);
    }
  });
});
