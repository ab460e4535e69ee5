/** Small statistics for repeated benchmark runs. */

export const round = (n: number, places = 1) => {
  const f = 10 ** places;
  return Math.round(n * f) / f;
};

export function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  if (sorted.length === 0) return NaN;
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

/** "median (min–max)" of repeated runs, so the spread stands beside the figure. */
export function withSpread(values: number[], places = 0): string {
  if (values.length === 0) return '';
  const m = round(median(values), places);
  if (values.length === 1) return String(m);
  return `${m} (${round(Math.min(...values), places)}–${round(Math.max(...values), places)})`;
}

/** The q-quantile (0–1) of a list of samples, nearest rank. */
export function quantile(values: number[], q: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1))] ?? NaN;
}
