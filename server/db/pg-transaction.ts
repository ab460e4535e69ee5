/** A transaction on one connection of a plain pg pool, for work done with pg rather than Sequelize. */
import type pg from 'pg';

/**
 * Runs `work` between BEGIN and COMMIT on a connection of `pool`; any error rolls it back and is
 * rethrown. A connection that cannot even roll back is closed instead of going back to the pool.
 */
export async function withPgTransaction<T>(pool: pg.Pool, work: (client: pg.PoolClient) => Promise<T>): Promise<T> {
  const client = await pool.connect();
  let broken: Error | undefined;
  try {
    await client.query('BEGIN');
    const result = await work(client);
    await client.query('COMMIT');
    return result;
  } catch (error) {
    await client.query('ROLLBACK').catch((rollbackError: Error) => (broken = rollbackError));
    throw error;
  } finally {
    client.release(broken);
  }
}
