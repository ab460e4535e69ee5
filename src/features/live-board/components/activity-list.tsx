import { useState, type ReactNode } from 'react';
import { useMutation } from '@tanstack/react-query';
import type { ActivityDto } from '@shared/live-events';
import { swapStateShort, type SwapState } from '@shared/schemas/swaps';
import { VERDICTS, type Verdict } from '@shared/vocabulary';
import { relativeTime } from '@/lib/dates';
import { VerdictBadge } from '@/entities/block/components/verdict-badge';
import { Button } from '@/components/ui/button';
import { QueryError } from '@/components/ui/page';
import { ACTIVITY_SHOWN, getActivity } from '../api/get-activity';

const who = (p: ActivityDto['actor']) => p?.displayName ?? 'Someone';
const whose = (a: ActivityDto) => (a.subject && a.actor?.userId === a.subject.userId ? 'their' : `${who(a.subject)}’s`);
const isVerdict = (v: unknown): v is Verdict => (VERDICTS as readonly unknown[]).includes(v);
const stateLabel = (s: unknown) => (swapStateShort[s as SwapState] ?? String(s)).toLowerCase();

/** One line of plain words for a swap event. */
export function describeActivity(a: ActivityDto): ReactNode {
  const d = a.detail;
  const block = `block ${d.sequence ?? ''}`.trim();
  switch (a.kind) {
    case 'swap.created':
      return `${who(a.actor)} set up the swap`;
    case 'swap.updated':
      return `${who(a.actor)} changed the swap’s details`;
    case 'swap.transitioned':
      return `${who(a.actor)} moved the swap from ${stateLabel(d.from)} to ${stateLabel(d.to)}`;
    case 'signup.changed':
      return `${who(a.subject)} pledged ${d.blocks} block${d.blocks === 1 ? '' : 's'}`;
    case 'signup.withdrawn':
      return `${who(a.subject)} withdrew from the swap`;
    case 'photo.added':
      return `${who(a.actor)} posted a photo of ${whose(a)} ${block}`;
    case 'distribution.confirmed':
      return `${who(a.actor)} confirmed who gets which blocks (${d.transfers} parcel${d.transfers === 1 ? '' : 's'})`;
    case 'block.measured':
      // While the guild keeps verdicts to its officers, a member's copy of another maker's line has none.
      if (!isVerdict(d.verdict)) return `${who(a.actor)} measured ${whose(a)} ${block}`;
      return (
        <>
          {who(a.actor)} measured {whose(a)} {block}:{' '}
          <VerdictBadge verdict={d.verdict} source={d.source === 'photo' ? 'photo' : undefined} />
        </>
      );
    case 'block.changed':
      if (d.to === 'sewn') return `${who(a.subject)} finished sewing ${block}`;
      if (d.to === 'handed_in') return `${who(a.subject)} handed in ${block}`;
      if (d.to === 'received') return `${who(a.actor)} received ${whose(a)} ${block}`;
      if (d.from === 'measured' && d.to === 'measured') return `${who(a.actor)} trimmed ${whose(a)} ${block} to size`;
      return `${who(a.actor)} updated ${whose(a)} ${block}`;
    default:
      return `${who(a.actor)} made a change`;
  }
}

/**
 * What happened lately, newest first; new lines are read out by screen readers as they come.
 * *Show older* adds the page before the oldest line shown, until the swap's beginning.
 */
export function ActivityList({ swapId, activities }: { swapId: number; activities: ActivityDto[] }) {
  const [older, setOlder] = useState<ActivityDto[]>([]);
  const [reachedStart, setReachedStart] = useState(false);
  const seen = new Set(activities.map((a) => a.id));
  const shown = [...activities, ...older.filter((a) => !seen.has(a.id))].sort((a, b) => b.id - a.id);
  const more = useMutation({
    mutationFn: (before: number) => getActivity(swapId, before),
    onSuccess: (page) => {
      setOlder((list) => [...list, ...page]);
      if (page.length < ACTIVITY_SHOWN) setReachedStart(true);
    },
  });
  if (shown.length === 0) return <p className="text-walnut-soft">Nothing has happened yet.</p>;
  const canShowOlder = !reachedStart && activities.length >= ACTIVITY_SHOWN;
  return (
    <>
      <ol aria-live="polite" aria-label="Recent activity, newest first" className="gap-x-10 lg:columns-2">
        {shown.map((a) => (
          <li key={a.id} className="break-inside-avoid border-b border-walnut/10 py-2">
            <p>{describeActivity(a)}</p>
            <p className="text-base text-walnut-soft">
              <time dateTime={a.at} title={new Date(a.at).toLocaleString()}>
                {relativeTime(a.at)}
              </time>
            </p>
          </li>
        ))}
      </ol>
      {more.isError && <QueryError error={more.error} what="older activity" />}
      {canShowOlder && (
        <Button
          variant="secondary"
          className="mt-4"
          pending={more.isPending}
          pendingLabel="Loading older activity…"
          onClick={() => more.mutate(shown.at(-1)!.id)}
        >
          Show older
        </Button>
      )}
      {reachedStart && <p className="mt-4 text-walnut-soft">That is everything since the swap was set up.</p>}
    </>
  );
}
