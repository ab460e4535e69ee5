import type { ActivityDto } from '@shared/live-events';

/** New activity lines on top, without repeats, keeping at most `keep`. */
export function prependActivities(list: ActivityDto[], fresh: ActivityDto[], keep: number): ActivityDto[] {
  const seen = new Set(list.map((a) => a.id));
  return [...fresh.filter((a) => !seen.has(a.id)), ...list].sort((a, b) => b.id - a.id).slice(0, keep);
}
