import type { StationResult } from '../hooks/use-intake-station';
import { VerdictBadge } from '@/entities/block/components/verdict-badge';

/** The blocks measured before the last one at this station, newest first, and the swap's progress. */
export function RecentBlocks({ results, measured, total }: { results: StationResult[]; measured: number; total: number }) {
  return (
    <section aria-labelledby="recent-title" className="rounded-card border border-walnut/15 bg-card p-4">
      <h2 id="recent-title" className="text-xl font-bold">
        Earlier at this station
      </h2>
      <p className="text-base text-walnut-soft">
        {measured} of {total} blocks of the swap measured.
      </p>
      {results.length === 0 ? (
        <p className="mt-2 text-base text-walnut-soft">Blocks you measure will be listed here.</p>
      ) : (
        <ul className="mt-2 divide-y divide-walnut/10">
          {results.map((r) => (
            <li key={r.clientId} className="flex flex-wrap items-center justify-between gap-2 py-2">
              <span>
                Block {r.block.ordinal} of {r.block.of} · {r.block.maker.displayName}
              </span>
              <span className="flex items-center gap-2">
                <VerdictBadge verdict={r.confirmed ?? r.local.verdict} />
                <span className="text-base text-walnut-soft">{r.confirmed ? 'confirmed' : 'on this device'}</span>
              </span>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
