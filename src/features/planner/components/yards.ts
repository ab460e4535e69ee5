import { formatLength } from '@shared/quilt';

/** "1⅜ yd (1.26 m)": yardage as quilt shops sell it, with metres for those who buy by the metre. */
export function formatYards(yards: number): string {
  const text = formatLength(yards, { denominator: 8 }).replace('″', '');
  return `${text} yd (${(yards * 0.9144).toFixed(2)} m)`;
}
