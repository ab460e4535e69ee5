/**
 * The coordinators' weekly digest: per guild, what changed in each swap over the past seven days
 * (moves between states, sign-ups, withdrawals, blocks sewn, handed in, received, measured and
 * returned) and where it stands now. Read from the swap tables' own timestamps, so it does not
 * depend on which node saw which event.
 */
import { Op, QueryTypes } from 'sequelize';
import { VERDICTS, VERDICT_LABELS } from '@shared/quilt';
import { swapStateShort, type SwapState } from '@shared/schemas/swaps';
import type { VerdictName } from '@shared/swap-types';
import { Guild, Swap } from '../../db/models';
import { inDays, daysUntil, isoWeek, mailDate, plural } from '../format';
import { renderMail } from '../render';
import { recordAndQueue, type RecordResult } from '../outbox';
import { frameFor, guildMembers, recordsFor, swapUrl, type ComposeDeps } from './context';
import type { AppDeps } from '../../deps';
import { SWAP_TOTALS, WEEK_BLOCKS, WEEK_SIGNUPS, WEEK_TRANSITIONS, WEEK_VERDICTS } from '../mail.queries';

const WEEK_MS = 7 * 86_400_000;
const LIVE: SwapState[] = ['signup', 'sewing', 'collecting', 'sorting'];

interface WeekCounts {
  transitions: { from_state: SwapState | null; to_state: SwapState; at: Date }[];
  signups: { joined: number; joined_blocks: number; withdrawn: number };
  blocks: { sewn: number; handed_in: number; received: number; returned: number };
  verdicts: { verdict: VerdictName; count: number }[];
  totals: { pledged: number; makers: number; handed_in: number; measured: number; owed: number; owing: number };
}

async function weekOf(deps: Pick<AppDeps, 'sequelize'>, swapId: number, from: Date, to: Date): Promise<WeekCounts> {
  const q = <T extends object>(sql: string) =>
    deps.sequelize.query<T>(sql, { bind: { swapId, from, to }, type: QueryTypes.SELECT });
  const [transitions, signups, blocks, verdicts, totals] = await Promise.all([
    q<WeekCounts['transitions'][number]>(WEEK_TRANSITIONS),
    q<Record<keyof WeekCounts['signups'], string>>(WEEK_SIGNUPS),
    q<Record<keyof WeekCounts['blocks'], string>>(WEEK_BLOCKS),
    q<{ verdict: VerdictName; count: string }>(WEEK_VERDICTS),
    q<Record<keyof WeekCounts['totals'], string>>(SWAP_TOTALS),
  ]);
  const num = <T extends Record<string, string>>(row: T | undefined) =>
    Object.fromEntries(Object.entries(row ?? {}).map(([k, v]) => [k, Number(v)])) as { [K in keyof T]: number };
  return {
    transitions,
    signups: num(signups[0]),
    blocks: num(blocks[0]),
    verdicts: verdicts.map((v) => ({ verdict: v.verdict, count: Number(v.count) })),
    totals: num(totals[0]),
  };
}

/** The week's changes as short sentences. */
function changeLines(w: WeekCounts, timeZone: string): string[] {
  const lines = w.transitions.map(
    (t) => `Moved from ${swapStateShort[t.from_state!]} to ${swapStateShort[t.to_state]} on ${mailDate(t.at, timeZone, false)}.`,
  );
  if (w.signups.joined)
    lines.push(`${plural(w.signups.joined, 'new sign-up')} (${plural(w.signups.joined_blocks, 'block')} pledged).`);
  if (w.signups.withdrawn) lines.push(`${plural(w.signups.withdrawn, 'member')} withdrew.`);
  if (w.blocks.sewn) lines.push(`${plural(w.blocks.sewn, 'block')} marked sewn.`);
  if (w.blocks.handed_in) lines.push(`${plural(w.blocks.handed_in, 'block')} handed in.`);
  if (w.blocks.received) lines.push(`${plural(w.blocks.received, 'block')} received.`);
  const measured = w.verdicts.reduce((s, v) => s + v.count, 0);
  if (measured) {
    const parts = w.verdicts
      .sort((a, b) => b.count - a.count || VERDICTS.indexOf(a.verdict) - VERDICTS.indexOf(b.verdict))
      .map((v) => `${v.count} ${VERDICT_LABELS[v.verdict].label.toLowerCase()}`);
    lines.push(`${plural(measured, 'block')} measured: ${parts.join(', ')}.`);
  }
  if (w.blocks.returned) lines.push(`${plural(w.blocks.returned, 'block')} shared out to their new homes.`);
  return lines;
}

function nextDeadline(swap: Swap, timeZone: string, now: Date): string | null {
  if (swap.state === 'signup' && swap.signupClosesAt > now)
    return `sign-up closes ${inDays(daysUntil(swap.signupClosesAt, now, timeZone))}, ${mailDate(swap.signupClosesAt, timeZone, false)}`;
  if (['signup', 'sewing', 'collecting'].includes(swap.state) && swap.dueAt > now)
    return `blocks due ${inDays(daysUntil(swap.dueAt, now, timeZone))}, ${mailDate(swap.dueAt, timeZone, false)}`;
  return null;
}

async function digestForGuild(deps: ComposeDeps, guild: Guild, from: Date, now: Date): Promise<RecordResult> {
  const swaps = await Swap.findAll({
    where: { guildId: guild.id, [Op.or]: [{ state: { [Op.in]: LIVE } }, { updatedAt: { [Op.gte]: from } }] },
    order: [['dueAt', 'ASC']],
  });
  const reported: Record<string, unknown>[] = [];
  for (const swap of swaps) {
    if (swap.state === 'draft') continue;
    const week = await weekOf(deps, swap.id, from, now);
    const changes = changeLines(week, guild.timeZone);
    if (!LIVE.includes(swap.state) && changes.length === 0) continue;
    reported.push({
      title: swap.title,
      stateLabel: swapStateShort[swap.state as SwapState],
      nextDeadline: nextDeadline(swap, guild.timeZone, now),
      changes,
      totals: {
        pledged: week.totals.pledged,
        makers: plural(week.totals.makers, 'maker'),
        handedIn: week.totals.handed_in,
        measured: week.totals.measured,
        owed: week.totals.owed,
        owing: week.totals.owing ? plural(week.totals.owing, 'member') : null,
      },
      url: swapUrl(deps.config, guild.id, swap.id),
    });
  }
  if (reported.length === 0) return { queued: 0, skipped: 0, existing: 0 };
  const officers = await guildMembers(guild.id, ['coordinator', 'admin']);
  const week = isoWeek(now);
  const range = { from: mailDate(from, guild.timeZone, false), to: mailDate(now, guild.timeZone, false) };
  const records = await recordsFor('coordinator-digest', { guildId: guild.id, swapId: null }, officers, (r) => ({
    key: `guild:${guild.id}:coordinator-digest:${week}:user:${r.id}`,
    kind: 'coordinator-digest',
    mail: renderMail(
      'coordinator-digest',
      { name: r.displayName, guildName: guild.name, ...range, swaps: reported },
      frameFor(deps.config, r.id, 'coordinator-digest', {
        subject: `${guild.name}: your swaps this week`,
        preheader: `${plural(reported.length, 'swap')}: what changed from ${range.from} to ${range.to}.`,
        heading: `This week in ${guild.name}`,
        reason: `You get this because you help run swaps in ${guild.name}.`,
      }),
    ),
  }));
  return recordAndQueue(deps.pool, deps.boss, records);
}

/** One digest per officer per guild per ISO week, covering the seven days before `now`. */
export async function composeDigests(deps: ComposeDeps, now = new Date()): Promise<RecordResult> {
  const from = new Date(now.getTime() - WEEK_MS);
  const total: RecordResult = { queued: 0, skipped: 0, existing: 0 };
  const guildIds = (
    await Swap.findAll({ attributes: ['guildId'], where: { state: { [Op.ne]: 'draft' } }, group: ['guildId'] })
  ).map((s) => s.guildId);
  for (const guild of await Guild.findAll({ where: { id: { [Op.in]: guildIds } }, order: [['id', 'ASC']] })) {
    const r = await digestForGuild(deps, guild, from, now);
    total.queued += r.queued;
    total.skipped += r.skipped;
    total.existing += r.existing;
  }
  return total;
}
