/**
 * Builds the real app on a fresh database cloned from the migrated template, for one test file.
 * Sequelize models are bound per process, and vitest runs each file in its own worker.
 */
import { randomBytes } from 'node:crypto';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { inject } from 'vitest';
import supertest from 'supertest';
import { loadConfig, type Config } from '../../server/config';
import { createLogger } from '../../server/logger';
import { createSequelize } from '../../server/db/sequelize';
import { createPool } from '../../server/db/pool';
import { initModels } from '../../server/db/models';
import { createMailer } from '../../server/mail/mailer';
import { createApp, type BuiltApp } from '../../server/app';
import { DomainEvents } from '../../server/events';
import type { AppDeps } from '../../server/deps';
import { clusterUrl, ensureDatabase } from '../../scripts/lib/postgres';

export const TEMPLATE_DB = 'blockpost_template';

export interface TestApp extends BuiltApp {
  deps: AppDeps;
  databaseUrl: string;
  /** A supertest agent keeping its own cookies and sending the CSRF header. */
  agent(): ReturnType<typeof supertest.agent>;
  close(): Promise<void>;
}

export async function createTestDatabase(): Promise<string> {
  const port = inject('pgPort');
  const name = `t_${randomBytes(6).toString('hex')}`;
  await ensureDatabase(port, name, TEMPLATE_DB);
  return clusterUrl(port, name);
}

export function testConfig(databaseUrl: string, overrides: Partial<Record<string, string>> = {}): Config {
  return loadConfig({
    NODE_ENV: 'test',
    DATABASE_URL: databaseUrl,
    SESSION_SECRET: 'test-secret-test-secret',
    SMTP_URL: inject('smtpUrl'),
    PUBLIC_URL: 'http://127.0.0.1:3000',
    UPLOAD_DIR: mkdtempSync(join(tmpdir(), 'blockpost-uploads-')),
    LOG_LEVEL: 'silent',
    SERVE_CLIENT: 'false',
    JOBS: 'false',
    // Every test signs up from 127.0.0.1: the per-client limits are tested with their own low values.
    REGISTER_RATE_LIMIT: '100000',
    LOGIN_IP_RATE_LIMIT: '100000',
    INVITES_PER_INVITER_DAY: '100000',
    INVITES_PER_GUILD_DAY: '100000',
    ...overrides,
  });
}

export async function createTestApp(overrides: Partial<Record<string, string>> = {}): Promise<TestApp> {
  const databaseUrl = await createTestDatabase();
  const config = testConfig(databaseUrl, overrides);
  const logger = createLogger(config);
  const sequelize = createSequelize(databaseUrl);
  initModels(sequelize);
  const pool = createPool(databaseUrl, logger, 5);
  const deps: AppDeps = { config, logger, sequelize, pool, mailer: createMailer(config), events: new DomainEvents() };
  const built = createApp(deps);
  return {
    ...built,
    deps,
    databaseUrl,
    agent: () => supertest.agent(built.app).set('X-Requested-With', 'blockpost'),
    async close() {
      deps.mailer.close();
      await pool.end();
      await sequelize.close();
    },
  };
}
