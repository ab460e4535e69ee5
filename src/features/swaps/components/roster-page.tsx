import { useParams } from 'react-router';
import { buttonClass } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { EmptyState, Loading, QueryError } from '@/components/ui/page';
import { rosterCsvUrl } from '../api/export-urls';
import { useRoster } from '@/entities/roster/api/get-roster';
import { SwapFeesPanel } from '@/entities/payment/components/swap-fees-panel';
import { useRosterLive } from '@/entities/roster/api/use-roster-live';
import { useSwap } from '@/entities/swap/api/get-swap';
import { RosterTable } from './roster-table';
import { VERDICTS } from '@shared/vocabulary';
import { VerdictBadge } from '@/entities/block/components/verdict-badge';

function Stat({ label, value }: { label: string; value: number }) {
  return (
    <div className="rounded-lg bg-linen px-4 py-2">
      <dt className="text-walnut-soft">{label}</dt>
      <dd className="font-display text-2xl font-bold tabular-nums">{value}</dd>
    </div>
  );
}

/** Everyone's progress at a glance, with the blocks behind each row. */
export function RosterPage() {
  const swapId = Number(useParams().swapId);
  const swap = useSwap(swapId);
  const roster = useRoster(swapId);
  useRosterLive(swapId); // a block measured elsewhere shows here as it happens
  if (swap.isPending || roster.isPending) return <Loading label="Loading the roster…" />;
  if (swap.isError) return <QueryError error={swap.error} what="the swap" />;
  if (roster.isError) return <QueryError error={roster.error} what="the roster" />;
  const t = roster.data.totals;
  return (
    <div className="space-y-6">
      <Card
        title="Roster"
        actions={
          swap.data.canManage && (
            <a className={buttonClass('secondary')} href={rosterCsvUrl(swapId)} download>
              Download roster (CSV)
            </a>
          )
        }
      >
        <dl className="grid grid-cols-2 gap-3 sm:grid-cols-4 lg:grid-cols-7">
          <Stat label="Members" value={t.members} />
          <Stat label="Pledged" value={t.pledged} />
          <Stat label="Sewn" value={t.sewn} />
          <Stat label="Handed in" value={t.handedIn} />
          <Stat label="Received" value={t.received} />
          <Stat label="Measured" value={t.measured} />
          <Stat label="Accepted" value={t.accepted} />
        </dl>
        <p className="mt-4 flex flex-wrap items-center gap-3">
          {VERDICTS.map((k) => (
            <span key={k} className="inline-flex items-center gap-1">
              <VerdictBadge verdict={k} /> <span className="tabular-nums">{t.verdicts[k]}</span>
            </span>
          ))}
        </p>
      </Card>
      <Card title="Members">
        {roster.data.rows.length === 0 ? (
          <EmptyState title="Nobody has signed up yet" />
        ) : (
          <RosterTable swap={swap.data} rows={roster.data.rows} />
        )}
      </Card>
      <SwapFeesPanel swapId={swapId} hasFees={swap.data.canManage && (swap.data.fees.entry > 0 || swap.data.fees.postage > 0)} />
    </div>
  );
}
