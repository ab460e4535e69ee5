import { useEffect, useMemo, useState } from 'react';
import { useBlocker, useParams } from 'react-router';
import type { BlockDto, DistributionPlanDto, SwapDto, TransferDto } from '@shared/swap-types';
import { Alert } from '@/components/ui/alert';
import { Button, buttonClass } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { Loading, QueryError } from '@/components/ui/page';
import { ApiError } from '@/lib/api-client';
import { formatInZone } from '@/lib/dates';
import { useConfirmDistribution } from '../api/confirm-distribution';
import { distributionCsvUrl } from '../api/export-urls';
import { useDistributionByRecipient } from '../api/get-distribution';
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

interface SavedPlan {
  plan: DistributionPlanDto;
  counts: number[];
  madeAt: string;
}

/** The plan and its hand edits are kept on this device until the return is confirmed, so moving to sorting loses nothing. */
const planStoreKey = (swapId: number) => `blockpost:return-plan:${swapId}`;

function readSavedPlan(swapId: number): SavedPlan | null {
  try {
    const raw = window.sessionStorage.getItem(planStoreKey(swapId));
    return raw ? (JSON.parse(raw) as SavedPlan) : null;
  } catch {
    return null;
  }
}

function Planner({ swap }: { swap: SwapDto }) {
  const plan = usePlanDistribution(swap.id);
  const confirm = useConfirmDistribution(swap.id);
  const [saved] = useState(() => readSavedPlan(swap.id));
  const [data, setData] = useState<DistributionPlanDto | null>(saved?.plan ?? null);
  const [madeAt, setMadeAt] = useState<string | null>(saved?.madeAt ?? null);
  const [counts, setCounts] = useState<number[]>(saved?.counts ?? []);
  const [problem, setProblem] = useState('');
  const [asking, setAsking] = useState(false);
  const issues = useMemo(() => (data ? problems(data, counts) : []), [data, counts]);
  const canConfirm = swap.state === 'sorting';
  const edited = Boolean(data && data.transfers.some((t, i) => counts[i] !== t.count));
  const recipients = data ? new Set(data.transfers.map((t) => t.to ?? 'gift')).size : 0;
  const sharedOut = counts.reduce((sum, c) => sum + (Number.isFinite(c) ? c : 0), 0);

  useEffect(() => {
    if (!data || !madeAt) return;
    window.sessionStorage.setItem(planStoreKey(swap.id), JSON.stringify({ plan: data, counts, madeAt } satisfies SavedPlan));
  }, [swap.id, data, counts, madeAt]);

  // Leaving with hand edits not confirmed asks first (another page in the app, or closing the tab).
  const blocker = useBlocker(
    ({ currentLocation, nextLocation }) => edited && !confirm.isSuccess && currentLocation.pathname !== nextLocation.pathname,
  );
  useEffect(() => {
    if (!edited || confirm.isSuccess) return;
    const warn = (e: BeforeUnloadEvent) => e.preventDefault();
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, [edited, confirm.isSuccess]);

  const makePlan = () => {
    setProblem('');
    plan.mutate(undefined, {
      onSuccess: (p) => {
        setData(p);
        setMadeAt(new Date().toISOString());
        setCounts(p.transfers.map((t) => t.count));
      },
      onError: (e) => setProblem(e instanceof ApiError ? e.message : 'The plan could not be made.'),
    });
  };
  const doConfirm = () => {
    if (!data) return;
    setProblem('');
    const transfers = data.transfers.map((t, i) => ({ from: t.from, to: t.to, count: counts[i] ?? t.count }));
    confirm.mutate(
      { transfers },
      {
        onSuccess: () => {
          setAsking(false);
          window.sessionStorage.removeItem(planStoreKey(swap.id));
        },
        onError: (e) => {
          setAsking(false);
          setProblem(e instanceof ApiError ? e.message : 'The return could not be confirmed.');
        },
      },
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
        {data && madeAt && (
          <p className="text-walnut-soft">
            Plan made {formatInZone(madeAt, swap.guild.timeZone)}
            {edited ? ', with your changes' : ''}. If blocks were measured or trimmed since, plan again.
          </p>
        )}
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
            <Button onClick={() => setAsking(true)} disabled={!canConfirm || issues.length > 0 || data.transfers.length === 0}>
              Confirm the return
            </Button>
            <ConfirmDialog
              open={asking}
              title="Confirm the return?"
              confirmLabel="Confirm the return"
              onConfirm={doConfirm}
              onCancel={() => setAsking(false)}
              pending={confirm.isPending}
              pendingLabel="Confirming…"
            >
              <ul className="list-disc space-y-1 pl-6">
                <li>
                  {sharedOut} block{sharedOut === 1 ? ' goes' : 's go'} to {recipients} recipient{recipients === 1 ? '' : 's'}, as
                  in the table.
                </li>
                <li>
                  Each recipient who is a member is e-mailed how many blocks come to them ({recipients}{' '}
                  {recipients === 1 ? 'person' : 'people'}).
                </li>
                <li>After this, blocks cannot be measured, trimmed or accepted any more, and the return cannot be changed.</li>
              </ul>
              {edited && (
                <Alert tone="warning" title="You changed the plan">
                  The counts you typed are what will be confirmed.
                </Alert>
              )}
              {data.shortfall.length > 0 && (
                <Alert tone="warning">Not everyone gets as many blocks as they handed in (see above).</Alert>
              )}
            </ConfirmDialog>
          </>
        )}
      </div>
      <ConfirmDialog
        open={blocker.state === 'blocked'}
        title="Leave the plan?"
        confirmLabel="Leave"
        cancelLabel="Stay here"
        onConfirm={() => blocker.proceed?.()}
        onCancel={() => blocker.reset?.()}
      >
        <p>
          You changed the plan and have not confirmed it. Your changes stay on this device until you make a new plan or confirm
          it.
        </p>
      </ConfirmDialog>
    </Card>
  );
}

/** What happens to a block left out of the return (common practice, no source: it goes back to its maker). */
function leftOutWords(b: BlockDto): string {
  const why =
    b.verdict === 'trim'
      ? 'was not trimmed to size in time'
      : b.verdict === 'skewed'
        ? 'is out of square'
        : b.verdict === 'short'
          ? 'runs short'
          : 'was not measured';
  return `${why}; it goes back to its maker, ${b.maker.displayName}.`;
}

/** One section per recipient with each block's label code and a box to tick as it goes into the bundle. */
function BundleSheet({ swap, blocks }: { swap: SwapDto; blocks: BlockDto[] }) {
  const bundles = useDistributionByRecipient(swap.id);
  const sequence = new Map(blocks.map((b) => [b.id, b.sequence]));
  const leftOut = blocks.filter((b) => b.state === 'measured' || b.state === 'received');
  if (bundles.isPending) return <Loading label="Loading the bundles…" />;
  if (bundles.isError) return <QueryError error={bundles.error} what="the bundles" />;
  return (
    <div className="space-y-5">
      <p className="hidden print:block">
        {swap.title}: bundles for hand-out night, confirmed {formatInZone(swap.distributionConfirmedAt!, swap.guild.timeZone)}.
      </p>
      {bundles.data.map((bundle) => (
        <section
          key={bundle.recipient.id ?? 'gift'}
          className="break-inside-avoid rounded-lg border-2 border-walnut/20 p-4"
          aria-label={`Bundle for ${bundle.recipient.displayName}`}
        >
          <h3 className="text-xl font-semibold">
            For {bundle.recipient.displayName}: {bundle.blocks.length} block{bundle.blocks.length === 1 ? '' : 's'}
          </h3>
          <ul className="mt-2 space-y-1">
            {bundle.blocks.map((b) => (
              <li key={b.id}>
                <label className="inline-flex min-h-11 cursor-pointer items-center gap-3">
                  <input type="checkbox" className="size-6 accent-indigo" />
                  <span className="font-mono text-lg tracking-wider">{b.code}</span>
                  <span>
                    block {sequence.get(b.id) ?? ''} by {b.maker.displayName}
                  </span>
                </label>
              </li>
            ))}
          </ul>
        </section>
      ))}
      {leftOut.length > 0 && (
        <section
          className="break-inside-avoid rounded-lg border-2 border-dashed border-madder/50 p-4"
          aria-label="Blocks not in the return"
        >
          <h3 className="text-xl font-semibold">Not in the return: {leftOut.length}</h3>
          <ul className="mt-2 list-disc space-y-1 pl-6">
            {leftOut.map((b) => (
              <li key={b.id}>
                Block {b.sequence} by {b.maker.displayName} {leftOutWords(b)}
              </li>
            ))}
          </ul>
        </section>
      )}
    </div>
  );
}

function Confirmed({ swap, blocks }: { swap: SwapDto; blocks: BlockDto[] }) {
  const [view, setView] = useState<'recipient' | 'maker'>('recipient');
  const pairs = new Map<string, { from: string; to: string; seqs: number[] }>();
  for (const b of blocks.filter((x) => x.state === 'returned')) {
    const key = `${b.maker.id}>${b.recipient?.id ?? 'gift'}`;
    const p = pairs.get(key) ?? { from: b.maker.displayName, to: b.recipient?.displayName ?? '', seqs: [] };
    p.seqs.push(b.sequence);
    pairs.set(key, p);
  }
  const tab = (which: 'recipient' | 'maker', label: string) => (
    <Button variant={view === which ? 'primary' : 'secondary'} aria-pressed={view === which} onClick={() => setView(which)}>
      {label}
    </Button>
  );
  return (
    <Card
      title="The return is confirmed"
      actions={
        <div className="flex flex-wrap gap-2 print:hidden">
          <Button variant="secondary" onClick={() => window.print()}>
            Print the bundle sheet
          </Button>
          <a className={buttonClass('secondary')} href={distributionCsvUrl(swap.id)} download>
            Download the return (CSV)
          </a>
        </div>
      }
    >
      <p className="print:hidden">Confirmed {formatInZone(swap.distributionConfirmedAt!, swap.guild.timeZone)}.</p>
      <div className="mt-3 flex flex-wrap gap-2 print:hidden" role="group" aria-label="List the return">
        {tab('recipient', 'By recipient (hand-out night)')}
        {tab('maker', 'By maker')}
      </div>
      <div className="mt-4">
        {view === 'recipient' ? (
          <BundleSheet swap={swap} blocks={blocks} />
        ) : (
          <ul className="list-disc space-y-1 pl-6">
            {[...pairs.values()].map((p) => (
              <li key={`${p.from}>${p.to}`}>
                {p.from} → {p.to}: {p.seqs.length} block{p.seqs.length === 1 ? '' : 's'} (numbers {p.seqs.join(', ')})
              </li>
            ))}
          </ul>
        )}
      </div>
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
