/** Colour statistics of a photo from its pixels: mean L*a*b* (D65) and the spread of lightness. */
import { linearRgbToLab, srgbChannelToLinear } from './lab';

export interface ColourStatistics {
  meanLab: [number, number, number];
  /** L* below which 10 %, 50 % and 90 % of the pixels lie */
  lightness: { p10: number; p50: number; p90: number };
}

const LINEAR = Array.from({ length: 256 }, (_, i) => srgbChannelToLinear(i));
const round2 = (x: number) => Math.round(x * 100) / 100;

/**
 * Statistics of 8-bit sRGB pixels, `channels` bytes per pixel (3 or 4; alpha ignored). The mean is
 * the mean of each pixel's L*a*b*; percentiles are nearest-rank. Values rounded to 0.01.
 */
export function colourStatistics(pixels: Uint8Array | Uint8ClampedArray, channels = 3): ColourStatistics {
  if (channels < 3) throw new RangeError('Need at least three channels per pixel.');
  const count = Math.floor(pixels.length / channels);
  if (count === 0) throw new RangeError('No pixels to measure.');
  const lights = new Float64Array(count);
  let sl = 0;
  let sa = 0;
  let sb = 0;
  for (let i = 0; i < count; i += 1) {
    const o = i * channels;
    const [L, a, b] = linearRgbToLab(LINEAR[pixels[o]!]!, LINEAR[pixels[o + 1]!]!, LINEAR[pixels[o + 2]!]!);
    lights[i] = L;
    sl += L;
    sa += a;
    sb += b;
  }
  lights.sort();
  const rank = (p: number) => lights[Math.min(count - 1, Math.max(0, Math.ceil(p * count) - 1))]!;
  return {
    meanLab: [round2(sl / count), round2(sa / count), round2(sb / count)],
    lightness: { p10: round2(rank(0.1)), p50: round2(rank(0.5)), p90: round2(rank(0.9)) },
  };
}
