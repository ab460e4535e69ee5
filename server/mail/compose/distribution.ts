/** "Your blocks are coming back": after the coordinator confirms the return, to each recipient. */
import { QueryTypes } from 'sequelize';
import { Swap } from '../../db/models';
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
  type MailConfig,
  type Recipient,
} from './context';
import { composeReceipt } from './receipt';

interface Share {
  recipientId: number;
  makers: { name: string; count: number }[];
  count: number;
}

/** Per recipient: how many returned blocks, from which makers. */
async function sharesOf(swapId: number): Promise<Share[]> {
  const rows = await Swap.sequelize!.query<{ recipient_id: number; maker: string; count: string }>(
    `SELECT b.recipient_id, u.display_name AS maker, count(*) AS count
       FROM blocks b JOIN users u ON u.id = b.maker_id
      WHERE b.swap_id = $swapId AND b.state = 'returned' AND b.recipient_id IS NOT NULL
      GROUP BY b.recipient_id, u.display_name
      ORDER BY b.recipient_id, u.display_name`,
    { bind: { swapId }, type: QueryTypes.SELECT },
  );
  const shares = new Map<number, Share>();
  for (const r of rows) {
    const share = shares.get(r.recipient_id) ?? { recipientId: r.recipient_id, makers: [], count: 0 };
    share.makers.push({ name: r.maker, count: Number(r.count) });
    share.count += Number(r.count);
    shares.set(r.recipient_id, share);
  }
  return [...shares.values()];
}

export interface DistributionDrafts {
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
  config: MailConfig,
  swapId: number,
  onlyUserId?: number,
): Promise<DistributionDrafts | null> {
  const loaded = await loadSwap(swapId);
  if (!loaded || !loaded.swap.distributionConfirmedAt || loaded.swap.state === 'cancelled') return null;
  const { swap, guild } = loaded;
  const shares = (await sharesOf(swapId)).filter((s) => onlyUserId === undefined || s.recipientId === onlyUserId);
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
          url: swapUrl(config, guild.id, swap.id),
        },
        frameFor(config, r.id, 'distribution', {
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
  const makers = await Swap.sequelize!.query<{ maker_id: number }>(
    `SELECT DISTINCT maker_id FROM blocks WHERE swap_id = $swapId AND state IN ('received', 'measured', 'returned') ORDER BY maker_id`,
    { bind: { swapId }, type: QueryTypes.SELECT },
  );
  for (const m of makers) await composeReceipt(deps, swapId, m.maker_id);
  const drafts = await distributionDrafts(deps.config, swapId);
  if (!drafts) return { queued: 0, skipped: 0, existing: 0 };
  const records = await recordsFor(
    'distribution',
    { guildId: drafts.guildId, swapId: drafts.swapId },
    drafts.recipients,
    drafts.draft,
  );
  return recordAndQueue(deps.pool, deps.boss, records);
}
