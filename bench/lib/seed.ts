/**
 * Benchmark data, made through the running app where the path matters (the coordinator, the guild,
 * the swaps and their moves) and written straight into PostgreSQL where only volume matters (the
 * members, their pledges and blocks, and the half of the blocks already measured).
 */
import { withClient } from '../../scripts/lib/postgres';
import { normaliseEmail } from '../../shared/schemas/auth';
import { hashPassword } from '../../server/auth/passwords';

const DAY = 86_400_000;
export const BENCH_PASSWORD = 'bench-password-1';

export interface Session {
  cookie: string;
  userId: number;
  api<T>(method: string, path: string, body?: unknown): Promise<T>;
}

let benchHash: Promise<string> | undefined;

/**
 * Writes a confirmed account straight into the database, as opening a sign-up link would: sign-up
 * goes through a mailed link, which a benchmark has no mailbox for. Returns the account's id.
 */
export async function createAccount(databaseUrl: string, email: string, displayName: string): Promise<number> {
  benchHash ??= hashPassword(BENCH_PASSWORD);
  return withClient(databaseUrl, async (client) => {
    const { rows } = await client.query<{ id: number }>(
      `INSERT INTO users (email, display_name, password_hash, created_at, updated_at) VALUES ($1, $2, $3, now(), now()) RETURNING id`,
      [normaliseEmail(email), displayName, await benchHash],
    );
    return rows[0]!.id;
  });
}

/** A new confirmed account, signed in on the app at `baseUrl`. */
export async function newAccount(baseUrl: string, databaseUrl: string, email: string, displayName: string): Promise<Session> {
  await createAccount(databaseUrl, email, displayName);
  return signIn(baseUrl, email);
}

/** Signs a person in on the app at `baseUrl`; returns their session cookie and an API caller. */
export async function signIn(baseUrl: string, email: string): Promise<Session> {
  const res = await fetch(`${baseUrl}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-requested-with': 'blockpost' },
    body: JSON.stringify({ email, password: BENCH_PASSWORD }),
  });
  if (!res.ok) throw new Error(`sign-in answered ${res.status}: ${await res.text()}`);
  const cookie = res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  const { user } = (await res.json()) as { user: { id: number } };
  const api = async <T>(method: string, path: string, body?: unknown): Promise<T> => {
    const r = await fetch(`${baseUrl}/api${path}`, {
      method,
      headers: { cookie, 'x-requested-with': 'blockpost', 'content-type': 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    if (r.status >= 400) throw new Error(`${method} ${path} answered ${r.status}: ${await r.text()}`);
    return (await r.json()) as T;
  };
  return { cookie, userId: user.id, api };
}

export interface SeededSwap {
  swapId: number;
  members: number;
  blocksEach: number;
  /** ids of the blocks already received and measured (the first half), ready for more measurements */
  measuredBlockIds: number[];
  /** ids of the blocks not received yet */
  pledgedBlockIds: number[];
}

/**
 * A swap in `collecting` with `members` makers of `blocksEach` blocks, the first half of its blocks
 * received and measured, in the guild `guildId` of which `coordinator` is an officer.
 */
export async function seedSwap(
  databaseUrl: string,
  coordinator: Session,
  guildId: number,
  size: { members: number; blocksEach: number; tag: string },
): Promise<SeededSwap> {
  const swap = await coordinator.api<{ id: number }>('POST', `/guilds/${guildId}/swaps`, {
    title: `Bench Nine-Patch ${size.tag}`,
    block: { kind: 'grid', columns: [3.5, 3.5, 3.5], rows: [3.5, 3.5, 3.5], seam: 0.25 },
    tolerance: '1/8',
    squareness: '1/4',
    colourRules: [{ role: 'light', note: 'any cream' }],
    quota: { min: 1, max: 6 },
    signupClosesAt: new Date(Date.now() + 10 * DAY).toISOString(),
    dueAt: new Date(Date.now() + 40 * DAY).toISOString(),
    mode: 'return',
  });
  await coordinator.api('POST', `/swaps/${swap.id}/transitions`, { to: 'signup' });
  return withClient(databaseUrl, async (client) => {
    // Every member signs in with the coordinator's password hash: the bench never signs them in.
    await client.query(
      `WITH members AS (
         INSERT INTO users (email, display_name, password_hash, units, created_at, updated_at)
         SELECT 'bench-' || $2 || '-' || g || '@example.test', 'Bench Maker ' || $2 || ' ' || lpad(g::text, 3, '0'),
                (SELECT password_hash FROM users WHERE id = $4), 'in', now(), now()
           FROM generate_series(1, $3::int) g RETURNING id),
       joined AS (INSERT INTO memberships (user_id, guild_id, role, status, created_at, updated_at)
                  SELECT id, $5, 'member', 'active', now(), now() FROM members),
       pledged AS (INSERT INTO signups (swap_id, user_id, blocks, status, created_at, updated_at)
                   SELECT $1, id, $6, 'active', now(), now() FROM members)
       INSERT INTO blocks (swap_id, maker_id, sequence, state, trimmed, created_at, updated_at)
       SELECT $1, m.id, seq, 'pledged', false, now(), now() FROM members m, generate_series(1, $6::int) seq`,
      [swap.id, size.tag, size.members, coordinator.userId, guildId, size.blocksEach],
    );
    await coordinator.api('POST', `/swaps/${swap.id}/transitions`, { to: 'sewing' });
    await coordinator.api('POST', `/swaps/${swap.id}/transitions`, { to: 'collecting' });
    const { rows } = await client.query<{ id: number }>('SELECT id FROM blocks WHERE swap_id = $1 ORDER BY id', [swap.id]);
    const ids = rows.map((r) => r.id);
    const half = ids.slice(0, Math.floor(ids.length / 2));
    // Measured blocks carry a mix of verdicts, as a meeting night's intake would.
    await client.query(
      `WITH done AS (
         UPDATE blocks SET state = 'measured', received_at = now(), received_by_id = $2, measured_at = now(), updated_at = now(),
                verdict = (ARRAY['true', 'trim', 'true', 'short'])[1 + id % 4]
          WHERE id = ANY($1::int[]) RETURNING id, verdict)
       INSERT INTO measurements (block_id, measured_by_id, source, width, height, verdict, deviation_width, deviation_height, created_at, updated_at)
       SELECT id, $2, 'ruler', 11, 11, verdict, 0, 0, now(), now() FROM done`,
      [half, coordinator.userId],
    );
    // A live database has statistics on its tables; freshly bulk-loaded ones have none until autovacuum runs.
    await client.query('ANALYZE');
    return {
      swapId: swap.id,
      members: size.members,
      blocksEach: size.blocksEach,
      measuredBlockIds: half,
      pledgedBlockIds: ids.slice(half.length),
    };
  });
}

/** The guild's history: a swap of 600 members × 6 blocks, half of them measured. */
export const HISTORY_SIZE = { members: 600, blocksEach: 6, tag: '600x6' };

/**
 * Seeds the guild's history beside the swap a benchmark loads, so the tables are a live database's
 * size. The app plans each named statement once per connection and keeps its connections: planned on
 * tables of a few pages, the measuring read scans blocks and measurements, slower with every row the
 * load adds until autovacuum's analyze has it planned again (1.05 ms a read in the burst against 0.27).
 */
export async function seedHistory(databaseUrl: string, coordinator: Session, guildId: number): Promise<SeededSwap> {
  return seedSwap(databaseUrl, coordinator, guildId, HISTORY_SIZE);
}
