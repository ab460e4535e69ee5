import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import pg from 'pg';
import { Server } from 'socket.io';
import { liveAdapter } from '../../server/live/live-adapter';
import { createTestDatabase } from '../helpers/test-app';
import { pause } from './live-helpers';

/**
 * The PostgreSQL adapter, as the app sets it up (server/live/live-adapter.ts), keeps a message too large
 * for NOTIFY (8,000 bytes or more) in socket_io_attachments and notifies only its id. Its notice did not name the namespace, so the sending node failed to recognise
 * its own message and read the payload back and decoded it, only to drop it: a read on the shared pool
 * for every large board change. patches/@socket.io+postgres-adapter+0.5.0.patch (applied by npm's
 * postinstall) adds the namespace; these checks fail without it.
 */
const ATTACHMENT_READ = /SELECT payload FROM socket_io_attachments/;

interface AdapterNode {
  io: Server;
  pool: pg.Pool;
  /** the statements this node's adapter sent through its pool */
  statements: string[];
  /** what the adapter reported failing */
  errors: Error[];
}

function adapterNode(databaseUrl: string): AdapterNode {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 4 });
  const statements: string[] = [];
  const query = pool.query.bind(pool) as (...args: unknown[]) => unknown;
  // Records each statement the adapter sends, then runs it as usual.
  (pool as unknown as { query: (...args: unknown[]) => unknown }).query = (...args: unknown[]) => {
    statements.push(typeof args[0] === 'string' ? args[0] : String((args[0] as { text?: string }).text));
    return query(...args);
  };
  const errors: Error[] = [];
  const io = new Server({ adapter: liveAdapter(pool, (err) => errors.push(err)) });
  return { io, pool, statements, errors };
}

let a: AdapterNode;
let b: AdapterNode;

beforeAll(async () => {
  const databaseUrl = await createTestDatabase();
  a = adapterNode(databaseUrl);
  b = adapterNode(databaseUrl);
  // Each adapter LISTENs on a connection of its own shortly after it starts.
  await pause(500);
});
afterAll(async () => {
  for (const node of [a, b]) {
    if (!node) continue;
    // No HTTP server to close: the adapter releases its LISTEN connection, then the pool ends.
    await node.io.of('/').adapter.close();
    await node.pool.end();
  }
});

describe('the PostgreSQL adapter and messages too large for NOTIFY', () => {
  it('delivers a 20 KB message to the other node, and the sender never reads its own back', async () => {
    const rows = Array.from({ length: 400 }, (_, i) => ({ userId: i + 1, blocks: ['received', 'measured', 'accepted'] }));
    expect(JSON.stringify(rows).length).toBeGreaterThan(8_000);
    const arrived = new Promise<unknown>((resolve) => b.io.on('large:test', resolve));
    a.statements.length = 0;
    b.statements.length = 0;

    a.io.serverSideEmit('large:test', { rows });
    expect(await arrived).toEqual({ rows });
    // The sender stored the payload; the receiver read it; the sender's own notice was recognised.
    await pause(300);
    expect(a.statements.some((s) => s.includes('INSERT INTO socket_io_attachments'))).toBe(true);
    expect(b.statements.filter((s) => ATTACHMENT_READ.test(s))).toHaveLength(1);
    expect(a.statements.filter((s) => ATTACHMENT_READ.test(s))).toEqual([]);
  });

  it('delivers a message of exactly 8,000 bytes, which NOTIFY refuses, through the attachments table', async () => {
    // The adapter's inline payload is the message's JSON: measured with a first message sent inline,
    // then a filler made longer by what it lacks.
    const notified = () => a.statements.filter((s) => s.startsWith('SELECT pg_notify')).length;
    const inline = new Promise((resolve) => b.io.once('exact:probe', resolve));
    a.statements.length = 0;
    let payloadBytes = 0;
    const query = a.pool.query.bind(a.pool) as (...args: unknown[]) => unknown;
    (a.pool as unknown as { query: (...args: unknown[]) => unknown }).query = (...args: unknown[]) => {
      const values = args[1] as unknown[] | undefined;
      if (String(args[0]).startsWith('SELECT pg_notify') && typeof values?.[1] === 'string')
        payloadBytes = Buffer.byteLength(values[1]);
      return query(...args);
    };
    a.io.serverSideEmit('exact:probe', { filler: 'x'.repeat(1_000) });
    await inline;
    expect(notified()).toBe(1);
    const filler = 'x'.repeat(1_000 + 8_000 - payloadBytes);

    const arrived = new Promise<unknown>((resolve) => b.io.once('exact:probe', resolve));
    a.statements.length = 0;
    a.io.serverSideEmit('exact:probe', { filler });
    // Sent inline, it would fail (a.errors: "payload string too long") and never arrive.
    expect(await Promise.race([arrived, pause(3_000).then(() => 'not arrived')])).toEqual({ filler });
    expect(a.statements.some((s) => s.includes('INSERT INTO socket_io_attachments'))).toBe(true);
    expect(a.errors).toEqual([]);
  });
});
