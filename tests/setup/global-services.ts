/**
 * Starts what the API, live and browser suites need, once per run: a throwaway PostgreSQL cluster
 * in a temporary folder on a free loopback port (durability off), a migrated template database that
 * each test file clones, maildev and the fake object store (s3rver) on free loopback ports. Everything
 * stops at the end, pass or fail.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { TestProject } from 'vitest/node';
import { startThrowawayCluster } from '../../scripts/lib/throwaway-cluster';
import { startMaildev } from '../../scripts/lib/maildev';
import { startS3Fake } from '../../scripts/lib/s3-fake';
import { freePort } from '../../scripts/lib/ports';
import { startPaymentsFake } from '../../scripts/lib/payments-fake';
import { createSequelize } from '../../server/db/sequelize';
import { migrateUp } from '../../server/db/migrator';

export const TEMPLATE_DB = 'blockpost_template';

declare module 'vitest' {
  export interface ProvidedContext {
    pgPort: number;
    smtpUrl: string;
    maildevApi: string;
    /** The fake object store (s3rver) on loopback, with one bucket; tests keep apart by key prefix. */
    s3Env: Record<string, string>;
    /** The local payments fake's port (tests register their own webhook endpoints on it). */
    paymentsPort: number;
  }
}

export default async function setup(project: TestProject) {
  const cluster = await startThrowawayCluster('blockpost-test-');
  let maildev: Awaited<ReturnType<typeof startMaildev>> | null = null;
  let s3: Awaited<ReturnType<typeof startS3Fake>> | null = null;
  const s3Dir = mkdtempSync(join(tmpdir(), 'blockpost-s3-'));
  try {
    maildev = await startMaildev({ smtpPort: await freePort(), webPort: await freePort() });
    s3 = await startS3Fake({ port: await freePort(), directory: s3Dir, buckets: ['blockpost-test'] });
    const sequelize = createSequelize(await cluster.database(TEMPLATE_DB));
    await migrateUp(sequelize);
    await sequelize.close();
  } catch (error) {
    await s3?.stop();
    await maildev?.stop();
    cluster.stop();
    throw error;
  }

  project.provide('pgPort', cluster.port);
  project.provide('smtpUrl', `smtp://127.0.0.1:${maildev.smtpPort}`);
  project.provide('maildevApi', maildev.apiUrl);
  project.provide('s3Env', s3.env);
  const payments = await startPaymentsFake();
  project.provide('paymentsPort', payments.port);

  return async () => {
    await payments.stop();
    await s3?.stop();
    rmSync(s3Dir, { recursive: true, force: true });
    await maildev?.stop();
    cluster.stop();
  };
}
