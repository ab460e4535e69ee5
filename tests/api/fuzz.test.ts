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
  const day = await g.admin.agent
    .post(`/api/guilds/${g.guildId}/sew-days`)
    .send({ title: 'Fuzz day', startsAt: '2027-05-01T10:00', endsAt: '2027-05-01T12:00', place: 'Hall' })
    .expect(201);
  const room = await g.admin.agent.get(`/api/swaps/${swap.id}/chat`).expect(200);
  Object.assign(ids, {
    guildId: g.guildId,
    swapId: swap.id,
    blockId: blocks[0]!.id,
    sewDayId: day.body.id,
    roomId: room.body.id ?? room.body.room?.id,
    userId: g.member.id,
  });
  const msg = await g.admin.agent.post(`/api/chat/rooms/${ids.roomId}/messages`).send({ body: 'fuzz target' });
  ids.messageId = msg.body.id;
  const { rows } = await app.deps.pool.query<{ table_name: string }>(
    `SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE' ORDER BY table_name`,
  );
  fingerprintSql = rows
    .filter((r) => !UNTRACKED.has(r.table_name))
    .map(
      (r) =>
        `SELECT '${r.table_name}' AS t, md5(coalesce(string_agg(x::text, ',' ORDER BY x::text), '')) AS h FROM "${r.table_name}" x`,
    )
    .join(' UNION ALL ');
}, 60_000);
afterAll(() => app.close());

async function fingerprint() {
  const { rows } = await app.deps.pool.query<{ t: string; h: string }>(fingerprintSql);
  return Object.fromEntries(rows.map((r) => [r.t, r.h]));
}

const keys = [
  'title',
  'name',
  'email',
  'role',
  'blocks',
  'width',
  'height',
  'diagonals',
  'to',
  'body',
  'answer',
  'how',
  'note',
  'transfers',
  'startsAt',
  'endsAt',
  'place',
  'block',
  'tolerance',
  'squareness',
  'quota',
  'units',
  'displayName',
  'password',
  'token',
  'swapId',
  'shortCode',
  'clientId',
  'reference',
  'timeZone',
  'colourRules',
  'mode',
  'reminders',
  'photoId',
  'corners',
  'size',
  'kind',
  'columns',
  'rows',
  '__proto__',
  'constructor',
];
const lengthish = fc.oneof(
  fc.double({ noNaN: false }),
  fc.constantFrom('8 1/2', '8½', '-1', '8 1/0', '1e309', '216 mm', '', 'abc', '0'),
);
const body = fc.oneof(
  fc.jsonValue(),
  fc.dictionary(fc.constantFrom(...keys), fc.oneof(fc.jsonValue(), lengthish), { maxKeys: 6 }),
  fc.dictionary(
    fc.constantFrom(...keys),
    fc.oneof(fc.string({ maxLength: 5000 }), fc.integer(), fc.array(fc.integer(), { maxLength: 3 })),
    { maxKeys: 6 },
  ),
);

it('never answers 5xx and never writes anything for a refused body', async () => {
  const routes = listRoutes(app.app).filter(
    (r) => r.path.startsWith('/api') && ['POST', 'PATCH', 'PUT'].includes(r.method) && r.path !== '/api/auth/logout',
  );
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
        if (res.status >= 500)
          failures.push(`${route.method} ${route.path} ${res.status} for ${JSON.stringify(payload).slice(0, 200)}`);
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

// Long runs of each kind of character the length reader accepts, ending in one it does not: before the
// linear reader and the 40-character bound, 10,000 dots and a "!" took the old pattern half a second,
// and the time grew with the cube of the length.
const pathological: Record<string, string> = {
  dots: `${'.'.repeat(100_000)}!`,
  digits: `${'9'.repeat(100_000)}!`,
  spaces: `8${' '.repeat(100_000)}!`,
  hyphens: `8${'-'.repeat(100_000)}!`,
  commas: `8${','.repeat(100_000)}!`,
  nestedFractions: `1${'/2'.repeat(50_000)}`,
  mixedNumbers: `${'8 1/2 '.repeat(16_000)}!`,
  unitWords: `8 ${'in.'.repeat(30_000)}`,
  vulgarFractions: '½'.repeat(50_000),
  superscripts: `³${'⁄₁₆'.repeat(20_000)}`,
  dotsThenUnit: `${'.'.repeat(100_000)}in.!`,
};

/** Every body field that reaches the length reader or another pattern, as a route and a body builder. */
const parserFields: { route: string; path: () => string; body: (text: string) => unknown; method?: 'post' | 'patch' }[] = [
  {
    route: 'measurement width',
    path: () => `/api/blocks/${ids.blockId}/measurements`,
    body: (t) => ({ width: t, height: '9 1/2' }),
  },
  {
    route: 'measurement height',
    path: () => `/api/blocks/${ids.blockId}/measurements`,
    body: (t) => ({ width: '9 1/2', height: t }),
  },
  {
    route: 'measurement diagonal',
    path: () => `/api/blocks/${ids.blockId}/measurements`,
    body: (t) => ({ width: '9 1/2', height: '9 1/2', diagonals: [t, '13 7/16'] }),
  },
  { route: 'swap tolerance', path: () => `/api/swaps/${ids.swapId}`, method: 'patch', body: (t) => ({ tolerance: t }) },
  { route: 'swap squareness', path: () => `/api/swaps/${ids.swapId}`, method: 'patch', body: (t) => ({ squareness: t }) },
  {
    route: 'grid column',
    path: () => `/api/guilds/${ids.guildId}/swaps`,
    body: (t) => ({ title: 'Fuzz', block: { kind: 'grid', columns: [t], rows: [3.5], seam: 0.25 } }),
  },
  {
    route: 'seam allowance',
    path: () => `/api/guilds/${ids.guildId}/swaps`,
    body: (t) => ({ title: 'Fuzz', block: { kind: 'grid', columns: [3.5], rows: [3.5], seam: t } }),
  },
  {
    route: 'unit finished size',
    path: () => `/api/guilds/${ids.guildId}/swaps`,
    body: (t) => ({ title: 'Fuzz', block: { kind: 'hst', finished: t } }),
  },
  {
    route: 'photo reference size',
    path: () => `/api/blocks/${ids.blockId}/photo-estimates`,
    body: (t) => ({ reference: { size: t } }),
  },
  {
    route: 'sew day start',
    path: () => `/api/guilds/${ids.guildId}/sew-days`,
    body: (t) => ({ title: 'Fuzz day', startsAt: t, endsAt: '2027-05-01T12:00', place: 'Hall' }),
  },
  {
    route: 'sew day video link',
    path: () => `/api/guilds/${ids.guildId}/sew-days`,
    body: (t) => ({ title: 'Fuzz day', startsAt: '2027-05-01T10:00', endsAt: '2027-05-01T12:00', videoUrl: `https://${t}` }),
  },
  { route: 'guild time zone', path: () => `/api/guilds/${ids.guildId}`, method: 'patch', body: (t) => ({ timeZone: t }) },
  {
    route: 'invitation e-mail',
    path: () => `/api/guilds/${ids.guildId}/invitations`,
    body: (t) => ({ email: `${t}@example.test` }),
  },
  { route: 'intake short code', path: () => '/api/intake/resolve', body: (t) => ({ swapId: ids.swapId, shortCode: t }) },
];

it('refuses pathological text on every field that reaches a parser, while health answers alongside', async () => {
  const problems: string[] = [];
  for (const field of parserFields) {
    for (const [kind, text] of Object.entries(pathological)) {
      const send = g.admin.agent[field.method ?? 'post'](field.path())
        .set('Content-Type', 'application/json')
        .send(JSON.stringify(field.body(text)));
      const [res, health] = await Promise.all([send, app.agent().get('/api/health')]);
      if (res.status !== 400) problems.push(`${field.route} / ${kind}: ${res.status} ${JSON.stringify(res.body).slice(0, 160)}`);
      if (health.status !== 200) problems.push(`${field.route} / ${kind}: health answered ${health.status}`);
    }
  }
  expect(problems).toEqual([]);
}, 120_000);
