/**
 * Mattress sizes in inches (width × length), from a mattress industry council's size chart.
 * Separately, U.S. CPSC guidance for full-size cribs (16 CFR 1241) gives the crib interior as
 * 28 ± ⅝ × 52⅜ ± ⅝.
 */
import { QuiltInputError, lengthArg } from './rational';

export type MattressSize = 'crib' | 'twin' | 'full' | 'queen' | 'king' | 'california-king';

export const MATTRESS_SIZES: Readonly<Record<MattressSize, { width: number; length: number }>> = {
  crib: { width: 27, length: 52 },
  twin: { width: 38, length: 75 },
  full: { width: 54, length: 75 },
  queen: { width: 60, length: 80 },
  king: { width: 76, length: 80 },
  'california-king': { width: 72, length: 84 },
};

/** Full-size crib interior per U.S. CPSC guidance (16 CFR 1241), inches. */
export const CRIB_INTERIOR_CPSC = { width: 28, length: 52.375, tolerance: 0.625 } as const;

/**
 * Finished quilt size for a bed: mattress width + 2 × drop, mattress length + drop (at the foot)
 * + pillow tuck. Drop and tuck depend on the bed, so both are parameters (default 0: the top of the
 * mattress only).
 */
export function quiltSizeForBed(
  mattress: MattressSize,
  opts: { drop?: number; pillowTuck?: number } = {},
): { width: number; height: number } {
  const size = MATTRESS_SIZES[mattress];
  if (!size)
    throw new QuiltInputError('mattress', `Unknown mattress size; use one of ${Object.keys(MATTRESS_SIZES).join(', ')}.`);
  const drop = lengthArg('drop', opts.drop ?? 0, { zero: true });
  const tuck = lengthArg('pillowTuck', opts.pillowTuck ?? 0, { zero: true });
  return {
    width: drop.mul(2).add(size.width).valueOf(),
    height: drop.add(tuck).add(size.length).valueOf(),
  };
}
