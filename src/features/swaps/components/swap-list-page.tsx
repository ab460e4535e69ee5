import { Link, useParams } from 'react-router';
import { buttonClass } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { EmptyState, Loading, QueryError } from '@/components/ui/page';
import { useGuild } from '@/entities/guild/api/get-guild';
import { useMe } from '@/entities/me/api/get-me';
import { unitsFor } from '@/entities/me/api/units';
import { paths } from '@/lib/paths';
import { useSwaps } from '@/entities/swap/api/get-swaps';
import { Deadline } from './deadline';
import { sizeText } from '@/lib/lengths';
import { SwapStateBadge } from './state-badge';

/** The guild's front page: its swaps, open ones first, with deadlines in the guild's time zone. */
export function SwapListPage() {
  const guildId = Number(useParams().guildId);
  const guild = useGuild(guildId);
  const swaps = useSwaps(guildId);
  const units = unitsFor(useMe().data, guildId);
  if (guild.isPending || swaps.isPending) return <Loading label="Loading swaps…" />;
  if (guild.isError) return <QueryError error={guild.error} what="the guild" />;
  if (swaps.isError) return <QueryError error={swaps.error} what="the swaps" />;
  const canManage = guild.data.myRole !== 'member';
  const tz = guild.data.timeZone;
  const order = ['signup', 'sewing', 'collecting', 'sorting', 'draft', 'complete', 'cancelled'];
  const list = [...swaps.data].sort((a, b) => order.indexOf(a.state) - order.indexOf(b.state));

  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h2 className="text-2xl font-semibold text-indigo-deep">Block swaps</h2>
        {canManage && (
          <Link to={paths.newSwap(guildId)} className={buttonClass('primary')}>
            Set up a swap
          </Link>
        )}
      </div>
      {list.length === 0 ? (
        <EmptyState title="No swaps yet">
          {canManage ? 'Set one up: it stays a draft until you open sign-up.' : 'When an officer opens a swap, it appears here.'}
        </EmptyState>
      ) : (
        <ul className="grid gap-5 md:grid-cols-2">
          {list.map((s) => (
            <li key={s.id}>
              <Card as="article" className="h-full">
                <div className="flex flex-wrap items-start justify-between gap-2">
                  <h3 className="text-2xl font-semibold">
                    <Link to={paths.swap(guildId, s.id)} className="text-indigo-deep underline-offset-4 hover:underline">
                      {s.title}
                    </Link>
                  </h3>
                  <SwapStateBadge state={s.state} />
                </div>
                <p className="mt-3">
                  {sizeText(s.unfinished, units)} unfinished ·{' '}
                  {s.quota.min === s.quota.max ? s.quota.min : `${s.quota.min}–${s.quota.max}`} blocks each ·{' '}
                  {s.mode === 'gift' ? 'gift swap' : 'blocks come back to the makers'}
                </p>
                <p>
                  {s.signups} {s.signups === 1 ? 'member has' : 'members have'} pledged {s.pledged} block
                  {s.pledged === 1 ? '' : 's'}
                  {s.myPledge > 0 && <span className="font-semibold"> · you pledged {s.myPledge}</span>}
                </p>
                <div className="mt-3 space-y-1">
                  {(s.state === 'draft' || s.state === 'signup') && (
                    <Deadline label="Sign-up closes" iso={s.signupClosesAt} timeZone={tz} />
                  )}
                  {s.state !== 'complete' && s.state !== 'cancelled' && (
                    <Deadline label="Blocks due" iso={s.dueAt} timeZone={tz} />
                  )}
                </div>
              </Card>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
