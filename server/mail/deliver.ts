/**
 * Delivering one recorded message. A worker first claims the row (queued → sending, with a lease),
 * so two workers holding jobs for the same message cannot both send it; a finished message is
 * never touched again. The person's choices are checked once more just before sending.
 */
import type pg from 'pg';
import type { AnyMailCategory, MailCategory } from '@shared/schemas/notifications';
import type { Config } from '../config';
import type { AppDeps } from '../deps';
import type { Mailer } from './mailer';
import { optedOut, optedOutReason } from './preferences';
import { unsubscribeHeaders, unsubscribeToken } from './unsubscribe-token';
import { stillTrue } from './still-true';
import { CLAIM_MESSAGE, FINISH_MESSAGE, RECEIPT_PENDING, REWRITE_MESSAGE } from './mail.queries';

/** How long a claim holds; a worker that dies mid-send lets the message go after this. */
const LEASE_MINUTES = 15;

interface ClaimedRow {
  id: number;
  category: AnyMailCategory;
  user_id: number | null;
  to_address: string;
  subject: string;
  text_body: string;
  html_body: string;
  attempts: number;
  kind: string;
  swap_id: number | null;
  idempotency_key: string;
  written_for: Date;
}

type DeliveryOutcome = 'sent' | 'skipped' | 'failed' | 'not-claimed' | 'held';

/** Thrown for a failure worth retrying; the job queue brings the job back with backoff. */
export class RetryableDeliveryError extends Error {}

interface DeliveryDeps extends Pick<AppDeps, 'sequelize'> {
  pool: pg.Pool;
  mailer: Mailer;
  config: Pick<Config, 'PUBLIC_URL' | 'SESSION_SECRET' | 'MAIL_RETRY_LIMIT'>;
  /** Queues message `id` for delivery again after `seconds` (a message held back for another). */
  later?: (id: number, seconds: number) => Promise<unknown>;
}

/** How long a return notice waits for the same maker's receipt before looking again. */
const HOLD_SECONDS = 2;

function reasonOf(error: unknown): string {
  const e = error as { message?: string; responseCode?: number; code?: string };
  return (e?.message ?? String(error)).replace(/\s+/g, ' ').trim().slice(0, 500);
}

/** SMTP 5xx answers are permanent (unknown mailbox, refused); retrying would not help. */
function isPermanent(error: unknown) {
  const code = (error as { responseCode?: number })?.responseCode;
  return typeof code === 'number' && code >= 500 && code < 600;
}

/** Sends message `id` if nobody else has or is; records the outcome on the row. */
export async function deliverMessage(deps: DeliveryDeps, id: number): Promise<DeliveryOutcome> {
  if (deps.later && (await deps.pool.query(RECEIPT_PENDING, [id])).rowCount) {
    await deps.later(id, HOLD_SECONDS);
    return 'held';
  }
  const claimed = await deps.pool.query<ClaimedRow>(CLAIM_MESSAGE, [id, LEASE_MINUTES]);
  const row = claimed.rows[0];
  if (!row) return 'not-claimed';

  const finish = (status: 'sent' | 'skipped' | 'failed' | 'queued', reason: string | null, providerId: string | null = null) =>
    deps.pool.query(FINISH_MESSAGE, [id, status, reason, providerId]);

  if (row.category !== 'account' && row.user_id !== null && (await optedOut([row.user_id], row.category)).has(row.user_id)) {
    await finish('skipped', optedOutReason(row.category as MailCategory));
    return 'skipped';
  }

  // What the message says is checked against the swap as it is now: dropped or rewritten if it moved on.
  const asOf = new Date(Math.max(Date.now(), new Date(row.written_for).getTime()));
  const check = await stillTrue(deps, row, asOf);
  if ('drop' in check) {
    await finish('skipped', check.drop);
    return 'skipped';
  }
  if (check.send === 'rewritten') {
    const { subject, text, html } = check.mail;
    await deps.pool.query(REWRITE_MESSAGE, [id, subject.slice(0, 300), text, html]);
    Object.assign(row, { subject: subject.slice(0, 300), text_body: text, html_body: html });
  }

  const headers =
    row.category !== 'account' && row.user_id !== null
      ? unsubscribeHeaders(
          deps.config.PUBLIC_URL,
          unsubscribeToken(deps.config.SESSION_SECRET, row.user_id, row.category as MailCategory),
        )
      : undefined;
  try {
    const info = await deps.mailer.send({
      to: row.to_address,
      subject: row.subject,
      text: row.text_body,
      html: row.html_body,
      headers,
    });
    await finish('sent', null, info.messageId);
    return 'sent';
  } catch (error) {
    const reason = reasonOf(error);
    const lastTry = row.attempts > deps.config.MAIL_RETRY_LIMIT || isPermanent(error);
    await finish(lastTry ? 'failed' : 'queued', lastTry ? reason : `Will try again: ${reason}`);
    if (lastTry) return 'failed';
    throw new RetryableDeliveryError(reason);
  }
}
