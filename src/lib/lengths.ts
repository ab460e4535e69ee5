import { formatDeviation, formatLength } from '@shared/quilt';
import type { Units } from '@shared/schemas/auth';

/** A length as the viewer reads it: 8½″ to the nearest 1/16″, or 215.9 mm in millimetre mode. */
export const len = (inches: number, units: Units = 'in') => formatLength(inches, { unit: units, denominator: 16 });
/** "8½″ × 8½″", or "215.9 mm × 215.9 mm" in millimetre mode. */
export const sizeText = (s: { width: number; height: number }, units: Units = 'in') =>
  `${len(s.width, units)} × ${len(s.height, units)}`;
/** A signed difference as the viewer reads it: +⅛″ or −3⁄16″, or +3.2 mm in millimetre mode. */
export const deviation = (inches: number, units: Units = 'in') => formatDeviation(inches, { unit: units, denominator: 16 });
/** ⅛-yard steps as a fraction: "1⅜ yd". */
export const yards = (y: number) => formatLength(y).replace('″', ' yd');
