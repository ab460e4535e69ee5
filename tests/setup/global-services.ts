/**
 * Starts what the API, live and browser suites need, once per run: a throwaway PostgreSQL cluster
 * in a temporary folder on a free loopback port (durability off), a migrated template database that
 * each test file clones, and maildev on free loopback ports. Everything stops at the end, pass or fail.
 */
import type { TestProject } from 'vitest/node';
import { startThrowawayCluster } from '../../scripts/lib/throwaway-cluster';
import { startMaildev } from '../../scripts/lib/maildev';
import { freePort } from '../../scripts/lib/ports';
import { createSequelize } from '../../server/db/sequelize';
import { migrateUp } from '../../server/db/migrator';

export const TEMPLATE_DB = 'blockpost_template';

declare module 'vitest' {
  export interface ProvidedContext {
    pgPort: number;
    smtpUrl: string;
    maildevApi: string;
  }
}

export default async function setup(project: TestProject) {
  const cluster = await startThrowawayCluster('blockpost-test-');
  let maildev: Awaited<ReturnType<typeof startMaildev>> | null = null;
  try {
    maildev = await startMaildev({ smtpPort: await freePort(), webPort: await freePort() });
    const sequelize = createSequelize(await cluster.database(TEMPLATE_DB));
    await migrateUp(sequelize);
    await sequelize.close();
  } catch (error) {
    await maildev?.stop();
    cluster.stop();
    throw error;
  }

  project.provide('pgPort', cluster.port);
  project.provide('smtpUrl', `smtp://127.0.0.1:${maildev.smtpPort}`);
  project.provide('maildevApi', maildev.apiUrl);

  return async () => {
    await maildev?.stop();
    cluster.stop();
  };
}
