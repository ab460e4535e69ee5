/**
 * The receipt for a payment (or the notice of its refund), sent once the payment service's verified
 * webhook said so. Receipts are records of money, so they go even to people who switched the other
 * kinds of mail off (category `account`). The key names the payments and the news, so a repeated
 * event never sends a second receipt.
 */
import { formatMoney, paymentKindLabels } from '@shared/schemas/payments';
import type { RecordResult } from '../outbox';
import { recordAndQueue } from '../outbox';
import { renderMail } from '../render';
import { mailDate } from '../format';
import { appUrl, type ComposeDeps } from './context';
import { PAYMENT_RECEIPT_ROWS } from '../mail.queries';

interface ReceiptRow {
  id: number;
  kind: 'dues' | 'entry' | 'postage';
  amount: number;
  currency: string;
  status: string;
  dues_year: number | null;
  guild_id: number;
  swap_id: number | null;
  user_id: number;
  paid_at: Date | null;
  refunded_at: Date | null;
  swap_title: string | null;
  guild_name: string;
  time_zone: string;
  email: string;
  display_name: string;
}

export async function composePaymentReceipt(
  deps: ComposeDeps,
  paymentIds: number[],
  news: 'paid' | 'refunded',
): Promise<RecordResult> {
  const nothing = { queued: 0, skipped: 0, existing: 0 };
  const { rows } = await deps.pool.query<ReceiptRow>(PAYMENT_RECEIPT_ROWS, [paymentIds]);
  // Checked at send time: only what is still true is said.
  const current = rows.filter((r) => r.status === news);
  if (current.length === 0) return nothing;
  const first = current[0]!;
  const total = current.reduce((sum, r) => sum + r.amount, 0);
  const when = news === 'paid' ? first.paid_at : first.refunded_at;
  const lines = current.map((r) => ({
    label:
      r.kind === 'dues'
        ? `${paymentKindLabels.dues} ${r.dues_year ?? ''}`.trim()
        : `${paymentKindLabels[r.kind]}: ${r.swap_title ?? 'a swap'}`,
    amount: formatMoney(r.amount, r.currency),
  }));
  const reference = `BP-${current.map((r) => r.id).join('-')}`;
  const subject =
    news === 'paid'
      ? `Receipt: ${formatMoney(total, first.currency)} paid to ${first.guild_name}`
      : `Refund: ${formatMoney(total, first.currency)} from ${first.guild_name}`;
  const mail = renderMail(
    'payment-receipt',
    {
      name: first.display_name,
      guildName: first.guild_name,
      refunded: news === 'refunded',
      lines,
      total: formatMoney(total, first.currency),
      reference,
      when: when ? mailDate(when, first.time_zone) : '',
      url: appUrl(deps.config, '/settings/payments'),
    },
    {
      subject,
      preheader: news === 'paid' ? 'Your payment went through. Keep this as your receipt.' : 'Your payment has been refunded.',
      heading: news === 'paid' ? 'Payment received' : 'Payment refunded',
      reason: `You get this because you made a payment to ${first.guild_name} through Blockpost.`,
      unsubscribe: null,
      preferencesUrl: null,
    },
  );
  return recordAndQueue(deps.pool, deps.boss, [
    {
      key: `payment:${current.map((r) => r.id).join('-')}:${news}`,
      category: 'account',
      kind: 'payment-receipt',
      guildId: first.guild_id,
      swapId: first.swap_id,
      userId: first.user_id,
      to: first.email,
      mail,
    },
  ]);
}
