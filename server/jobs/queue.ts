/**
 * The job queue: pg-boss on the app's PostgreSQL database, in its own `pgboss` schema. Jobs survive
 * restarts (they are rows), several workers on several nodes share them (SKIP LOCKED), and failed
 * jobs come back with exponential backoff.
 */
import PgBoss from 'pg-boss';
import type pg from 'pg';
import type { Config } from '../config';
import type { Logger } from '../logger';

export const PGBOSS_SCHEMA = 'pgboss';

/** Queue names. `short` keeps at most one waiting job per singletonKey. */
export const queues = {
  /** Deliver one recorded message: { messageId }. */
  send: 'mail-send',
  /** Work out who gets a message after a domain event: ComposeJob. */
  compose: 'mail-compose',
  /** Periodic: deadline reminders, and re-queueing mail whose job was lost. */
  sweep: 'mail-sweep',
  /** Weekly: coordinators' digests. */
  digest: 'mail-digest',
  /** Periodic: remove photo files the database queued for deletion or left pending past the grace period. */
  photoFiles: 'photo-files',
} as const;
export type QueueName = (typeof queues)[keyof typeof queues];

/** pg-boss's `db` option: run its SQL on a client inside our own transaction. */
export function inTransaction(client: pg.PoolClient): PgBoss.Db {
  return { executeSql: (text, values) => client.query(text, values) };
}

export interface QueueOptions {
  retryLimit: number;
  retryDelaySeconds: number;
}

/** Creates (or updates) every queue; createQueue is idempotent, so every node may run this. */
export async function ensureQueues(boss: PgBoss, opts: QueueOptions) {
  const retry = { retryLimit: opts.retryLimit, retryDelay: opts.retryDelaySeconds, retryBackoff: true };
  const settings: Record<QueueName, PgBoss.Queue> = {
    [queues.send]: { name: queues.send, policy: 'short', ...retry, expireInSeconds: 15 * 60 },
    [queues.compose]: { name: queues.compose, policy: 'short', ...retry, expireInSeconds: 15 * 60 },
    [queues.sweep]: { name: queues.sweep, policy: 'short', retryLimit: 1, expireInSeconds: 15 * 60 },
    [queues.digest]: { name: queues.digest, policy: 'short', ...retry, expireInSeconds: 30 * 60 },
    [queues.photoFiles]: { name: queues.photoFiles, policy: 'short', retryLimit: 2, expireInSeconds: 30 * 60 },
  };
  for (const [name, options] of Object.entries(settings)) {
    await boss.createQueue(name, options);
    // A queue that already exists keeps its old settings unless told otherwise.
    await boss.updateQueue(name, options);
  }
}

/** Starts a pg-boss instance (creating or migrating its schema under its own lock). */
export async function startBoss(
  config: Pick<Config, 'DATABASE_URL' | 'MAIL_RETRY_LIMIT' | 'MAIL_RETRY_DELAY_SECONDS'>,
  logger: Logger,
  opts: { schedule?: boolean } = {},
) {
  const boss = new PgBoss({
    connectionString: config.DATABASE_URL,
    schema: PGBOSS_SCHEMA,
    application_name: 'blockpost-jobs',
    max: 4,
    schedule: opts.schedule ?? true,
    // Keep finished jobs a week for looking into problems; the mail history is kept in mail_messages.
    deleteAfterDays: 7,
  });
  boss.on('error', (err) => logger.error({ err }, 'job queue error'));
  await boss.start();
  await ensureQueues(boss, { retryLimit: config.MAIL_RETRY_LIMIT, retryDelaySeconds: config.MAIL_RETRY_DELAY_SECONDS });
  return boss;
}
