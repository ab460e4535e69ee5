import { Link, useParams } from 'react-router';
import { swapStateLabels } from '@shared/schemas/swaps';
import { Card } from '@/components/ui/card';
import { Alert } from '@/components/ui/alert';
import { Loading, QueryError } from '@/components/ui/page';
import { useLiveStatus } from '@/lib/socket';
import { paths } from '@/lib/paths';
import { useActivity } from '../api/get-activity';
import { useRoster } from '@/entities/roster/api/get-roster';
import { useSwap } from '@/entities/swap/api/get-swap';
import { SwapFeesPanel } from '@/entities/payment/components/swap-fees-panel';
import { useBoardLive } from '../hooks/use-board-live';
import { ActivityList } from './activity-list';
import { BoardRows } from './board-rows';
import { BoardTotals } from './board-totals';

const statusWords = {
  connected: 'Live: changes appear by themselves.',
  connecting: 'Connecting…',
  offline: 'Offline: reconnecting, then the board catches up.',
  'signed-out': 'Sign in again to see changes as they happen.',
} as const;

/** The live board of a swap: totals, one row per participant, recent activity, who is watching. */
export function LiveBoardPage() {
  const params = useParams();
  const guildId = Number(params.guildId);
  const swapId = Number(params.swapId);
  const roster = useRoster(swapId);
  const activity = useActivity(swapId);
  const live = useBoardLive(swapId);
  const status = useLiveStatus();
  const details = useSwap(swapId);
  const fees = details.data && (details.data.fees.entry > 0 || details.data.fees.postage > 0);

  if (roster.isPending) return <Loading label="Loading the board…" />;
  if (roster.isError) return <QueryError error={roster.error} what="the swap board" />;
  const { swap, rows } = roster.data;
  const watching = live.viewers.map((v) => v.displayName);

  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-walnut-soft">Live board · {swapStateLabels[swap.state] ?? swap.state}</p>
          <h2 className="text-2xl font-semibold text-indigo-deep sm:text-3xl">{swap.title}</h2>
        </div>
        <Link
          className="inline-flex min-h-11 items-center font-semibold text-indigo underline"
          to={paths.swapChat(guildId, swapId)}
        >
          Swap chat
        </Link>
      </div>
      <p className="flex flex-wrap items-center gap-x-4 gap-y-1" role="status">
        <span>
          <span
            aria-hidden="true"
            className={`mr-1 inline-block h-3 w-3 rounded-full ${status === 'connected' ? 'bg-lichen' : 'bg-weld'}`}
          />
          {statusWords[status]}
        </span>
        <span>Viewing now: {watching.length ? watching.join(', ') : 'just you'}</span>
      </p>
      {live.joinError && <Alert tone="error">{live.joinError}</Alert>}
      <Card title="Totals">
        <BoardTotals roster={roster.data} />
      </Card>
      <Card title={`Participants (${rows.length})`}>
        <BoardRows rows={rows} />
      </Card>
      {fees && <SwapFeesPanel swapId={swapId} hasFees={details.data?.canManage === true} />}
      <Card title="Recent activity">
        {activity.isPending ? (
          <Loading />
        ) : activity.isError ? (
          <QueryError error={activity.error} what="the activity" />
        ) : (
          <ActivityList key={swapId} swapId={swapId} activities={activity.data} />
        )}
      </Card>
    </div>
  );
}
