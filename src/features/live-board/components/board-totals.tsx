import type { RosterDto } from '@shared/swap-types';
import { VerdictCounts } from '@/entities/block/components/verdict-badge';

function Stat({ label, value, strong }: { label: string; value: number; strong?: boolean }) {
  return (
    <div className={`rounded-lg px-3 py-2 ${strong ? 'bg-madder/10 ring-1 ring-madder/40' : 'bg-linen'}`}>
      <dt className="text-base text-walnut-soft">{label}</dt>
      <dd className={`text-2xl font-bold ${strong ? 'text-madder-deep' : 'text-walnut'}`}>{value}</dd>
    </div>
  );
}

/** The swap at a glance: counts along the block's way, what is still owed, and the verdicts. */
export function BoardTotals({ roster }: { roster: RosterDto }) {
  const t = roster.totals;
  const owed = roster.rows.reduce((sum, r) => sum + r.owed, 0);
  return (
    <div>
      <dl className="grid grid-cols-2 gap-2 sm:grid-cols-3 lg:grid-cols-6">
        <Stat label="Still owed" value={owed} strong={owed > 0} />
        <Stat label="Pledged" value={t.pledged} />
        <Stat label="Sewn" value={t.sewn} />
        <Stat label="Handed in" value={t.handedIn} />
        <Stat label="Received" value={t.received} />
        <Stat label="Measured" value={t.measured} />
      </dl>
      <div className="mt-3 flex flex-wrap items-center gap-2">
        <span className="font-semibold">Verdicts:</span>
        <VerdictCounts counts={t.verdicts} />
      </div>
    </div>
  );
}
