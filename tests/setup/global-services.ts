/**
 * Starts what the API, live and browser suites need, once per run: a throwaway PostgreSQL cluster
 * in a temporary folder on a free loopback port (durability off), a migrated template database that
 * each test file clones, and maildev on free loopback ports. Everything stops at the end, pass or fail.
 */
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { TestProject } from 'vitest/node';
import {
  clusterUrl, ensureDatabase, ensurePostgresBinaries, initCluster, startCluster, stopCluster,
} from '../../scripts/lib/postgres';
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
  const pgBin = ensurePostgresBinaries();
  const root = mkdtempSync(join(tmpdir(), 'blockpost-test-'));
  chmodSync(root, 0o755); // the cluster runs as the postgres user, which must reach its folders
  const port = await freePort();
  const cluster = { dataDir: join(root, 'data'), socketDir: join(root, 'run'), logFile: join(root, 'postgres.log'), port, fast: true };
  initCluster(pgBin, cluster);
  startCluster(pgBin, cluster);
  const maildev = await startMaildev({ smtpPort: await freePort(), webPort: await freePort() }).catch(async (error) => {
    stopCluster(pgBin, cluster.dataDir);
    throw error;
  });
  try {
    await ensureDatabase(port, TEMPLATE_DB);
    const sequelize = createSequelize(clusterUrl(port, TEMPLATE_DB));
    await migrateUp(sequelize);
    await sequelize.close();
  } catch (error) {
    await maildev.stop();
    stopCluster(pgBin, cluster.dataDir);
    throw error;
  }

  project.provide('pgPort', port);
  project.provide('smtpUrl', `smtp://127.0.0.1:${maildev.smtpPort}`);
  project.provide('maildevApi', maildev.apiUrl);

  return async () => {
    await maildev.stop();
    stopCluster(pgBin, cluster.dataDir);
    rmSync(root, { recursive: true, force: true });
  };
}
