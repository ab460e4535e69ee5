/**
 * "Your blocks arrived": once a coordinator has received or measured a maker's blocks, one notice
 * lists each block with its verdict in words and, for blocks that need work, what to do next.
 * Events start a delayed job (one waiting job per maker and swap), so measuring six blocks in a
 * row sends one notice, not six. The key carries a fingerprint of what the notice says, so the same
 * news is never sent twice and new news always is.
 */
import { createHash } from 'node:crypto';
import { Op } from 'sequelize';
import { VERDICT_LABELS } from '@shared/quilt';
import type { Units } from '@shared/schemas/auth';
import type { VerdictName } from '@shared/swap-types';
import { Block, Measurement, type Swap } from '../../db/models';
import { mailLength, mailSize, plural } from '../format';
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

const IN_HAND = ['received', 'measured', 'returned'];

/** True while a maker can still hand blocks in: before sorting, and before the return is confirmed. */
export function stillCollecting(swap: Pick<Swap, 'state' | 'distributionConfirmedAt'>): boolean {
  return ['signup', 'sewing', 'collecting'].includes(swap.state) && !swap.distributionConfirmedAt;
}

/**
 * What the maker should do about a block, in plain words; null when nothing. Once the swap has
 * stopped collecting, nobody is asked for a replacement any more.
 */
export function adviceFor(verdict: VerdictName | null, trimmed: boolean, swap: Swap, units: Units, due: string): string | null {
  const size = mailSize({ width: swap.unfinishedWidth, height: swap.unfinishedHeight }, units);
  const open = stillCollecting(swap);
  const leftOut = 'It does not take part in the return of blocks; your coordinator will tell you what happens to it.';
  switch (verdict) {
    case 'trim':
      if (trimmed) return 'It has been trimmed to size and counts as accepted. Nothing for you to do.';
      if (swap.distributionConfirmedAt) return `It was not trimmed to ${size} before the return was confirmed. ${leftOut}`;
      return `It is a little larger than ${size}, so it can be trimmed down and still counts. Your coordinator will trim it or ask you to; if you trim it yourself, square it to ${size} with the design centred.`;
    case 'short':
      return open
        ? `It came out smaller than ${size} by more than the tolerance, so it cannot be trimmed to fit. If you can, make a replacement and hand it in by ${due}. Checking your seam allowance first usually finds the cause.`
        : `It came out smaller than ${size} by more than the tolerance, so it cannot be trimmed to fit. ${leftOut} Checking your seam allowance usually finds the cause for next time.`;
    case 'skewed':
      return open
        ? `Its two diagonals differ by more than ${mailLength(swap.squareness, units)}, so it is out of square. A careful press (lift and lower the iron rather than pushing it) and squaring up often fixes it; your coordinator will say whether to rework it or make a new one.`
        : `Its two diagonals differ by more than ${mailLength(swap.squareness, units)}, so it is out of square. ${leftOut}`;
    default:
      return null;
  }
}

export interface ReceiptDraft {
  guildId: number;
  swapId: number;
  maker: Recipient;
  drafted: Drafted;
}

/**
 * The maker's receipt as it reads now, or null when none of their blocks is in hand. Used both to
 * compose the notice and, at send time, to check that a queued notice still says what is true.
 */
export async function receiptDraft(
  config: MailConfig,
  swapId: number,
  makerId: number,
  now = new Date(),
): Promise<ReceiptDraft | null> {
  const loaded = await loadSwap(swapId);
  if (!loaded) return null;
  const { swap, guild } = loaded;
  if (swap.state === 'cancelled') return null;
  const all = await Block.findAll({ where: { swapId, makerId }, order: [['sequence', 'ASC']] });
  const inHand = all.filter((b) => IN_HAND.includes(b.state));
  const maker = (await usersByIds([makerId])).get(makerId);
  if (inHand.length === 0 || !maker) return null;

  const latest = new Map<number, Measurement>();
  const measurements = await Measurement.findAll({
    where: { blockId: { [Op.in]: inHand.map((b) => b.id) }, source: 'ruler', withdrawnAt: null },
    order: [
      ['createdAt', 'ASC'],
      ['id', 'ASC'],
    ],
  });
  for (const m of measurements) latest.set(m.blockId, m);

  const fingerprint = createHash('sha256')
    .update(inHand.map((b) => `${b.id}:${b.verdict ?? '-'}:${b.trimmed ? 1 : 0}${b.acceptedAt ? ':a' : ''}`).join('|'))
    .digest('hex')
    .slice(0, 12);
  // Asking for more blocks makes sense only while they can still be handed in.
  const owed = stillCollecting(swap) ? all.filter((b) => b.state === 'pledged' || b.state === 'sewn').length : 0;
  const measuredCount = inHand.filter((b) => b.verdict).length;
  const r = maker;
  const view = swapView(swap, guild, r.units, now);
  const blocks = inHand.map((b) => {
    const label = b.verdict ? VERDICT_LABELS[b.verdict as VerdictName] : null;
    const m = latest.get(b.id);
    return {
      label: `Block ${b.sequence}`,
      verdict: label ? label.label : 'Received, not measured yet',
      glyph: label ? label.glyph : '•',
      verdictStyle: b.verdict ? `verdict_${b.verdict}` : 'verdict_none',
      measured: m && b.verdict && b.verdict !== 'true' ? mailSize(m, r.units) : null,
      advice: b.acceptedAt
        ? 'Your coordinator accepted it as it is, so it takes part in the return. Nothing for you to do.'
        : adviceFor(b.verdict, b.trimmed, swap, r.units, view.due),
    };
  });
  const needWork = !swap.distributionConfirmedAt
    ? inHand.filter(
        (b) => !b.acceptedAt && ((b.verdict === 'trim' && !b.trimmed) || b.verdict === 'short' || b.verdict === 'skewed'),
      ).length
    : 0;
  const drafted: Drafted = {
    key: `swap:${swap.id}:receipt:user:${r.id}:${fingerprint}`,
    kind: 'receipt',
    mail: renderMail(
      'receipt',
      {
        name: r.displayName,
        swapTitle: swap.title,
        receivedText: plural(inHand.length, 'block'),
        measuredCount,
        measuredText:
          measuredCount === inHand.length ? (inHand.length === 1 ? 'it' : `all ${inHand.length}`) : String(measuredCount),
        blocks,
        unfinished: view.unfinished,
        owed,
        owedText: plural(owed, 'block'),
        due: view.due,
        needsCare: needWork > 0,
        url: swapUrl(config, guild.id, swap.id),
      },
      frameFor(config, r.id, 'receipts', {
        subject:
          needWork > 0
            ? `Your blocks for ${swap.title}: ${plural(needWork, 'block needs', 'blocks need')} a look`
            : `Your blocks for ${swap.title} have arrived`,
        preheader: `${plural(inHand.length, 'block')} received, ${measuredCount} measured.`,
        heading: 'Your blocks have arrived',
        reason: `You get this because you made blocks for a swap in ${guild.name}.`,
      }),
    ),
  };
  return { guildId: guild.id, swapId: swap.id, maker, drafted };
}

/** Composes the maker's receipt notice, if anything has changed since the last one. */
export async function composeReceipt(
  deps: ComposeDeps,
  swapId: number,
  makerId: number,
  now = new Date(),
): Promise<RecordResult> {
  const draft = await receiptDraft(deps.config, swapId, makerId, now);
  if (!draft) return { queued: 0, skipped: 0, existing: 0 };
  const records = await recordsFor(
    'receipts',
    { guildId: draft.guildId, swapId: draft.swapId },
    [draft.maker],
    () => draft.drafted,
  );
  return recordAndQueue(deps.pool, deps.boss, records, now);
}
