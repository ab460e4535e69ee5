/**
 * Deadline reminders, worked out by a periodic sweep rather than one timer per reminder: the sweep
 * reads today's dates and pledges, so a moved deadline or a block handed in yesterday is always
 * taken into account. Each reminder's key carries the deadline's date in the guild's zone, so it
 * goes once per deadline however often the sweep runs, and again only if the deadline moves.
 */
import { Op, QueryTypes } from 'sequelize';
import { Guild, Swap } from '../../db/models';
import type { AppDeps } from '../../deps';
import { DEBTS } from '../mail.queries';
import { localDateKey, plural } from '../format';
import { renderMail } from '../render';
import { recordAndQueue, type RecordResult } from '../outbox';
import {
  frameFor,
  recordsFor,
  swapUrl,
  usersByIds,
  type ComposeDeps,
  type Drafted,
  type DraftDeps,
  type MailConfig,
  type Recipient,
} from './context';
import { swapView } from './swap-view';

const DAY_MS = 86_400_000;

interface Debt {
  userId: number;
  pledged: number;
  /** blocks handed in, received, measured or returned */
  handedIn: number;
  /** blocks still pledged or only sewn */
  owed: number;
}

/** Each active, still-member signer's pledge and how many blocks they still owe. */
async function debtsOf(deps: Pick<AppDeps, 'sequelize'>, swapId: number, guildId: number): Promise<Debt[]> {
  const rows = await deps.sequelize.query<{ user_id: number; pledged: number; handed_in: string; owed: string }>(DEBTS, {
    bind: { swapId, guildId },
    type: QueryTypes.SELECT,
  });
  return rows.map((r) => ({
    userId: r.user_id,
    pledged: Number(r.pledged),
    handedIn: Number(r.handed_in),
    owed: Number(r.owed),
  }));
}

/** True from `days` days before the deadline until the deadline; 0 days means no reminder. */
function inReminderWindow(deadline: Date, days: number, now: Date) {
  return days > 0 && now.getTime() >= deadline.getTime() - days * DAY_MS && now.getTime() < deadline.getTime();
}

type Which = 'signup' | 'due';

/** True when a reminder of this kind belongs to the swap as it stands at `now`. */
function reminderApplies(swap: Swap, which: Which, now: Date) {
  if (which === 'signup') return swap.state === 'signup' && inReminderWindow(swap.signupClosesAt, swap.signupReminderDays, now);
  return ['signup', 'sewing', 'collecting'].includes(swap.state) && inReminderWindow(swap.dueAt, swap.dueReminderDays, now);
}

function draftReminder(config: MailConfig, swap: Swap, guild: Guild, which: Which, debt: Debt, r: Recipient, now: Date): Drafted {
  const deadline = which === 'signup' ? swap.signupClosesAt : swap.dueAt;
  const dateKey = localDateKey(deadline, guild.timeZone);
  const view = swapView(swap, guild, r.units, now);
  const owedText = plural(debt.owed, 'block');
  const data = {
    name: r.displayName,
    swapTitle: swap.title,
    owedText,
    pledgedText: plural(debt.pledged, 'block'),
    handedIn: debt.handedIn,
    handedInText: plural(debt.handedIn, 'block'),
    closes: view.signupCloses,
    closesIn: view.signupClosesIn,
    due: view.due,
    dueIn: view.dueIn,
    unfinished: view.unfinished,
    tolerance: view.tolerance,
    zone: view.zone,
    url: swapUrl(config, guild.id, swap.id),
  };
  const template = which === 'signup' ? 'signup-reminder' : 'due-reminder';
  const text =
    which === 'signup'
      ? {
          subject: `Sign-up for ${swap.title} closes ${view.signupClosesIn}`,
          heading: `Sign-up closes ${view.signupClosesIn}`,
          preheader: `You still owe ${owedText}.`,
        }
      : {
          subject: `${owedText} still to hand in for ${swap.title}, due ${view.dueIn}`,
          heading: `Blocks due ${view.dueIn}`,
          preheader: `You still have ${owedText} to hand in.`,
        };
  return {
    key: `swap:${swap.id}:${template}:${dateKey}:user:${r.id}`,
    kind: template,
    mail: renderMail(
      template,
      data,
      frameFor(config, r.id, 'reminders', {
        ...text,
        reason: `You get this because you pledged blocks to a swap in ${guild.name}.`,
      }),
    ),
  };
}

async function remind(deps: ComposeDeps, swap: Swap, guild: Guild, which: Which, now: Date): Promise<RecordResult> {
  const debts = (await debtsOf(deps, swap.id, guild.id)).filter((d) => d.owed > 0);
  const users = await usersByIds(debts.map((d) => d.userId));
  const byUser = new Map(debts.map((d) => [d.userId, d]));
  const recipients = debts.map((d) => users.get(d.userId)).filter((u): u is Recipient => Boolean(u));
  const records = await recordsFor('reminders', { guildId: guild.id, swapId: swap.id }, recipients, (r) =>
    draftReminder(deps.config, swap, guild, which, byUser.get(r.id)!, r, now),
  );
  return recordAndQueue(deps.pool, deps.boss, records, now);
}

/**
 * One member's reminder as it reads now, or null when it no longer applies: the swap moved on, the
 * deadline passed or the member owes nothing. Used at send time to check a queued reminder.
 */
export async function reminderDraft(
  deps: DraftDeps,
  swapId: number,
  userId: number,
  which: Which,
  now = new Date(),
): Promise<Drafted | null> {
  const swap = await Swap.findByPk(swapId);
  if (!swap || !reminderApplies(swap, which, now)) return null;
  const guild = await Guild.findByPk(swap.guildId);
  const debt = guild ? (await debtsOf(deps, swap.id, guild.id)).find((d) => d.userId === userId) : undefined;
  const r = (await usersByIds([userId])).get(userId);
  if (!guild || !debt || debt.owed === 0 || !r) return null;
  return draftReminder(deps.config, swap, guild, which, debt, r, now);
}

/** Sends every reminder that is due now and has not gone yet. */
export async function composeReminders(deps: ComposeDeps, now = new Date()): Promise<RecordResult> {
  const total: RecordResult = { queued: 0, skipped: 0, existing: 0 };
  const add = (r: RecordResult) => {
    total.queued += r.queued;
    total.skipped += r.skipped;
    total.existing += r.existing;
  };
  // Only swaps whose next deadline is near: those at most 60 days (the longest reminder) away.
  const horizon = new Date(now.getTime() + 61 * DAY_MS);
  const swaps = await Swap.findAll({
    where: {
      state: { [Op.in]: ['signup', 'sewing', 'collecting'] },
      [Op.or]: [{ signupClosesAt: { [Op.between]: [now, horizon] } }, { dueAt: { [Op.between]: [now, horizon] } }],
    },
  });
  const guilds = new Map(
    (await Guild.findAll({ where: { id: { [Op.in]: [...new Set(swaps.map((s) => s.guildId))] } } })).map((g) => [g.id, g]),
  );
  for (const swap of swaps) {
    const guild = guilds.get(swap.guildId);
    if (!guild) continue;
    if (reminderApplies(swap, 'signup', now)) add(await remind(deps, swap, guild, 'signup', now));
    if (reminderApplies(swap, 'due', now)) add(await remind(deps, swap, guild, 'due', now));
  }
  return total;
}
