/**
 * Counts the SQL statements sent while a request runs: every pg client of the process (Sequelize's
 * pool, the plain pool of sessions and hot reads, the job queue) goes through pg.Client#query.
 */
import pg from 'pg';

const originalQuery = pg.Client.prototype.query;
let recording: string[] | null = null;

/** Wraps pg's query once per test file; statements are recorded only inside `statementsOf`. */
export function countStatements() {
  pg.Client.prototype.query = function (this: pg.Client, ...args: unknown[]) {
    const first = args[0];
    recording?.push(typeof first === 'string' ? first : ((first as { text?: string } | undefined)?.text ?? String(first)));
    return (originalQuery as (...a: unknown[]) => unknown).apply(this, args);
  } as typeof pg.Client.prototype.query;
  return () => {
    pg.Client.prototype.query = originalQuery;
  };
}

/** The statements sent while `run` ran, one string each. */
export async function statementsOf<T>(run: () => Promise<T>): Promise<{ result: T; statements: string[] }> {
  const statements: string[] = [];
  recording = statements;
  try {
    return { result: await run(), statements };
  } finally {
    recording = null;
  }
}
