import { useMemo, useState } from 'react';
import { useParams } from 'react-router';
import type { BlockDto, DistributionPlanDto, SwapDto, TransferDto } from '@shared/swap-types';
import { Alert } from '@/components/ui/alert';
import { Button, buttonClass } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Loading, QueryError } from '@/components/ui/page';
import { ApiError } from '@/lib/api-client';
import { formatInZone } from '@/lib/dates';
import { useConfirmDistribution } from '../api/confirm-distribution';
import { distributionCsvUrl } from '../api/export-urls';
import { useBlocks } from '@/entities/block/api/get-blocks';
import { useSwap } from '@/entities/swap/api/get-swap';
import { usePlanDistribution } from '../api/plan-distribution';

/** What is wrong with edited transfers, in words; the server checks the same again. */
function problems(plan: DistributionPlanDto, counts: number[]): string[] {
  const out: string[] = [];
  counts.forEach((c, i) => {
    if (!Number.isInteger(c) || c < 1) out.push(`Line ${i + 1}: send a whole number of blocks, at least 1.`);
  });
  for (const m of plan.makers) {
    const sent = plan.transfers.reduce((s, t, i) => s + (t.from === m.id ? (counts[i] ?? 0) : 0), 0);
    if (sent !== m.accepted)
      out.push(`${m.displayName} has ${m.accepted} accepted block${m.accepted === 1 ? '' : 's'} but sends ${sent}.`);
    if (plan.mode === 'return') {
      const got = plan.transfers.reduce((s, t, i) => s + (t.to === m.id ? (counts[i] ?? 0) : 0), 0);
      if (got !== m.accepted) out.push(`${m.displayName} should receive ${m.accepted} but gets ${got}.`);
    }
  }
  return out;
}

function Planner({ swap }: { swap: SwapDto }) {
  const plan = usePlanDistribution(swap.id);
  const confirm = useConfirmDistribution(swap.id);
  const [counts, setCounts] = useState<number[]>([]);
  const [problem, setProblem] = useState('');
  const data = plan.data;
  const issues = useMemo(() => (data ? problems(data, counts) : []), [data, counts]);
  const canConfirm = swap.state === 'sorting';

  const makePlan = () => {
    setProblem('');
    plan.mutate(undefined, {
      onSuccess: (p) => setCounts(p.transfers.map((t) => t.count)),
      onError: (e) => setProblem(e instanceof ApiError ? e.message : 'The plan could not be made.'),
    });
  };
  const doConfirm = () => {
    if (!data) return;
    setProblem('');
    const transfers = data.transfers.map((t, i) => ({ from: t.from, to: t.to, count: counts[i] ?? t.count }));
    confirm.mutate(
      { transfers },
      { onError: (e) => setProblem(e instanceof ApiError ? e.message : 'The return could not be confirmed.') },
    );
  };

  return (
    <Card title="Plan the return of blocks">
      <div className="space-y-4">
        <p>
          Only accepted blocks take part: true to size, or trimmed to size.{' '}
          {swap.mode === 'gift'
            ? 'This is a gift swap: every accepted block goes to the recipient.'
            : 'Each maker gets back as many as they had accepted, never their own, from as many different makers as possible.'}
        </p>
        {!canConfirm && <Alert tone="info">You can look at a plan now; confirming needs the swap to be in sorting.</Alert>}
        {problem && <Alert tone="error">{problem}</Alert>}
        <Button onClick={makePlan} pending={plan.isPending} pendingLabel="Planning…">
          {data ? 'Plan again' : 'Make a plan'}
        </Button>
        {data && (
          <>
            <p>
              {data.acceptedTotal} accepted block{data.acceptedTotal === 1 ? '' : 's'} from {data.makers.length} maker
              {data.makers.length === 1 ? '' : 's'}. Left out: {data.leftOut.pending} not measured, {data.leftOut.rejected} short
              or out of square, {data.leftOut.untrimmed} waiting to be trimmed.
            </p>
            {data.shortfall.length > 0 && (
              <Alert tone="warning" title="Not everyone can be paired">
                {data.shortfall.map((s) => `${s.displayName} would miss ${s.missing}`).join('; ')}. With so few makers nobody else
                has blocks to send them.
              </Alert>
            )}
            <div className="relative overflow-x-auto">
              <table className="w-full min-w-[28rem] border-collapse text-left">
                <caption className="sr-only">Proposed transfers; counts can be changed</caption>
                <thead>
                  <tr className="border-b-2 border-walnut/20">
                    <th scope="col" className="py-2 pr-3">
                      From (maker)
                    </th>
                    <th scope="col" className="py-2 pr-3">
                      To
                    </th>
                    <th scope="col" className="py-2">
                      Blocks
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {data.transfers.map((t: TransferDto, i) => (
                    <tr key={`${t.from}-${t.to}`} className="border-b border-walnut/10">
                      <td className="py-2 pr-3">{t.fromName}</td>
                      <td className="py-2 pr-3">{t.toName}</td>
                      <td className="py-2">
                        <input
                          type="number"
                          min={1}
                          aria-label={`Blocks from ${t.fromName} to ${t.toName}`}
                          className="min-h-11 w-24 rounded-lg border-2 border-walnut/30 bg-white px-2"
                          value={Number.isNaN(counts[i]) ? '' : (counts[i] ?? t.count)}
                          onChange={(e) => setCounts((c) => c.map((x, j) => (j === i ? e.target.valueAsNumber : x)))}
                        />
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
            {issues.length > 0 && (
              <Alert tone="warning" title="The counts do not add up">
                <ul className="list-disc pl-5">
                  {issues.map((m) => (
                    <li key={m}>{m}</li>
                  ))}
                </ul>
              </Alert>
            )}
            <Button
              onClick={doConfirm}
              disabled={!canConfirm || issues.length > 0 || data.transfers.length === 0}
              pending={confirm.isPending}
              pendingLabel="Confirming…"
            >
              Confirm the return
            </Button>
          </>
        )}
      </div>
    </Card>
  );
}

function Confirmed({ swap, blocks }: { swap: SwapDto; blocks: BlockDto[] }) {
  const pairs = new Map<string, { from: string; to: string; seqs: number[] }>();
  for (const b of blocks.filter((x) => x.state === 'returned')) {
    const key = `${b.maker.id}>${b.recipient?.id ?? 'gift'}`;
    const p = pairs.get(key) ?? { from: b.maker.displayName, to: b.recipient?.displayName ?? '', seqs: [] };
    p.seqs.push(b.sequence);
    pairs.set(key, p);
  }
  return (
    <Card
      title="The return is confirmed"
      actions={
        <a className={buttonClass('secondary')} href={distributionCsvUrl(swap.id)} download>
          Download the return (CSV)
        </a>
      }
    >
      <p>Confirmed {formatInZone(swap.distributionConfirmedAt!, swap.guild.timeZone)}.</p>
      <ul className="mt-3 list-disc space-y-1 pl-6">
        {[...pairs.values()].map((p) => (
          <li key={`${p.from}>${p.to}`}>
            {p.from} → {p.to}: {p.seqs.length} block{p.seqs.length === 1 ? '' : 's'} (#{p.seqs.join(', #')})
          </li>
        ))}
      </ul>
    </Card>
  );
}

/** Planning, adjusting and confirming who receives which blocks (officers). */
export function DistributionPage() {
  const swapId = Number(useParams().swapId);
  const swap = useSwap(swapId);
  const blocks = useBlocks(swapId, 'all', Boolean(swap.data?.distributionConfirmedAt));
  if (swap.isPending) return <Loading />;
  if (swap.isError) return <QueryError error={swap.error} what="the swap" />;
  if (!swap.data.canManage) return <Alert tone="info">Only coordinators and admins plan the return of blocks.</Alert>;
  if (swap.data.distributionConfirmedAt) {
    if (blocks.isPending) return <Loading />;
    if (blocks.isError) return <QueryError error={blocks.error} what="the blocks" />;
    return <Confirmed swap={swap.data} blocks={blocks.data} />;
  }
  return <Planner swap={swap.data} />;
}
