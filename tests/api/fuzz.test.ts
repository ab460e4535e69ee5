/**
 * Fuzzing the API's JSON bodies with fast-check: every state-changing route, read from the router,
 * gets arbitrary JSON and near-miss bodies. Never a 5xx, and a refused request writes nothing.
 */
import fc from 'fast-check';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { listRoutes } from '../../server/http/list-routes';
import { createSwap, move } from './swaps-support';

let app: TestApp;
let g: Awaited<ReturnType<typeof guildWithRoles>>;
const ids: Record<string, number | string> = {};

// Tables that legitimately change on any request, accepted or not: the session store (rolling expiry).
const UNTRACKED = new Set(['session', 'schema_migrations', 'socket_io_attachments']);
let fingerprintSql = '';

beforeAll(async () => {
  app = await createTestApp({ LOGIN_RATE_LIMIT: '100000' });
  g = await guildWithRoles(app);
  const swap = await createSwap(g.coordinator.agent, g.guildId);
  await move(g.coordinator.agent, swap.id, 'signup');
  await g.admin.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 2 }).expect(200);
  await move(g.coordinator.agent, swap.id, 'sewing');
  const blocks = (await g.admin.agent.get(`/api/swaps/${swap.id}/blocks?maker=me`).expect(200)).body as { id: number }[];
  const day = await g.admin.agent.post(`/api/guilds/${g.guildId}/sew-days`).send({ title: 'Fuzz day', startsAt: '2027-05-01T10:00', endsAt: '2027-05-01T12:00', place: 'Hall' }).expect(201);
  const room = await g.admin.agent.get(`/api/swaps/${swap.id}/chat`).expect(200);
  Object.assign(ids, { guildId: g.guildId, swapId: swap.id, blockId: blocks[0]!.id, sewDayId: day.body.id, roomId: room.body.id ?? room.body.room?.id, userId: g.member.id });
  const msg = await g.admin.agent.post(`/api/chat/rooms/${ids.roomId}/messages`).send({ body: 'fuzz target' });
  ids.messageId = msg.body.id;
  const { rows } = await app.deps.pool.query<{ table_name: string }>(
    `SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE' ORDER BY table_name`,
  );
  fingerprintSql = rows
    .filter((r) => !UNTRACKED.has(r.table_name))
    .map((r) => `SELECT '${r.table_name}' AS t, md5(coalesce(string_agg(x::text, ',' ORDER BY x::text), '')) AS h FROM "${r.table_name}" x`)
    .join(' UNION ALL ');
}, 60_000);
afterAll(() => app.close());

async function fingerprint() {
  const { rows } = await app.deps.pool.query<{ t: string; h: string }>(fingerprintSql);
  return Object.fromEntries(rows.map((r) => [r.t, r.h]));
}

const keys = ['title', 'name', 'email', 'role', 'blocks', 'width', 'height', 'diagonals', 'to', 'body', 'answer', 'how', 'note', 'transfers',
  'startsAt', 'endsAt', 'place', 'block', 'tolerance', 'squareness', 'quota', 'units', 'displayName', 'password', 'token', 'swapId',
  'shortCode', 'clientId', 'reference', 'timeZone', 'colourRules', 'mode', 'reminders', 'photoId', 'corners', 'size', 'kind', 'columns', 'rows', '__proto__', 'constructor'];
const lengthish = fc.oneof(fc.double({ noNaN: false }), fc.constantFrom('8 1/2', '8½', '-1', '8 1/0', '1e309', '216 mm', '', 'abc', '0'));
const body = fc.oneof(
  fc.jsonValue(),
  fc.dictionary(fc.constantFrom(...keys), fc.oneof(fc.jsonValue(), lengthish), { maxKeys: 6 }),
  fc.dictionary(fc.constantFrom(...keys), fc.oneof(fc.string({ maxLength: 5000 }), fc.integer(), fc.array(fc.integer(), { maxLength: 3 })), { maxKeys: 6 }),
);

it('never answers 5xx and never writes anything for a refused body', async () => {
  const routes = listRoutes(app.app).filter((r) => r.path.startsWith('/api') && ['POST', 'PATCH', 'PUT'].includes(r.method) && r.path !== '/api/auth/logout');
  expect(routes.length).toBeGreaterThan(30);
  const failures: string[] = [];
  let sent = 0;
  for (const route of routes) {
    const path = route.path.replace(/:(\w+)/g, (_m, name: string) => String(ids[name] ?? 1));
    const anonymous = route.path.startsWith('/api/auth/') || route.path.startsWith('/api/unsubscribe');
    await fc.assert(
      fc.asyncProperty(body, async (payload) => {
        const agent = anonymous ? app.agent() : g.admin.agent;
        const before = await fingerprint();
        const req = agent[route.method.toLowerCase() as 'post' | 'patch' | 'put'](path).set('Content-Type', 'application/json');
        const res = await req.send(JSON.stringify(payload));
        sent += 1;
        if (res.status >= 500) failures.push(`${route.method} ${route.path} ${res.status} for ${JSON.stringify(payload).slice(0, 200)}`);
        if (res.status >= 400) {
          const after = await fingerprint();
          const changed = Object.keys(after).filter((t) => after[t] !== before[t]);
          if (changed.length) failures.push(`${route.method} ${route.path} ${res.status} yet changed ${changed.join(', ')}`);
        }
        expect(res.headers['content-type'] ?? '').toMatch(/json/);
      }),
      { numRuns: 20, seed: 20261202 + sent },
    );
  }
  expect(failures).toEqual([]);
  expect(sent).toBe(routes.length * 20);
}, 240_000);
