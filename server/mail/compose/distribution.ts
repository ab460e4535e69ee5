/** "Your blocks are coming back": after the coordinator confirms the return, to each recipient. */
import { QueryTypes } from 'sequelize';
import type { AppDeps } from '../../deps';
import { MAKERS_TAKEN_IN, RETURN_SHARES } from '../mail.queries';
import { plural } from '../format';
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
  type DraftDeps,
  type Recipient,
} from './context';
import { composeReceipt } from './receipt';

interface Share {
  recipientId: number;
  makers: { name: string; count: number }[];
  count: number;
}

/** Per recipient: how many returned blocks, from which makers. */
async function sharesOf(deps: Pick<AppDeps, 'sequelize'>, swapId: number): Promise<Share[]> {
  const rows = await deps.sequelize.query<{ recipient_id: number; maker: string; count: string }>(RETURN_SHARES, {
    bind: { swapId },
    type: QueryTypes.SELECT,
  });
  const shares = new Map<number, Share>();
  for (const r of rows) {
    const share = shares.get(r.recipient_id) ?? { recipientId: r.recipient_id, makers: [], count: 0 };
    share.makers.push({ name: r.maker, count: Number(r.count) });
    share.count += Number(r.count);
    shares.set(r.recipient_id, share);
  }
  return [...shares.values()];
}

interface DistributionDrafts {
  guildId: number;
  swapId: number;
  recipients: Recipient[];
  draft: (r: Recipient) => Drafted;
}

/**
 * Each recipient's notice as it reads now (only `onlyUserId`'s when given), or null when the return
 * is not confirmed. Used to compose and, at send time, to check a queued notice.
 */
export async function distributionDrafts(
  deps: DraftDeps,
  swapId: number,
  onlyUserId?: number,
): Promise<DistributionDrafts | null> {
  const loaded = await loadSwap(swapId);
  if (!loaded || !loaded.swap.distributionConfirmedAt || loaded.swap.state === 'cancelled') return null;
  const { swap, guild } = loaded;
  const shares = (await sharesOf(deps, swapId)).filter((s) => onlyUserId === undefined || s.recipientId === onlyUserId);
  const users = await usersByIds(shares.map((s) => s.recipientId));
  const byUser = new Map(shares.map((s) => [s.recipientId, s]));
  const recipients = shares.map((s) => users.get(s.recipientId)).filter((u): u is Recipient => Boolean(u));
  const draft = (r: Recipient): Drafted => {
    const share = byUser.get(r.id)!;
    const countText = plural(share.count, 'block');
    const makersText = plural(share.makers.length, 'maker');
    return {
      key: `swap:${swap.id}:distribution:user:${r.id}`,
      kind: 'distribution',
      mail: renderMail(
        'distribution',
        {
          name: r.displayName,
          swapTitle: swap.title,
          countText,
          makersText,
          makers: share.makers,
          gift: swap.mode === 'gift',
          url: swapUrl(deps.config, guild.id, swap.id),
        },
        frameFor(deps.config, r.id, 'distribution', {
          subject: `${countText} from ${makersText} coming back to you: ${swap.title}`,
          preheader: `The blocks of ${swap.title} have been shared out.`,
          heading: `${countText} coming your way`,
          reason: `You get this because you take part in a swap in ${guild.name}.`,
        }),
      ),
    };
  };
  return { guildId: guild.id, swapId: swap.id, recipients, draft };
}

/**
 * Notices to every recipient of a confirmed return. Each maker's receipt is brought up to date
 * first, so it is recorded (and so sent) before any return notice.
 */
export async function composeDistribution(deps: ComposeDeps, swapId: number): Promise<RecordResult> {
  const makers = await deps.sequelize.query<{ maker_id: number }>(MAKERS_TAKEN_IN, {
    bind: { swapId },
    type: QueryTypes.SELECT,
  });
  for (const m of makers) await composeReceipt(deps, swapId, m.maker_id);
  const drafts = await distributionDrafts(deps, swapId);
  if (!drafts) return { queued: 0, skipped: 0, existing: 0 };
  const records = await recordsFor(
    'distribution',
    { guildId: drafts.guildId, swapId: drafts.swapId },
    drafts.recipients,
    drafts.draft,
  );
  return recordAndQueue(deps.pool, deps.boss, records);
}
