/**
 * Counts the SQL statements sent while a request runs: every pg client of the process (Sequelize's
 * pool, the plain pool of sessions and hot reads, the job queue) goes through pg.Client#query.
 */
import pg from 'pg';

const originalQuery = pg.Client.prototype.query;
let recording: { statements: string[]; named: string[] } | null = null;

/** Wraps pg's query once per test file; statements are recorded only inside `statementsOf`. */
export function countStatements() {
  pg.Client.prototype.query = function (this: pg.Client, ...args: unknown[]) {
    const first = args[0] as string | { text?: string; name?: string } | undefined;
    recording?.statements.push(typeof first === 'string' ? first : (first?.text ?? String(first)));
    if (typeof first === 'object' && first.name) recording?.named.push(first.name);
    return (originalQuery as (...a: unknown[]) => unknown).apply(this, args);
  } as typeof pg.Client.prototype.query;
  return () => {
    pg.Client.prototype.query = originalQuery;
  };
}

/** The statements sent while `run` ran, one string each, and the names of those sent as named statements. */
export async function statementsOf<T>(run: () => Promise<T>): Promise<{ result: T; statements: string[]; named: string[] }> {
  const sent = { statements: [] as string[], named: [] as string[] };
  recording = sent;
  try {
    return { result: await run(), ...sent };
  } finally {
    recording = null;
  }
}
