import { useParams } from 'react-router';
import { Loading, QueryError } from '@/components/ui/page';
import { useRosterLive } from '@/entities/roster/api/use-roster-live';
import { useSwap } from '@/entities/swap/api/get-swap';
import { MySwapPanel } from './my-swap-panel';
import { SpecCard } from './spec-card';
import { StateTimeline } from './state-timeline';

/** The swap's front page: progress, the block spec, and the member's own panel. */
export function SwapOverviewPage() {
  const swapId = Number(useParams().swapId);
  const swap = useSwap(swapId);
  useRosterLive(swapId); // the coordinator's verdict on your block shows as it is given
  if (swap.isPending) return <Loading />;
  if (swap.isError) return <QueryError error={swap.error} what="the swap" />;
  return (
    <div className="space-y-6">
      <StateTimeline swap={swap.data} />
      <MySwapPanel swap={swap.data} />
      <SpecCard swap={swap.data} />
    </div>
  );
}
