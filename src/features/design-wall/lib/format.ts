import { formatLength } from '@shared/quilt';

/** 8½″, to the nearest 1/16″. */
export const len = (x: number) => formatLength(x, { denominator: 16 });
export const sizeText = (s: { width: number; height: number }) => `${len(s.width)} × ${len(s.height)}`;
/** ⅛-yard steps as a fraction: "1⅜ yd". */
export const yards = (y: number) => formatLength(y).replace('″', ' yd');
