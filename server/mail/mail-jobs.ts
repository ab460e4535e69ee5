/**
 * The mail side of the job queue: domain events become compose jobs; compose jobs record one
 * message per recipient and queue its delivery; delivery jobs send. A cron sweep sends deadline
 * reminders and re-queues mail whose job was lost; a weekly cron sends the coordinators' digest.
 * Every node may run this: jobs are shared, and each message's idempotency key keeps it single.
 */
import type PgBoss from 'pg-boss';
import type { AppDeps } from '../deps';
import type { Mailer } from './mailer';
import { deliverMessage, RetryableDeliveryError } from './deliver';
import { requeueStalled, type RecordResult } from './outbox';
import type { ComposeDeps } from './compose/context';
import { composeAnnouncement } from './compose/announcement';
import { composeSignupConfirmation } from './compose/signup-confirmation';
import { composeReminders } from './compose/reminders';
import { composeReceipt } from './compose/receipt';
import { composeDistribution } from './compose/distribution';
import { composeDigests } from './compose/digest';
import { composePaymentReceipt } from './compose/payment-receipt';
import { sendPasswordReset, sendSignupMail, tidyPendingSignups } from './compose/account';
import { queues, startBoss } from '../jobs/queue';

const SEND_WORKERS = 4;

export type ComposeJob =
  | { kind: 'announcement'; swapId: number }
  | { kind: 'signup-confirmation'; swapId: number; userId: number }
  | { kind: 'receipt'; swapId: number; userId: number }
  | { kind: 'distribution'; swapId: number }
  | { kind: 'payment-receipt'; paymentIds: number[]; news: 'paid' | 'refunded' }
  | { kind: 'account-signup'; pendingSignupId: number }
  | { kind: 'password-reset'; email: string };

export interface MailJobs {
  boss: PgBoss;
  /** Queues a compose job as an event would (used by the event subscriptions and tests). */
  enqueue(job: ComposeJob, delaySeconds?: number): Promise<string | null>;
  /** Runs a compose job now, in this process. */
  compose(job: ComposeJob): Promise<RecordResult>;
  /** Reminders due at `now`, plus re-queueing stalled mail. */
  sweep(now?: Date): Promise<RecordResult & { requeued: number }>;
  digest(now?: Date): Promise<RecordResult>;
  close(): Promise<void>;
}

export interface MailJobsOptions {
  /** Deliver through this mailer instead of deps.mailer (tests point one at a dead SMTP port). */
  mailer?: Mailer;
  /** Take jobs from the queue in this process (default true). */
  workers?: boolean;
  /** Turn domain events into mail (default true). */
  events?: boolean;
  /** Register the sweep and digest crons (default true). */
  schedule?: boolean;
}

/** One waiting compose job per subject: a burst of events for it makes one message. */
function singletonKey(job: ComposeJob) {
  if (job.kind === 'payment-receipt') return `${job.kind}:${job.paymentIds.join('-')}:${job.news}`;
  if (job.kind === 'account-signup') return `${job.kind}:${job.pendingSignupId}`;
  // A burst of reset requests for one address makes one message.
  if (job.kind === 'password-reset') return `${job.kind}:${job.email}`;
  return 'userId' in job ? `${job.kind}:${job.swapId}:${job.userId}` : `${job.kind}:${job.swapId}`;
}

/** How long before a waiting job's start this node stops counting on it (clock differences with the database). */
const WAITING_MARGIN_MS = 5_000;

/**
 * The delayed compose jobs this node queued and that cannot have started yet. A later event for the
 * same subject is covered by the waiting job, which composes from the state when it runs, so it is
 * not sent to the queue again: on meeting night each ruler measurement raised two receipt events,
 * each a round trip that the queue's one-waiting-job rule then refused (with the worker on, a
 * measurement ran at two thirds of the rate, docs/benchmarks.md, stop 30). Only a job this node
 * created counts, as only its start is known; one refused because another was waiting is not.
 */
export class WaitingJobs {
  private until = new Map<string, number>();
  /** the sends under way, by key */
  private sending = new Map<string, Promise<string | null>>();

  constructor(private now: () => number = () => performance.now()) {}

  /**
   * Queues a job with `send` (its id, or null when the queue refused it) unless one queued here with
   * this key is still waiting. Events of one tick for the key (a measurement's change and its
   * measuring) wait for the first one's answer.
   */
  async queue(key: string, delaySeconds: number, send: () => Promise<string | null>) {
    const inFlight = this.sending.get(key);
    if (inFlight) await inFlight.catch(() => null);
    if (this.covers(key)) return;
    const queuedAt = this.now();
    const sent = send();
    this.sending.set(key, sent);
    try {
      if (await sent) this.remember(key, queuedAt, delaySeconds);
    } finally {
      if (this.sending.get(key) === sent) this.sending.delete(key);
    }
  }

  /** Whether a job with this key, queued here, is still known to be waiting. */
  covers(key: string): boolean {
    const until = this.until.get(key);
    if (until === undefined) return false;
    if (until > this.now()) return true;
    this.until.delete(key);
    return false;
  }

  /** Records a job queued here at `queuedAt` (this clock) to start `delaySeconds` later. */
  remember(key: string, queuedAt: number, delaySeconds: number) {
    const until = queuedAt + delaySeconds * 1000 - WAITING_MARGIN_MS;
    if (until <= this.now()) return;
    this.until.set(key, until);
    // Forget the jobs that have started, now and then, so the map holds only the waiting ones.
    if (this.until.size > 1_000) for (const [k, u] of this.until) if (u <= this.now()) this.until.delete(k);
  }
}

/** Starts the queue, its workers, its crons and the event subscriptions. */
export async function startMailJobs(deps: AppDeps, opts: MailJobsOptions = {}): Promise<MailJobs> {
  const { config, logger } = deps;
  const boss = await startBoss(config, logger, { schedule: opts.schedule ?? true });
  const composeDeps: ComposeDeps = { pool: deps.pool, sequelize: deps.sequelize, config, logger, boss };
  const delivery = {
    pool: deps.pool,
    sequelize: deps.sequelize,
    mailer: opts.mailer ?? deps.mailer,
    config,
    // The send queue keeps one waiting job per key (a missing key counts as one key): each held message needs its own.
    later: (messageId: number, seconds: number) =>
      boss.send(queues.send, { messageId }, { startAfter: seconds, singletonKey: `held:${messageId}` }),
  };
  let closed = false;
  // Account mail carries live links, so it is sent straight away (see compose/account.ts).
  const sent = (outcome: string): RecordResult => ({ queued: outcome === 'nothing' ? 0 : 1, skipped: 0, existing: 0 });

  const compose = async (job: ComposeJob): Promise<RecordResult> => {
    switch (job.kind) {
      case 'announcement':
        return composeAnnouncement(composeDeps, job.swapId);
      case 'signup-confirmation':
        return composeSignupConfirmation(composeDeps, job.swapId, job.userId);
      case 'receipt':
        return composeReceipt(composeDeps, job.swapId, job.userId);
      case 'distribution':
        return composeDistribution(composeDeps, job.swapId);
      case 'payment-receipt':
        return composePaymentReceipt(composeDeps, job.paymentIds, job.news);
      case 'account-signup':
        return sent(await sendSignupMail({ config, mailer: delivery.mailer }, job.pendingSignupId));
      case 'password-reset':
        return sent(await sendPasswordReset({ config, mailer: delivery.mailer }, job.email));
    }
  };
  const sweep = async (now = new Date()) => {
    const reminders = await composeReminders(composeDeps, now);
    let requeued = await requeueStalled(deps.pool, boss);
    for (const pendingSignupId of await tidyPendingSignups(now)) {
      if (await enqueue({ kind: 'account-signup', pendingSignupId })) requeued += 1;
    }
    return { ...reminders, requeued };
  };
  const digest = (now = new Date()) => composeDigests(composeDeps, now);
  const enqueue = (job: ComposeJob, delaySeconds = 0) =>
    boss.send(queues.compose, job, {
      singletonKey: singletonKey(job),
      ...(delaySeconds > 0 ? { startAfter: delaySeconds } : {}),
    });

  if (opts.workers ?? true) {
    const work = { batchSize: 1, pollingIntervalSeconds: config.JOBS_POLL_SECONDS };
    // Several delivery workers per process, so a guild-wide announcement is not sent one by one.
    for (let i = 0; i < SEND_WORKERS; i += 1) {
      await boss.work<{ messageId: number }>(queues.send, work, async ([job]) => {
        try {
          const outcome = await deliverMessage(delivery, job!.data.messageId);
          logger.debug({ messageId: job!.data.messageId, outcome }, 'mail delivery');
        } catch (error) {
          if (error instanceof RetryableDeliveryError)
            logger.warn({ messageId: job!.data.messageId, reason: error.message }, 'mail delivery failed; will retry');
          throw error;
        }
      });
    }
    await boss.work<ComposeJob>(queues.compose, work, async ([job]) => {
      const result = await compose(job!.data);
      // A reset job carries an address someone typed; the log keeps only the kind.
      const logged = job!.data.kind === 'password-reset' ? { kind: job!.data.kind } : job!.data;
      logger.info({ job: logged, ...result }, 'mail composed');
    });
    await boss.work(queues.sweep, work, async () => {
      const result = await sweep();
      if (result.queued || result.requeued) logger.info(result, 'mail sweep');
    });
    await boss.work(queues.digest, work, async () => {
      logger.info(await digest(), 'weekly digests composed');
    });
  }
  if (opts.schedule ?? true) {
    await boss.schedule(queues.sweep, config.MAIL_SWEEP_CRON, {}, { tz: 'UTC' });
    await boss.schedule(queues.digest, config.MAIL_DIGEST_CRON, {}, { tz: 'UTC' });
  }

  if (opts.events ?? true) {
    const delay = config.MAIL_BATCH_DELAY_SECONDS;
    const waiting = new WaitingJobs();
    // A listener's failure is logged by DomainEvents and never fails the request that emitted.
    const on = async (job: ComposeJob, delaySeconds = 0) => {
      if (closed) return;
      if (delaySeconds === 0) await enqueue(job);
      else await waiting.queue(singletonKey(job), delaySeconds, () => enqueue(job, delaySeconds));
    };
    deps.events.on('swap.transitioned', (e) => (e.to === 'signup' ? on({ kind: 'announcement', swapId: e.swapId }) : undefined));
    deps.events.on('signup.changed', (e) => on({ kind: 'signup-confirmation', swapId: e.swapId, userId: e.userId }, delay));
    // A block taken in, or one of its steps undone after it was taken in, changes what the receipt says.
    const inHand = ['received', 'measured'];
    deps.events.on('block.changed', (e) =>
      inHand.includes(e.to) || inHand.includes(e.from)
        ? on({ kind: 'receipt', swapId: e.swapId, userId: e.makerId }, delay)
        : undefined,
    );
    // Makers' own and photo estimates are not the coordinator's verdict; only the ruler's counts.
    deps.events.on('block.measured', (e) =>
      e.source === 'ruler' ? on({ kind: 'receipt', swapId: e.swapId, userId: e.makerId }, delay) : undefined,
    );
    deps.events.on('distribution.confirmed', (e) => on({ kind: 'distribution', swapId: e.swapId }));
    deps.events.on('account.signup-requested', (e) => on({ kind: 'account-signup', pendingSignupId: e.pendingSignupId }));
    deps.events.on('account.reset-requested', (e) => on({ kind: 'password-reset', email: e.email }));
    deps.events.on('payment.settled', (e) =>
      e.status === 'failed' ? undefined : on({ kind: 'payment-receipt', paymentIds: e.paymentIds, news: e.status }),
    );
  }

  return {
    boss,
    enqueue,
    compose,
    sweep,
    digest,
    async close() {
      closed = true;
      // Graceful: running jobs finish (or are left for another worker once they expire).
      await boss.stop({ graceful: true, wait: true, timeout: 10_000 });
    },
  };
}
