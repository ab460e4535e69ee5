/** A short transaction of prepared statements sent to PostgreSQL in one message. */
import type pg from 'pg';

/** What a statement's parameters may be: each is written as an SQL literal, quoted by pg's client. */
export type TripValue = number | string | Date | number[] | null;

export interface TripStatement {
  /** its name as prepared on the connection (a plain SQL identifier) */
  name: string;
  /** numbered parameters ($1, $2 …), as for a named statement */
  text: string;
  values: TripValue[];
}

const IDENTIFIER = /^[a-z_][a-z0-9_]*$/;
const preparedOn = new WeakMap<pg.ClientBase, Set<string>>();

function literal(client: pg.ClientBase, value: TripValue): string {
  if (value === null) return 'NULL';
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new TypeError(`not a finite number: ${value}`);
    return String(value);
  }
  if (value instanceof Date) return client.escapeLiteral(value.toISOString());
  if (Array.isArray(value)) {
    if (!value.every(Number.isInteger)) throw new TypeError('only arrays of integers are written as literals');
    return client.escapeLiteral(`{${value.join(',')}}`);
  }
  return client.escapeLiteral(value);
}

/**
 * Runs `statements` as one transaction in a single round trip: BEGIN, each statement as an EXECUTE of
 * the same statement prepared on this connection (PREPAREd in that message the first time it meets
 * the connection), COMMIT. Each statement reads with its own snapshot, as in any READ COMMITTED
 * transaction, so rows locked by one are read as they now stand by the next. Answers each
 * statement's rows, in order. After an error the connection is closed rather than reused: its
 * transaction may be left aborted and its prepared statements half made.
 *
 * For a hot transaction whose statements do not depend on each other's answers (the board fan-out's
 * change): a round trip waits for a turn of a busy event loop, so five of them cost a change far more
 * than the database's work does.
 */
export function oneTripTransaction(pool: pg.Pool, statements: TripStatement[]): Promise<Record<string, unknown>[][]> {
  return oneTrip(pool, statements, true);
}

/**
 * Runs reads that do not depend on each other's answers in a single round trip, as `oneTripTransaction`
 * does but with no BEGIN and COMMIT: PostgreSQL runs the statements of one message as one implicit
 * transaction. For a read whose rows should come back as rows, beside another read (the roster with
 * the swap policy's row).
 */
export function oneTripRead(pool: pg.Pool, statements: TripStatement[]): Promise<Record<string, unknown>[][]> {
  return oneTrip(pool, statements, false);
}

async function oneTrip(pool: pg.Pool, statements: TripStatement[], transaction: boolean): Promise<Record<string, unknown>[][]> {
  for (const s of statements) if (!IDENTIFIER.test(s.name)) throw new TypeError(`not a statement name: ${s.name}`);
  const client = await pool.connect();
  let broken: Error | undefined;
  try {
    const prepared = preparedOn.get(client) ?? new Set<string>();
    const prepare = statements.filter((s) => !prepared.has(s.name)).map((s) => `PREPARE ${s.name} AS ${s.text}`);
    const execute = statements.map((s) =>
      s.values.length ? `EXECUTE ${s.name}(${s.values.map((v) => literal(client, v)).join(', ')})` : `EXECUTE ${s.name}`,
    );
    const sql = transaction ? [...prepare, 'BEGIN', ...execute, 'COMMIT'] : [...prepare, ...execute];
    // Several statements in one simple query come back as one result each.
    const answered = (await client.query(sql.join(';\n'))) as unknown as pg.QueryResult[] | pg.QueryResult;
    const results = Array.isArray(answered) ? answered : [answered];
    for (const s of statements) prepared.add(s.name);
    preparedOn.set(client, prepared);
    const first = prepare.length + (transaction ? 1 : 0); // after the PREPAREs (and BEGIN)
    return results.slice(first, first + statements.length).map((r) => r.rows as Record<string, unknown>[]);
  } catch (error) {
    broken = error instanceof Error ? error : new Error(String(error));
    throw error;
  } finally {
    client.release(broken);
  }
}
