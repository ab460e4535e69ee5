/**
 * A pooled connection outlives a lull: its statements' plans live and die with it, and the measuring
 * read alone takes 17–24 ms to plan, so closing idle connections after pg's default 10 s made the
 * first requests after every quiet spell plan everything again (server/db/pool.ts).
 */
import type pg from 'pg';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { createPool, IDLE_CONNECTION_MS } from '../../server/db/pool';
import { createSequelize } from '../../server/db/sequelize';
import { createLogger } from '../../server/logger';
import { createTestDatabase } from '../helpers/test-app';

const logger = createLogger({ LOG_LEVEL: 'silent', NODE_ENV: 'test' });
const named = { name: 'idle_probe', text: 'SELECT pg_backend_pid() AS pid', values: [] };

let pool: pg.Pool | undefined;
afterEach(async () => {
  vi.useRealTimers();
  await pool?.end();
  pool = undefined;
});

describe('idle connections of the app’s pools', () => {
  it('keeps a connection and its prepared statements through a quiet minute, and closes it after the idle time', async () => {
    pool = createPool(await createTestDatabase(), logger, 2);
    // Only the pool's idle timer is faked; the connection's own I/O runs as usual.
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout'] });
    const before = await pool.query<{ pid: number }>(named);

    vi.advanceTimersByTime(60_000);
    expect(pool.idleCount).toBe(1);
    const after = await pool.query<{ pid: number }>(named);
    const prepared = await pool.query(`SELECT 1 FROM pg_prepared_statements WHERE name = 'idle_probe'`);

    expect(after.rows[0]!.pid).toBe(before.rows[0]!.pid);
    expect(prepared.rowCount).toBe(1);

    vi.advanceTimersByTime(IDLE_CONNECTION_MS + 1_000);
    expect(pool.totalCount).toBe(0);
  });

  it('gives Sequelize’s pool the same idle time', async () => {
    const sequelize = createSequelize(await createTestDatabase());
    try {
      expect(sequelize.config.pool).toMatchObject({ idle: IDLE_CONNECTION_MS });
    } finally {
      await sequelize.close();
    }
  });
});
