/**
 * Hand-written statements run as named (prepared) statements, on a transaction's own connection or on
 * the plain pool. PostgreSQL then plans each once per connection instead of on every request: on the measurement
 * path, planning the block's locked read, its step and its answer's related rows cost more database
 * time than running them (pg_stat_statements under the API bench, docs/benchmarks.md).
 */
import { createHash } from 'node:crypto';
import type pg from 'pg';
import type { Transaction } from 'sequelize';
import type { TripStatement, TripValue } from './one-trip';

interface Statement {
  name: string;
  /** the SQL with `$name` placeholders numbered `$1…` in order of first use */
  text: string;
  params: string[];
}

// One entry per distinct SQL text; the hot paths build a handful of them.
const statements = new Map<string, Statement>();

function statementFor(sql: string): Statement {
  let statement = statements.get(sql);
  if (!statement) {
    const params: string[] = [];
    const text = sql.replace(/\$([a-z_]\w*)/gi, (_match, param: string) => {
      const at = params.indexOf(param);
      return `$${(at < 0 ? params.push(param) : at + 1).toString()}`;
    });
    // Named after the text, so one name never stands for two statements on a connection.
    statement = { name: `bp_${createHash('sha1').update(sql).digest('hex').slice(0, 24)}`, text, params };
    statements.set(sql, statement);
  }
  return statement;
}

/** Runs `sql` (with `$name` parameters from `bind`) as a named statement on the transaction's own connection. */
export async function transactionQuery<T extends object>(
  transaction: Transaction,
  sql: string,
  bind: Record<string, unknown>,
): Promise<T[]> {
  const { name, text, params } = statementFor(sql);
  // Sequelize keeps the transaction's pg client on it; it parses column types as Sequelize's queries do.
  const { connection } = transaction as unknown as { connection: pg.ClientBase };
  const result = await connection.query<T>({ name, text, values: params.map((param) => bind[param]) });
  return result.rows;
}

/**
 * Runs `sql` (with `$name` parameters from `bind`) as a named statement either way: on the transaction's
 * own connection inside one, on the plain pool outside one.
 */
export function preparedQuery<T extends object>(
  pool: pg.Pool,
  sql: string,
  bind: Record<string, unknown>,
  transaction?: Transaction,
): Promise<T[]> {
  return transaction ? transactionQuery<T>(transaction, sql, bind) : preparedPoolQuery<T>(pool, sql, bind);
}

/**
 * Runs `sql` (with `$name` parameters from `bind`) as a named statement on the plain pool, for a hot
 * statement that needs no transaction of its own (one statement is atomic by itself).
 */
export async function preparedPoolQuery<T extends object>(
  pool: pg.Pool,
  sql: string,
  bind: Record<string, unknown>,
): Promise<T[]> {
  const { name, text, params } = statementFor(sql);
  const result = await pool.query<T>({ name, text, values: params.map((param) => bind[param]) });
  return result.rows;
}

/**
 * `sql` (with `$name` parameters from `bind`) as one statement of `oneTripTransaction`. Its name has a
 * prefix of its own: a statement PREPAREd in SQL and one parsed by pg's client share a connection's
 * names, and the two must never meet.
 */
export function tripStatement(sql: string, bind: Record<string, TripValue>): TripStatement {
  const { name, text, params } = statementFor(sql);
  return { name: `trip_${name}`, text, values: params.map((param) => bind[param] ?? null) };
}
