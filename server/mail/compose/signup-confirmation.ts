/** "You are signed up": the member's own cutting plan and fabric amounts for their pledge. */
import { Signup } from '../../db/models';
import type { Units } from '@shared/schemas/auth';
import { mailLength, mailSize, mailYards, plural } from '../format';
import { pledgePlan, type PledgePlan } from '../cutting-plan';
import { renderMail } from '../render';
import { recordAndQueue, type RecordResult } from '../outbox';
import { frameFor, loadSwap, recordsFor, swapUrl, usersByIds, type ComposeDeps } from './context';
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

/**
 * Confirms a member's current pledge. The key carries the pledge, so changing 4 → 5 blocks sends a
 * new plan while a repeated event for the same pledge sends nothing.
 */
export async function composeSignupConfirmation(deps: ComposeDeps, swapId: number, userId: number, now = new Date()): Promise<RecordResult> {
  const [loaded, signup] = await Promise.all([loadSwap(swapId), Signup.findOne({ where: { swapId, userId, status: 'active' } })]);
  if (!loaded || !signup || signup.blocks < 1) return { queued: 0, skipped: 0, existing: 0 };
  const { swap, guild } = loaded;
  const user = (await usersByIds([userId])).get(userId);
  if (!user) return { queued: 0, skipped: 0, existing: 0 };
  const plan = pledgePlan(swap.blockSpec, signup.blocks);
  const records = await recordsFor('signup-confirmations', { guildId: guild.id, swapId: swap.id }, [user], (r) => {
    const view = swapView(swap, guild, r.units, now);
    const blocksText = plural(signup.blocks, 'block');
    return {
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
          url: swapUrl(deps.config, guild.id, swap.id),
        },
        frameFor(deps.config, r.id, 'signup-confirmations', {
          subject: `Your cutting plan for ${swap.title} (${blocksText})`,
          preheader: `You are signed up with ${blocksText}, due ${view.dueIn}.`,
          heading: `You are signed up: ${swap.title}`,
          reason: `You get this because you signed up for a swap in ${guild.name}.`,
        }),
      ),
    };
  });
  return recordAndQueue(deps.pool, deps.boss, records);
}
