import type { ReactNode } from 'react';
import { Link } from 'react-router';
import type { NextForMeDto } from '@shared/schemas/home';
import { rsvpLabels } from '@shared/schemas/sewdays';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Loading, QueryError } from '@/components/ui/page';
import { useNextForMe } from '@/entities/me/api/get-next-for-me';
import { formatInZone, relativeTime } from '@/lib/dates';
import { paths } from '@/lib/paths';
import { useBlockStep } from '../api/block-steps';

const linkClass =
  'inline-flex min-h-11 items-center font-semibold text-indigo underline underline-offset-4 hover:text-indigo-deep';
const itemClass = 'border-t border-walnut/15 py-3 first:border-t-0 first:pt-0';

function When({ at, timeZone }: { at: string; timeZone: string }) {
  return (
    <>
      {formatInZone(at, timeZone)} <span className="text-walnut-soft">({relativeTime(at)})</span>
    </>
  );
}

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <Card as="section" title={title}>
      <ul>{children}</ul>
    </Card>
  );
}

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

function BlocksOwed({ swaps }: { swaps: NextForMeDto['blocksOwed'] }) {
  const step = useBlockStep();
  const busy = step.isPending ? step.variables.blockId : null;
  return (
    <Section title="Blocks you owe">
      {step.isError && (
        <li className="mb-3">
          <Alert tone="error">{step.error.message}</Alert>
        </li>
      )}
      {swaps.map((s) => (
        <li key={s.swapId} className={itemClass}>
          <Link to={paths.swap(s.guildId, s.swapId)} className={linkClass}>
            {s.swapTitle}
          </Link>
          <p className="text-walnut-soft">{s.guildName}</p>
          <p>
            <span className="font-semibold">Due:</span> <When at={s.dueAt} timeZone={s.timeZone} />
          </p>
          <ul className="mt-2 space-y-2">
            {s.blocks.map((b) => (
              <li key={b.id} className="flex flex-wrap items-center justify-between gap-2 rounded-lg bg-linen px-3 py-2">
                <span>
                  Block {b.sequence}: {b.state === 'pledged' ? 'to sew' : 'sewn, to hand in'}
                </span>
                {b.state === 'pledged' ? (
                  <Button
                    variant="secondary"
                    pending={busy === b.id}
                    pendingLabel="Saving…"
                    disabled={busy !== null}
                    onClick={() => step.mutate({ blockId: b.id, swapId: s.swapId, step: 'sewn' })}
                    aria-label={`Mark sewn: block ${b.sequence} of ${s.swapTitle}`}
                  >
                    Mark sewn
                  </Button>
                ) : (
                  <Button
                    variant="secondary"
                    pending={busy === b.id}
                    pendingLabel="Saving…"
                    disabled={busy !== null}
                    onClick={() => step.mutate({ blockId: b.id, swapId: s.swapId, step: 'handed-in' })}
                    aria-label={`Hand in: block ${b.sequence} of ${s.swapTitle}, in person`}
                  >
                    Hand in
                  </Button>
                )}
              </li>
            ))}
          </ul>
          {s.blocks.some((b) => b.state === 'sewn') && (
            <p className="mt-2 text-base text-walnut-soft">
              “Hand in” records a block given in person. Posting it?{' '}
              <Link to={paths.swap(s.guildId, s.swapId)} className="font-semibold text-indigo underline underline-offset-4">
                Hand it in by post on the swap’s page
              </Link>
              .
            </p>
          )}
        </li>
      ))}
    </Section>
  );
}

/** "What is next for me" across every guild: each item links to where it is done. */
export function NextForMe() {
  const next = useNextForMe();
  if (next.isPending) return <Loading label="Looking for what is next…" />;
  if (next.isError) return <QueryError error={next.error} what="what is next for you" />;
  const d = next.data;
  const nothing =
    !d.blocksOwed.length &&
    !d.openSwaps.length &&
    !d.sewDays.length &&
    !d.comingBack.length &&
    !d.unreadRooms.length &&
    !d.officer.toReceive.length &&
    !d.officer.overdue.length;
  return (
    <div className="space-y-4">
      {nothing && <p className="text-lg text-walnut-soft">Nothing waits for you right now. Your guilds are below.</p>}
      <div className="grid items-start gap-4 lg:grid-cols-2">
        {d.blocksOwed.length > 0 && <BlocksOwed swaps={d.blocksOwed} />}
        {(d.officer.toReceive.length > 0 || d.officer.overdue.length > 0) && (
          <Section title="Waiting for you as an officer">
            {d.officer.toReceive.map((s) => (
              <li key={`r${s.swapId}`} className={itemClass}>
                <Link to={paths.swapIntake(s.guildId, s.swapId)} className={linkClass}>
                  Receive {plural(s.count, 'block', 'blocks')} of {s.swapTitle}
                </Link>
                <p className="text-walnut-soft">{s.guildName} · handed in, not yet received</p>
              </li>
            ))}
            {d.officer.overdue.map((s) => (
              <li key={`o${s.swapId}`} className={itemClass}>
                <Link to={paths.swapRoster(s.guildId, s.swapId)} className={linkClass}>
                  {s.swapTitle}: past its due date
                </Link>
                <p className="text-walnut-soft">
                  {s.guildName} · was due <When at={s.dueAt} timeZone={s.timeZone} /> · {plural(s.count, 'block', 'blocks')} still
                  owed
                </p>
              </li>
            ))}
          </Section>
        )}
        {d.unreadRooms.length > 0 && (
          <Section title="New in chat">
            {d.unreadRooms.map((r) => (
              <li key={r.roomId} className={itemClass}>
                <Link
                  to={r.kind === 'swap' ? paths.swapChat(r.guildId, r.ownerId) : `${paths.sewDay(r.guildId, r.ownerId)}#chat`}
                  className={linkClass}
                >
                  {r.title}: {plural(r.unread, 'new message', 'new messages')}
                </Link>
                <p className="text-walnut-soft">
                  {r.guildName} · {r.kind === 'swap' ? 'swap chat' : 'sew-day chat'}
                </p>
              </li>
            ))}
          </Section>
        )}
        {d.sewDays.length > 0 && (
          <Section title="Next sew day">
            {d.sewDays.map((s) => (
              <li key={s.sewDayId} className={itemClass}>
                <Link to={paths.sewDay(s.guildId, s.sewDayId)} className={linkClass}>
                  {s.title}
                </Link>
                <p className="text-walnut-soft">{s.guildName}</p>
                <p>
                  <When at={s.startsAt} timeZone={s.timeZone} />
                </p>
                <p>
                  <span className="font-semibold">Your answer:</span> {s.answer ? rsvpLabels[s.answer] : 'not given yet'}
                </p>
              </li>
            ))}
          </Section>
        )}
        {d.openSwaps.length > 0 && (
          <Section title="Swaps open for sign-up">
            {d.openSwaps.map((s) => (
              <li key={s.swapId} className={itemClass}>
                <Link to={paths.swap(s.guildId, s.swapId)} className={linkClass}>
                  {s.swapTitle}
                </Link>
                <p className="text-walnut-soft">{s.guildName}</p>
                <p>
                  <span className="font-semibold">Sign-up closes:</span> <When at={s.signupClosesAt} timeZone={s.timeZone} />
                </p>
                <p>{s.pledged ? `You pledged ${plural(s.pledged, 'block', 'blocks')}.` : 'You have not signed up.'}</p>
              </li>
            ))}
          </Section>
        )}
        {d.comingBack.length > 0 && (
          <Section title="Blocks coming back to you">
            {d.comingBack.map((s) => (
              <li key={s.swapId} className={itemClass}>
                <Link to={paths.swap(s.guildId, s.swapId)} className={linkClass}>
                  {plural(s.count, 'block', 'blocks')} from {s.swapTitle}
                </Link>
                <p className="text-walnut-soft">{s.guildName}</p>
              </li>
            ))}
          </Section>
        )}
      </div>
    </div>
  );
}
