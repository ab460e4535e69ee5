/** "A new swap is open": to every active member of the guild when a swap moves to sign-up. */
import { renderMail } from '../render';
import { recordAndQueue, type RecordResult } from '../outbox';
import type { Guild, Swap } from '../../db/models';
import {
  frameFor,
  giftName,
  guildMembers,
  loadSwap,
  recordsFor,
  swapUrl,
  type ComposeDeps,
  type Drafted,
  type MailConfig,
  type Recipient,
} from './context';
import { swapView } from './swap-view';

const NOTHING: RecordResult = { queued: 0, skipped: 0, existing: 0 };

function draftAnnouncement(config: MailConfig, swap: Swap, guild: Guild, gift: string | null, r: Recipient, now: Date): Drafted {
  const view = swapView(swap, guild, r.units, now, gift);
  return {
    key: `swap:${swap.id}:announcement:user:${r.id}`,
    kind: 'swap-announcement',
    mail: renderMail(
      'swap-announcement',
      { name: r.displayName, guildName: guild.name, swap: view, url: swapUrl(config, guild.id, swap.id) },
      frameFor(config, r.id, 'announcements', {
        subject: `New swap: ${swap.title} (sign up by ${view.signupCloses.replace(/ at .*/, '')})`,
        preheader: `${view.kindLabel}, ${view.unfinished} unfinished. Sign-up closes ${view.signupClosesIn}.`,
        heading: `New swap: ${swap.title}`,
        reason: `You get this because you are a member of ${guild.name}.`,
      }),
    ),
  };
}

/** Announces a swap once per member (reopening sign-up does not announce it again). */
export async function composeAnnouncement(deps: ComposeDeps, swapId: number, now = new Date()): Promise<RecordResult> {
  const loaded = await loadSwap(swapId);
  // Moved on or cancelled before we got to it: an announcement would mislead.
  if (!loaded || loaded.swap.state !== 'signup') return NOTHING;
  const { swap, guild } = loaded;
  const members = await guildMembers(guild.id);
  const gift = await giftName(swap);
  const records = await recordsFor('announcements', { guildId: guild.id, swapId: swap.id }, members, (r) =>
    draftAnnouncement(deps.config, swap, guild, gift, r, now),
  );
  return recordAndQueue(deps.pool, deps.boss, records, now);
}

/** One member's announcement as it reads now; null once sign-up is closed or they left the guild. */
export async function announcementDraft(
  config: MailConfig,
  swapId: number,
  userId: number,
  now = new Date(),
): Promise<Drafted | null> {
  const loaded = await loadSwap(swapId);
  if (!loaded || loaded.swap.state !== 'signup' || loaded.swap.signupClosesAt <= now) return null;
  const member = (await guildMembers(loaded.guild.id)).find((m) => m.id === userId);
  if (!member) return null;
  return draftAnnouncement(config, loaded.swap, loaded.guild, await giftName(loaded.swap), member, now);
}
