/** "A new swap is open": to every active member of the guild when a swap moves to sign-up. */
import { renderMail } from '../render';
import { recordAndQueue, type RecordResult } from '../outbox';
import { frameFor, giftName, guildMembers, loadSwap, recordsFor, swapUrl, type ComposeDeps } from './context';
import { swapView } from './swap-view';

const NOTHING: RecordResult = { queued: 0, skipped: 0, existing: 0 };

/** Announces a swap once per member (reopening sign-up does not announce it again). */
export async function composeAnnouncement(deps: ComposeDeps, swapId: number, now = new Date()): Promise<RecordResult> {
  const loaded = await loadSwap(swapId);
  // Moved on or cancelled before we got to it: an announcement would mislead.
  if (!loaded || loaded.swap.state !== 'signup') return NOTHING;
  const { swap, guild } = loaded;
  const members = await guildMembers(guild.id);
  const url = swapUrl(deps.config, guild.id, swap.id);
  const gift = await giftName(swap);
  const records = await recordsFor('announcements', { guildId: guild.id, swapId: swap.id }, members, (r) => {
    const view = swapView(swap, guild, r.units, now, gift);
    return {
      key: `swap:${swap.id}:announcement:user:${r.id}`,
      kind: 'swap-announcement',
      mail: renderMail(
        'swap-announcement',
        { name: r.displayName, guildName: guild.name, swap: view, url },
        frameFor(deps.config, r.id, 'announcements', {
          subject: `New swap: ${swap.title} (sign up by ${view.signupCloses.replace(/ at .*/, '')})`,
          preheader: `${view.kindLabel}, ${view.unfinished} unfinished. Sign-up closes ${view.signupClosesIn}.`,
          heading: `New swap: ${swap.title}`,
          reason: `You get this because you are a member of ${guild.name}.`,
        }),
      ),
    };
  });
  return recordAndQueue(deps.pool, deps.boss, records);
}
