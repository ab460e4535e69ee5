/**
 * The delivery machinery against real PostgreSQL (pg-boss) and the maildev started by the test run:
 * one message per idempotency key, delivery once across restarts, across two workers and across two
 * server processes, and failures recorded with their reason after the retries.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { signedInUser } from '../helpers/factories';
import { inject } from 'vitest';
import { mailTo, waitForMail, type CaughtMail } from '../helpers/maildev';
import { startMailJobs, type MailJobs } from '../../server/mail/mail-jobs';
import { queues } from '../../server/jobs/queue';
import { recordAndQueue, type OutgoingRecord } from '../../server/mail/outbox';
import { createMailer } from '../../server/mail/mailer';
import { MailMessage } from '../../server/db/models';
import { freePort } from '../../scripts/lib/ports';

let app: TestApp;
const running: MailJobs[] = [];
beforeAll(async () => {
  app = await createTestApp({ JOBS_POLL_SECONDS: '0.5', MAIL_RETRY_LIMIT: '1', MAIL_RETRY_DELAY_SECONDS: '1' });
});
// Every test starts its own workers; none may linger into the next test.
afterEach(async () => {
  for (const jobs of running.splice(0)) await jobs.close().catch(() => undefined);
});
afterAll(() => app.close());

async function jobs(opts: Parameters<typeof startMailJobs>[1] = {}) {
  const started = await startMailJobs(app.deps, { schedule: false, events: false, ...opts });
  running.push(started);
  return started;
}

async function stop(j: MailJobs) {
  await j.close();
  running.splice(running.indexOf(j), 1);
}

function record(user: { id: number; email: string }, key: string, subject = `Test ${key}`): OutgoingRecord {
  return {
    key,
    category: 'reminders',
    kind: 'due-reminder',
    guildId: null,
    swapId: null,
    userId: user.id,
    to: user.email,
    mail: { subject, text: `Hello, this is ${key}.\n`, html: `<p>Hello, this is ${key}.</p>` },
  };
}

/** The raw message as received over SMTP (maildev's parsed headers leave the List-* ones out). */
async function rawHeaders(mail: CaughtMail): Promise<Record<string, string>> {
  const source = await (await fetch(`${inject('maildevApi')}/api/email/${mail.id}/source`)).text();
  const head = source.split(/\r?\n\r?\n/)[0]!.replace(/\r?\n[ \t]+/g, ' ');
  return Object.fromEntries(
    head.split(/\r?\n/).map((line) => [line.slice(0, line.indexOf(':')).toLowerCase(), line.slice(line.indexOf(':') + 1).trim()]),
  );
}

const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function waitForStatus(id: number, status: string, timeoutMs = 15_000) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const row = await MailMessage.findByPk(id);
    if (row?.status === status) return row;
    await pause(200);
  }
  throw new Error(`message ${id} did not become ${status}: ${(await MailMessage.findByPk(id))?.status}`);
}

describe('recording and delivering', () => {
  it('records a key once, delivers it once, with one-click unsubscribe headers', async () => {
    const user = await signedInUser(app);
    const worker = await jobs();
    const first = await recordAndQueue(app.deps.pool, worker.boss, [record(user, `test:once:${user.id}`)]);
    const again = await recordAndQueue(app.deps.pool, worker.boss, [record(user, `test:once:${user.id}`)]);
    expect(first).toEqual({ queued: 1, skipped: 0, existing: 0 });
    expect(again).toEqual({ queued: 0, skipped: 0, existing: 1 });

    const headers = await rawHeaders(await waitForMail(user.email, (m) => m.subject.startsWith('Test')));
    expect(headers['list-unsubscribe']).toMatch(
      new RegExp(`^<http://127\\.0\\.0\\.1:3000/api/unsubscribe\\?token=${user.id}\\.reminders\\.[\\w-]{43}>$`),
    );
    expect(headers['list-unsubscribe-post']).toBe('List-Unsubscribe=One-Click');
    const row = await waitForStatus(
      (await MailMessage.findOne({ where: { idempotencyKey: `test:once:${user.id}` } }))!.id,
      'sent',
    );
    expect(row.attempts).toBe(1);
    expect(row.sentAt).toBeInstanceOf(Date);
    await pause(1500);
    expect(await mailTo(user.email)).toHaveLength(1);
  });
});

describe('restarts', () => {
  it('delivers, once, a message queued by a worker that stopped before sending it', async () => {
    const user = await signedInUser(app);
    const producer = await jobs({ workers: false });
    await recordAndQueue(app.deps.pool, producer.boss, [record(user, `test:restart:${user.id}`)]);
    await stop(producer);
    await pause(1000);
    expect(await mailTo(user.email)).toHaveLength(0);
    const row = await MailMessage.findOne({ where: { idempotencyKey: `test:restart:${user.id}` } });
    expect(row!.status).toBe('queued');

    await jobs();
    await waitForMail(user.email);
    await waitForStatus(row!.id, 'sent');
    await pause(1500);
    expect(await mailTo(user.email)).toHaveLength(1);
  });

  it('keeps a scheduled job when the worker holding it stops, and a new worker delivers it once', async () => {
    const user = await signedInUser(app);
    const first = await jobs();
    const [id] = (
      await app.deps.pool.query<{ id: number }>(
        `INSERT INTO mail_messages (idempotency_key, category, kind, user_id, to_address, subject, text_body, html_body)
       VALUES ($1, 'reminders', 'due-reminder', $2, $3, 'Scheduled test', 'Later.', '<p>Later.</p>') RETURNING id`,
        [`test:scheduled:${user.id}`, user.id, user.email],
      )
    ).rows.map((r) => r.id);
    await first.boss.send(queues.send, { messageId: id }, { startAfter: 2, singletonKey: `test:scheduled:${user.id}` });
    await stop(first);
    await pause(2500);
    expect(await mailTo(user.email)).toHaveLength(0);

    await jobs();
    await waitForMail(user.email, (m) => m.subject === 'Scheduled test');
    await pause(1500);
    expect(await mailTo(user.email)).toHaveLength(1);
  });
});

describe('two workers on one database', () => {
  it('sends each message once even when both workers hold a job for it', async () => {
    const users = await Promise.all(Array.from({ length: 6 }, () => signedInUser(app)));
    const a = await jobs();
    const b = await jobs();
    const records = users.map((u) => record(u, `test:pair:${u.id}`));
    await recordAndQueue(app.deps.pool, a.boss, records);
    // A second job for every message, as a double enqueue or a re-queue would make.
    const rows = await MailMessage.findAll({ where: { idempotencyKey: records.map((r) => r.key) } });
    for (const row of rows)
      await b.boss.send(queues.send, { messageId: row.id }, { singletonKey: `${row.idempotencyKey}:again` });

    for (const u of users) await waitForMail(u.email);
    await pause(2000);
    for (const u of users) expect(await mailTo(u.email)).toHaveLength(1);
    for (const row of rows) expect((await row.reload()).attempts).toBe(1);
  });

  it('records one message when two workers race to record the same key', async () => {
    const user = await signedInUser(app);
    const a = await jobs({ workers: false });
    const b = await jobs({ workers: false });
    const results = await Promise.all(
      [a, b, a, b].map((j) => recordAndQueue(app.deps.pool, j.boss, [record(user, `test:race:${user.id}`)])),
    );
    expect(results.reduce((s, r) => s + r.queued, 0)).toBe(1);
    expect(results.reduce((s, r) => s + r.existing, 0)).toBe(3);
    expect(await MailMessage.count({ where: { idempotencyKey: `test:race:${user.id}` } })).toBe(1);
  });
});

/** A second node: the real server in its own process, with JOBS=true, on the same database. */
async function startNode(): Promise<{ child: ChildProcess; stop(): Promise<void> }> {
  const code = `const { startServer } = await import('./server/index.ts');
    const { loadConfig } = await import('./server/config.ts');
    const running = await startServer(loadConfig(process.env));
    console.log('READY ' + running.url);
    process.on('SIGTERM', () => running.close().then(() => process.exit(0)));`;
  const child = spawn(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', code], {
    env: {
      ...process.env,
      NODE_ENV: 'test',
      DATABASE_URL: app.databaseUrl,
      SESSION_SECRET: 'test-secret-test-secret',
      SMTP_URL: inject('smtpUrl'),
      PORT: '0',
      JOBS: 'true',
      JOBS_POLL_SECONDS: '0.5',
      LOG_LEVEL: 'silent',
      SERVE_CLIENT: 'false',
      PUBLIC_URL: 'http://127.0.0.1:3000',
      UPLOAD_DIR: mkdtempSync(join(tmpdir(), 'blockpost-node-')),
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`second node did not start: ${output}`)), 30_000);
    child.stdout!.on('data', (d) => {
      output += String(d);
      if (output.includes('READY ')) {
        clearTimeout(timer);
        resolve();
      }
    });
    child.stderr!.on('data', (d) => (output += String(d)));
    child.once('exit', (code) => reject(new Error(`second node exited with ${code}: ${output}`)));
  });
  return {
    child,
    stop: () =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null) return resolve();
        child.once('exit', () => resolve());
        child.kill('SIGTERM');
      }),
  };
}

describe('two server processes', () => {
  it('a second node started with JOBS=true delivers, and with both working each message goes once', async () => {
    const node = await startNode();
    try {
      const producer = await jobs({ workers: false });
      const first = await Promise.all(Array.from({ length: 4 }, () => signedInUser(app)));
      await recordAndQueue(
        app.deps.pool,
        producer.boss,
        first.map((u) => record(u, `test:node:${u.id}`)),
      );
      // Only the other process has workers, so these arrive through it.
      for (const u of first) await waitForMail(u.email, undefined, 20_000);

      await jobs();
      const second = await Promise.all(Array.from({ length: 8 }, () => signedInUser(app)));
      const records = second.map((u) => record(u, `test:both:${u.id}`));
      await recordAndQueue(app.deps.pool, producer.boss, records);
      const rows = await MailMessage.findAll({ where: { idempotencyKey: records.map((r) => r.key) } });
      for (const row of rows)
        await producer.boss.send(queues.send, { messageId: row.id }, { singletonKey: `${row.idempotencyKey}:again` });
      for (const u of second) await waitForMail(u.email, undefined, 20_000);
      await pause(2000);
      for (const u of [...first, ...second]) expect(await mailTo(u.email), u.email).toHaveLength(1);
    } finally {
      await node.stop();
    }
  });
});

describe('failures', () => {
  it('retries with backoff, then records the message as failed with the reason', async () => {
    const user = await signedInUser(app);
    const deadSmtp = createMailer({
      SMTP_URL: `smtp://127.0.0.1:${await freePort()}`,
      MAIL_FROM: 'Blockpost <no-reply@blockpost.local>',
    });
    const worker = await jobs({ mailer: deadSmtp });
    await recordAndQueue(app.deps.pool, worker.boss, [record(user, `test:fail:${user.id}`)]);
    const row = await MailMessage.findOne({ where: { idempotencyKey: `test:fail:${user.id}` } });
    const failed = await waitForStatus(row!.id, 'failed', 25_000);
    expect(failed.attempts).toBe(2); // the first try and MAIL_RETRY_LIMIT=1 retry
    expect(failed.statusReason).toMatch(/ECONNREFUSED/);
    expect(failed.sentAt).toBeNull();
    deadSmtp.close();
  });
});
