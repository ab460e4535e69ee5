/**
 * A transaction of prepared statements in one message (server/db/one-trip.ts), as the board fan-out
 * sends each change: answers in order, prepares once per connection, is all-or-nothing, and reads
 * after a lock with a fresh snapshot.
 */
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { oneTripRead, oneTripTransaction } from '../../server/db/one-trip';
import { createTestDatabase } from '../helpers/test-app';

let pool: pg.Pool;
let other: pg.Pool;

beforeAll(async () => {
  const url = await createTestDatabase();
  pool = new pg.Pool({ connectionString: url, max: 1 });
  other = new pg.Pool({ connectionString: url, max: 1 });
  await pool.query('CREATE TABLE trip_counter (id int PRIMARY KEY, n int NOT NULL)');
  await pool.query('CREATE TABLE trip_note (id int PRIMARY KEY, body text NOT NULL)');
  await pool.query(`INSERT INTO trip_counter VALUES (1, 0); INSERT INTO trip_note VALUES (1, 'before')`);
});
afterAll(async () => {
  await pool?.end();
  await other?.end();
});

const bump = { name: 'trip_bump', text: 'UPDATE trip_counter SET n = n + 1 WHERE id = $1 RETURNING n', values: [1] };
const readNote = { name: 'trip_read', text: 'SELECT body FROM trip_note WHERE id = $1', values: [1] };

describe('one round trip for a short transaction', () => {
  it('answers each statement’s rows in order, and prepares a statement once per connection', async () => {
    const first = await oneTripTransaction(pool, [bump, readNote]);
    expect(first).toEqual([[{ n: 1 }], [{ body: 'before' }]]);
    const second = await oneTripTransaction(pool, [bump, readNote]);
    expect(second[0]).toEqual([{ n: 2 }]);
    const { rows } = await pool.query(`SELECT name FROM pg_prepared_statements WHERE name LIKE 'trip_%' ORDER BY name`);
    expect(rows.map((r: { name: string }) => r.name)).toEqual(['trip_bump', 'trip_read']);
  });

  it('writes every value as a literal that reads back the same, quotes and backslashes included', async () => {
    const awkward = `O'Brien's "seam" \\ ripper; DROP TABLE trip_note; --`;
    const at = new Date('2026-04-11T10:00:00.000Z');
    const [answered] = await oneTripTransaction(pool, [
      {
        name: 'trip_echo',
        text: 'SELECT $1::text AS t, $2::timestamptz AS at, $3::int[] AS ids, $4::int AS nothing, $5::numeric AS n',
        values: [awkward, at, [3, 1, 2], null, 8.5],
      },
    ]);
    expect(answered).toEqual([{ t: awkward, at, ids: [3, 1, 2], nothing: null, n: '8.5' }]);
    expect((await pool.query('SELECT count(*)::int AS c FROM trip_note')).rows[0].c).toBe(1);
  });

  it('keeps nothing when one statement fails, and the pool goes on with a fresh connection', async () => {
    const before = (await pool.query('SELECT n FROM trip_counter WHERE id = 1')).rows[0].n as number;
    const duplicate = { name: 'trip_dup', text: 'INSERT INTO trip_note VALUES ($1, $2)', values: [1, 'again'] };
    await expect(oneTripTransaction(pool, [bump, duplicate])).rejects.toMatchObject({ code: '23505' });
    expect((await pool.query('SELECT n FROM trip_counter WHERE id = 1')).rows[0].n).toBe(before);
    // The failed connection was closed: the next one prepares its statements again and works.
    expect((await oneTripTransaction(pool, [bump]))[0]).toEqual([{ n: before + 1 }]);
  });

  it('reads what another transaction committed while it waited for the lock its first statement takes', async () => {
    // Another transaction holds the counter's row and changes the note; it commits while we wait.
    const holder = await other.connect();
    await holder.query('BEGIN');
    await holder.query('UPDATE trip_counter SET n = n + 100 WHERE id = 1');
    await holder.query(`UPDATE trip_note SET body = 'after' WHERE id = 1`);
    const trip = oneTripTransaction(pool, [bump, readNote]);
    await new Promise((r) => setTimeout(r, 200));
    await holder.query('COMMIT');
    holder.release();
    const [counted, note] = await trip;
    expect(note).toEqual([{ body: 'after' }]);
    expect((counted![0] as { n: number }).n).toBeGreaterThan(100);
  });

  it('reads in one message without BEGIN or COMMIT, and the message is still all or nothing', async () => {
    const [counter, note] = await oneTripRead(pool, [
      { name: 'trip_read_counter', text: 'SELECT n FROM trip_counter WHERE id = $1', values: [1] },
      readNote,
    ]);
    expect(note).toEqual([{ body: expect.any(String) }]);
    const before = (counter as { n: number }[])[0]!.n;
    // PostgreSQL runs the statements of one message as one implicit transaction.
    await expect(
      oneTripRead(pool, [bump, { name: 'trip_fail', text: 'SELECT 1 / ($1::int - 1)', values: [1] }]),
    ).rejects.toMatchObject({ code: '22012' });
    const { rows } = await other.query<{ n: number }>('SELECT n FROM trip_counter WHERE id = 1');
    expect(rows[0]!.n).toBe(before);
  });
});
