import { formatDeviation } from '@shared/quilt';
import { len } from '@/lib/lengths';

export type Units = 'in' | 'mm';

/** A length in the person's units: inches to the nearest 1/16″, or millimetres. */
export const lengthIn = (units: Units) => (x: number) => len(x, units);
export const deviationIn = (units: Units) => (x: number) =>
  formatDeviation(x, units === 'mm' ? { unit: 'mm' } : { denominator: 16 });

/** An expected error in words: "about ±0.06″ (under 1/16″)". */
export function expectedErrorText(inches: number, units: Units): string {
  const amount = units === 'mm' ? `${(inches * 25.4).toFixed(1)} mm` : `${inches.toFixed(2)}″`;
  const sixteenths = Math.ceil(inches * 16 - 1e-9);
  const words = inches < 1 / 16 ? 'under 1/16″' : sixteenths < 16 ? `about ${sixteenths}/16″` : 'an inch or more';
  return `about ±${amount} (${words})`;
}
