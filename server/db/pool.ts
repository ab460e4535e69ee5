import pg from 'pg';
import type { Logger } from '../logger';

/**
 * The plain pg pool for sessions, the socket.io adapter and the job queue. Every client gets an error
 * listener: a client held for LISTEN is not idle, so without one a database restart would throw an
 * unhandled 'error' event and take the process down instead of letting it reconnect.
 */
export function createPool(connection: string | pg.PoolConfig, logger: Logger, max = 10): pg.Pool {
  const pool = new pg.Pool({ ...(typeof connection === 'string' ? { connectionString: connection } : connection), max });
  pool.on('error', (err) => logger.warn({ err }, 'idle database connection failed'));
  pool.on('connect', (client) => {
    client.on('error', (err) => logger.warn({ err }, 'database connection failed'));
  });
  return pool;
}
