/** "You are signed up": the member's own cutting plan and fabric amounts for their pledge. */
import { Signup } from '../../db/models';
import type { Units } from '@shared/schemas/auth';
import { mailLength, mailSize, mailYards, plural } from '../format';
import { pledgePlan, type PledgePlan } from '../cutting-plan';
import { renderMail } from '../render';
import { recordAndQueue, type RecordResult } from '../outbox';
import {
  frameFor,
  loadSwap,
  recordsFor,
  swapUrl,
  usersByIds,
  type ComposeDeps,
  type Drafted,
  type MailConfig,
  type Recipient,
} from './context';
import { swapView } from './swap-view';

/** The plan with every length written out in the reader's units. */
export function planView(plan: PledgePlan, units: Units) {
  return {
    kindLabel: plan.kindLabel,
    cuts: plan.cuts.map((c) => ({ fabric: c.fabric, size: mailSize(c, units), count: c.count, note: c.note })),
    fabrics: plan.fabrics.map((f) => ({
      fabric: f.fabric,
      strips: f.strips.map((s) => `${plural(s.count, 'strip')} ${mailLength(s.width, units)} wide`).join(', '),
      yards: mailYards(f.yards, units),
    })),
    note: plan.note,
    customCutList: plan.customCutList,
  };
}

async function confirmationDraft(
  config: MailConfig,
  swapId: number,
  userId: number,
  now: Date,
): Promise<{ guildId: number; swapId: number; user: Recipient; drafted: Drafted } | null> {
  const [loaded, signup] = await Promise.all([loadSwap(swapId), Signup.findOne({ where: { swapId, userId, status: 'active' } })]);
  if (!loaded || !signup || signup.blocks < 1) return null;
  const { swap, guild } = loaded;
  if (!['signup', 'sewing', 'collecting'].includes(swap.state)) return null;
  const user = (await usersByIds([userId])).get(userId);
  if (!user) return null;
  const plan = pledgePlan(
    swap.blockSpec,
    signup.blocks,
    undefined,
    (swap.colourRules ?? []).map((r) => r.role),
  );
  const r = user;
  const view = swapView(swap, guild, r.units, now);
  const blocksText = plural(signup.blocks, 'block');
  const drafted: Drafted = {
    key: `swap:${swap.id}:signup-confirmation:user:${r.id}:blocks:${signup.blocks}`,
    kind: 'signup-confirmation',
    mail: renderMail(
      'signup-confirmation',
      {
        name: r.displayName,
        swapTitle: swap.title,
        blocks: signup.blocks,
        blocksText,
        unfinished: view.unfinished,
        due: view.due,
        dueIn: view.dueIn,
        zone: view.zone,
        signupCloses: view.signupCloses,
        wof: mailLength(plan.wof, r.units),
        plan: planView(plan, r.units),
        url: swapUrl(config, guild.id, swap.id),
      },
      frameFor(config, r.id, 'signup-confirmations', {
        subject: `Your cutting plan for ${swap.title} (${blocksText})`,
        preheader: `You are signed up with ${blocksText}, due ${view.dueIn}.`,
        heading: `You are signed up: ${swap.title}`,
        reason: `You get this because you signed up for a swap in ${guild.name}.`,
      }),
    ),
  };
  return { guildId: guild.id, swapId: swap.id, user, drafted };
}

/** One member's confirmation as it reads now; null once they withdrew or the swap moved past sewing. */
export async function signupConfirmationDraft(
  config: MailConfig,
  swapId: number,
  userId: number,
  now = new Date(),
): Promise<Drafted | null> {
  return (await confirmationDraft(config, swapId, userId, now))?.drafted ?? null;
}

/**
 * Confirms a member's current pledge. The key carries the pledge, so changing 4 → 5 blocks sends a
 * new plan while a repeated event for the same pledge sends nothing.
 */
export async function composeSignupConfirmation(
  deps: ComposeDeps,
  swapId: number,
  userId: number,
  now = new Date(),
): Promise<RecordResult> {
  const draft = await confirmationDraft(deps.config, swapId, userId, now);
  if (!draft) return { queued: 0, skipped: 0, existing: 0 };
  const records = await recordsFor(
    'signup-confirmations',
    { guildId: draft.guildId, swapId: draft.swapId },
    [draft.user],
    () => draft.drafted,
  );
  return recordAndQueue(deps.pool, deps.boss, records, now);
}
