import type { BoardPatch } from '@shared/live-events';
import type { RosterDto } from '@shared/swap-types';

/** The cached roster with a board change applied: changed rows replaced or added, gone rows dropped, order by name kept. */
export function applyBoardPatch(roster: RosterDto, patch: BoardPatch): RosterDto {
  if (patch.complete) return { swap: { ...roster.swap, ...patch.swap }, totals: patch.totals, rows: patch.rows };
  const changed = new Map(patch.rows.map((r) => [r.userId, r]));
  const removed = new Set(patch.removedUserIds);
  const rows = roster.rows.filter((r) => !removed.has(r.userId)).map((r) => changed.get(r.userId) ?? r);
  for (const row of patch.rows) if (!roster.rows.some((r) => r.userId === row.userId)) rows.push(row);
  rows.sort((a, b) => a.displayName.localeCompare(b.displayName, undefined, { sensitivity: 'base' }) || a.userId - b.userId);
  return { swap: { ...roster.swap, ...patch.swap }, totals: patch.totals, rows };
}

/**
 * What to do with a board change, given the last version this view has (null before it joined):
 * `ignore` one it has already seen (or any before joining), `patch` the next one in line when it carries
 * a patch and a roster is cached, and otherwise `refetch`, because something was missed.
 */
export function boardChangeStep(known: number | null, change: { version: number; patch: BoardPatch | null }, cached: boolean) {
  if (known === null || change.version <= known) return 'ignore' as const;
  return change.version === known + 1 && change.patch && cached ? ('patch' as const) : ('refetch' as const);
}
