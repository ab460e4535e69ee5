import pg from 'pg';
import type { Logger } from '../logger';

/**
 * Every connection's setting: a named statement is planned once, for any parameters (a generic plan),
 * instead of again on each execution. Only our named statements are affected (the hot reads and the
 * block changes' statements, all looking rows up by key); PostgreSQL's default kept re-planning the
 * roster (0.8 ms a request, more than half its run time) because its plan's estimated cost varies with
 * the swap. Unnamed statements, such as Sequelize's own, are planned for their values as before.
 */
export const NAMED_STATEMENTS_PLANNED_ONCE = '-c plan_cache_mode=force_generic_plan';

/**
 * How long an idle connection is kept. A connection's plans go with it, and the measuring read alone
 * takes 17–24 ms to plan: with pg's default of 10 s, every lull that long (between an intake desk's
 * rushes) closed the pool and the next requests planned every statement again on new connections.
 * An idle connection costs PostgreSQL a few megabytes, at most the pool's size of them. A plan made
 * while a table was tiny (a scan) stays with the connection until an ANALYZE of the table, autovacuum's
 * once a tenth of it has changed, has every connection plan the statement again.
 */
export const IDLE_CONNECTION_MS = 5 * 60_000;

/**
 * The plain pg pool for sessions, the socket.io adapter and the job queue. Every client gets an error
 * listener: a client held for LISTEN is not idle, so without one a database restart would throw an
 * unhandled 'error' event and take the process down instead of letting it reconnect.
 */
export function createPool(connection: string | pg.PoolConfig, logger: Logger, max = 10): pg.Pool {
  const pool = new pg.Pool({
    ...(typeof connection === 'string' ? { connectionString: connection } : connection),
    max,
    idleTimeoutMillis: IDLE_CONNECTION_MS,
    options: NAMED_STATEMENTS_PLANNED_ONCE,
  });
  pool.on('error', (err) => logger.warn({ err }, 'idle database connection failed'));
  pool.on('connect', (client) => {
    client.on('error', (err) => logger.warn({ err }, 'database connection failed'));
  });
  return pool;
}
