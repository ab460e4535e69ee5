/**
 * Recording a message and queueing its delivery, in one transaction: the row in mail_messages is
 * inserted only if its idempotency key is new, and the delivery job is inserted on the same
 * connection, so either both exist or neither does. Whoever inserts the key first owns the message.
 */
import type PgBoss from 'pg-boss';
import type pg from 'pg';
import type { AnyMailCategory } from '@shared/schemas/notifications';
import { inTransaction, queues } from '../jobs/queue';
import { withPgTransaction } from '../db/pg-transaction';
import type { RenderedMail, TemplateName } from './render';
import { INSERT_MESSAGE, STALLED_MESSAGES } from './mail.queries';

export interface OutgoingRecord {
  /** Unique per message and recipient, e.g. `swap:12:due-reminder:2027-04-03:user:7`. */
  key: string;
  category: AnyMailCategory;
  kind: TemplateName;
  guildId: number | null;
  swapId: number | null;
  userId: number | null;
  to: string;
  mail: RenderedMail;
  /** Set when the person switched this kind of mail off: recorded as not sent, never delivered. */
  skipReason?: string | null;
}

export interface RecordResult {
  queued: number;
  skipped: number;
  /** keys already recorded earlier (by this or another worker) */
  existing: number;
}

/**
 * Records each message once and queues its delivery; a key seen before is left alone. `writtenFor`
 * is the moment the words were worked out for (now, unless a sweep was run for another time).
 */
export async function recordAndQueue(
  pool: pg.Pool,
  boss: PgBoss,
  records: OutgoingRecord[],
  writtenFor?: Date,
): Promise<RecordResult> {
  const result: RecordResult = { queued: 0, skipped: 0, existing: 0 };
  for (const r of records) {
    const status = r.skipReason ? 'skipped' : 'queued';
    const id = await withPgTransaction(pool, async (client) => {
      const inserted = await client.query<{ id: number }>(INSERT_MESSAGE, [
        r.key,
        r.category,
        r.kind,
        r.guildId,
        r.swapId,
        r.userId,
        r.to,
        r.mail.subject.slice(0, 300),
        r.mail.text,
        r.mail.html,
        status,
        r.skipReason ?? null,
        writtenFor ?? null,
      ]);
      const messageId = inserted.rows[0]?.id;
      if (messageId !== undefined && status === 'queued') {
        await boss.send(queues.send, { messageId }, { singletonKey: r.key, db: inTransaction(client) });
      }
      return messageId;
    });
    if (id === undefined) result.existing += 1;
    else if (status === 'skipped') result.skipped += 1;
    else result.queued += 1;
  }
  return result;
}

/**
 * Queues delivery again for messages whose job was lost (a node died between claiming and
 * finishing, or a job expired). The delivery step re-checks the row, so a message that was sent
 * meanwhile is not sent again.
 */
export async function requeueStalled(pool: pg.Pool, boss: PgBoss, olderThanMinutes = 60): Promise<number> {
  const { rows } = await pool.query<{ id: number; idempotency_key: string }>(STALLED_MESSAGES, [olderThanMinutes]);
  let count = 0;
  for (const row of rows) {
    if (await boss.send(queues.send, { messageId: row.id }, { singletonKey: row.idempotency_key })) count += 1;
  }
  return count;
}
