/**
 * How many SQL round trips the hot requests make. Every statement any pg client sends (Sequelize's
 * pool, the session store's pool, the job queue) is counted while one request runs.
 */
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { countStatements, statementsOf } from '../helpers/sql-count';
import { myBlocks, sewingSwap, type Roles } from './swaps-support';
import { picture } from '../fixtures/photos';

let app: TestApp;
let roles: Roles;
const stopCounting = countStatements();

beforeAll(async () => {
  app = await createTestApp();
  roles = await guildWithRoles(app);
});

afterAll(async () => {
  stopCounting();
  await app.close();
});

const shown = (statements: string[]) => statements.map((s) => s.replace(/\s+/g, ' ').slice(0, 100)).join('\n');

describe('SQL round trips per request', () => {
  it('a ruler measurement with a clientId takes 3 round trips, with no transaction around them; 2 once its session is remembered', async () => {
    const { swap, makers } = await sewingSwap(app, roles, { pledges: [2, 2] });
    const [block] = await myBlocks(makers[0]!.agent, swap.id);
    await roles.coordinator.agent.post(`/api/blocks/${block!.id}/received`).send({}).expect(200);
    app.sessionCache.clear(); // the first request in a second reads its session
    const { result, statements } = await statementsOf(() =>
      roles.coordinator.agent
        .post(`/api/blocks/${block!.id}/measurements`)
        .send({ width: '8 1/2', height: '8 1/2', clientId: '0f9d8a0e-5d0c-4d8e-9a55-1d2f3c4b5a6e' }),
    );
    expect(result.status, JSON.stringify(result.body)).toBe(201);
    // The session with its user; the policy's read with the block's version, the measurement's id and the
    // answer's related rows; one statement writing the step, the measurement and the clientId's answer.
    expect(statements.length, shown(statements)).toBe(3);
    expect(
      statements.some((s) => /^(?:BEGIN|START TRANSACTION|COMMIT)/i.test(s.trim())),
      shown(statements),
    ).toBe(false);

    // The station's next measurement within the second: its session is not read again.
    const [, next] = await myBlocks(makers[0]!.agent, swap.id);
    await roles.coordinator.agent.post(`/api/blocks/${next!.id}/received`).send({}).expect(200);
    const again = await statementsOf(() =>
      roles.coordinator.agent.post(`/api/blocks/${next!.id}/measurements`).send({ width: '8 1/2', height: '8 1/2' }),
    );
    expect(again.result.status, JSON.stringify(again.result.body)).toBe(201);
    expect(again.statements.length, shown(again.statements)).toBe(2);
  });

  it('sends a measurement’s hot statements named, on connections that plan a named statement once', async () => {
    const { swap, makers } = await sewingSwap(app, roles, { pledges: [2] });
    const [block] = await myBlocks(makers[0]!.agent, swap.id);
    await roles.coordinator.agent.post(`/api/blocks/${block!.id}/received`).send({}).expect(200);
    app.sessionCache.clear();
    const { result, named } = await statementsOf(() =>
      roles.coordinator.agent.post(`/api/blocks/${block!.id}/measurements`).send({ width: '8 1/2', height: '8 1/2' }),
    );
    expect(result.status, JSON.stringify(result.body)).toBe(201);
    // The session with its user, the measurement's read and its write: all named, on the plain pool
    // (server/db/prepared.ts preparedPoolQuery).
    expect(named).toContain('session-with-user');
    expect(named.filter((name) => name.startsWith('bp_'))).toHaveLength(2);

    const { plan_cache_mode: poolMode } = (await app.deps.pool.query<{ plan_cache_mode: string }>('SHOW plan_cache_mode'))
      .rows[0]!;
    const [sequelizeRow] = await app.deps.sequelize.query<{ plan_cache_mode: string }>('SHOW plan_cache_mode', {
      type: QueryTypes.SELECT,
    });
    expect([poolMode, sequelizeRow!.plan_cache_mode]).toEqual(['force_generic_plan', 'force_generic_plan']);
  });

  it('a roster read takes 2 round trips: the session with its user, then the swap with its role and roster; 1 within the second', async () => {
    const { swap } = await sewingSwap(app, roles, { pledges: [2, 2] });
    app.sessionCache.clear();
    const { result, statements } = await statementsOf(() => roles.coordinator.agent.get(`/api/swaps/${swap.id}/roster`));
    expect(result.status).toBe(200);
    expect(statements.length, shown(statements)).toBe(2);
    // Read again within the second: one round trip, the session is remembered.
    const again = await statementsOf(() => roles.coordinator.agent.get(`/api/swaps/${swap.id}/roster`));
    expect(again.statements.length, shown(again.statements)).toBe(1);
  });

  it('a member’s roster and activity list read the guild’s verdict setting with the swap, not in a round trip of their own', async () => {
    const { swap } = await sewingSwap(app, roles, { pledges: [2, 2] });
    // Warm: the member's session is remembered, as for a board open on a phone.
    await roles.member.agent.get(`/api/swaps/${swap.id}/roster`).expect(200);
    const roster = await statementsOf(() => roles.member.agent.get(`/api/swaps/${swap.id}/roster`));
    expect(roster.result.status).toBe(200);
    expect(roster.statements.length, shown(roster.statements)).toBe(1);
    const activity = await statementsOf(() => roles.member.agent.get(`/api/swaps/${swap.id}/activity`));
    expect(activity.result.status).toBe(200);
    // The swap with the role and the setting, then the lines.
    expect(activity.statements.length, shown(activity.statements)).toBe(2);
    expect(
      activity.statements.some((s) => /FROM "guilds"/.test(s)),
      shown(activity.statements),
    ).toBe(false);
  });

  it('the session probe and /api/me answer the person and their guilds in one statement, as before', async () => {
    await roles.member.agent.get('/api/session').expect(200);
    for (const path of ['/api/session', '/api/me']) {
      const { result, statements } = await statementsOf(() => roles.member.agent.get(path));
      expect(result.status).toBe(200);
      expect(statements.length, shown(statements)).toBe(1);
      const me = result.body as { user: object; memberships: object[] };
      // Same fields in the same order as the answer built from the models before.
      expect(Object.keys(me)).toEqual(['user', 'memberships']);
      expect(Object.keys(me.user)).toEqual(['id', 'email', 'displayName', 'units', 'mailingAddress', 'unitsChosen']);
      expect(me.user).toMatchObject({ id: roles.member.id, email: roles.member.email, mailingAddress: null, unitsChosen: false });
      expect(me.memberships).toEqual([
        { guildId: roles.guildId, guildName: expect.any(String), role: 'member', defaultUnit: 'in' },
      ]);
      expect(Object.keys(me.memberships[0]!)).toEqual(['guildId', 'guildName', 'role', 'defaultUnit']);
    }
  });

  it('the home screen’s seven reads take one round trip once the session is remembered', async () => {
    await sewingSwap(app, roles, { pledges: [2, 2] });
    await roles.member.agent.get('/api/me/next').expect(200);
    const { result, statements } = await statementsOf(() => roles.member.agent.get('/api/me/next'));
    expect(result.status).toBe(200);
    expect((result.body as { blocksOwed: unknown[] }).blocksOwed.length).toBeGreaterThan(0);
    expect(statements.length, shown(statements)).toBe(1);
  });

  it('a member’s pages (guild, sew days, chat, photos, a block’s gallery and measurements, fees, dues, payments, mail choices, the design wall, a swap’s timeline) take one to three statements, all named', async () => {
    const { swap } = await sewingSwap(app, roles, { pledges: [2, 2] });
    const [block] = await myBlocks(roles.member.agent, swap.id);
    const upload = await roles.member.agent
      .post(`/api/blocks/${block!.id}/photos`)
      .attach('photos', await picture('png', 400, 400), { filename: 'block.png', contentType: 'image/png' })
      .expect(201);
    const photoId = (upload.body as { photos: { id: number }[] }).photos[0]!.id;
    const nextYear = new Date().getFullYear() + 1;
    const sewDay = await roles.coordinator.agent
      .post(`/api/guilds/${roles.guildId}/sew-days`)
      .send({
        title: 'Binding afternoon',
        startsAt: `${nextYear}-02-06T13:00`,
        endsAt: `${nextYear}-02-06T17:00`,
        place: 'Library annex',
      })
      .expect(201);
    await roles.member.agent.put(`/api/sew-days/${sewDay.body.id}/rsvp`).send({ answer: 'going' }).expect(200);
    const room = await roles.member.agent.get(`/api/swaps/${swap.id}/chat`).expect(200);
    await roles.member.agent
      .post(`/api/chat/rooms/${room.body.id}/messages`)
      .field('body', 'Cornerstones pressed toward the sashing')
      .attach('photos', await picture('png', 300, 200), { filename: 'pressing.png', contentType: 'image/png' })
      .expect(201);

    const reads: [path: string, check: (body: never) => boolean][] = [
      ['/api/guilds', (body: { memberCount: number }[]) => body.some((g) => g.memberCount === 3)],
      [`/api/guilds/${roles.guildId}`, (body: { memberCount: number }) => body.memberCount === 3],
      [`/api/guilds/${roles.guildId}/members`, (body: unknown[]) => body.length === 3],
      [
        `/api/guilds/${roles.guildId}/swaps`,
        (body: { id: number; myPledge: number }[]) => body.some((s) => s.id === swap.id && s.myPledge === 2),
      ],
      [
        `/api/guilds/${roles.guildId}/sew-days`,
        (body: { sewDays: { myRsvp: string; chatRoomId: number | null }[] }) =>
          body.sewDays.some((d) => d.myRsvp === 'going' && d.chatRoomId !== null),
      ],
      [`/api/sew-days/${sewDay.body.id}`, (body: { rsvps: unknown[] }) => body.rsvps.length === 1],
      [`/api/swaps/${swap.id}/chat`, (body: { id: number }) => body.id === room.body.id],
      [
        `/api/chat/rooms/${room.body.id}/messages`,
        (body: { messages: { photos: unknown[] }[] }) => body.messages[0]!.photos.length === 1,
      ],
      [`/api/photos/${photoId}?size=thumb`, () => true],
      [`/api/swaps/${swap.id}/transitions`, (body: { to: string }[]) => body.map((t) => t.to).join() === 'draft,signup,sewing'],
      [`/api/blocks/${block!.id}/photos`, (body: { id: number }[]) => body.length === 1 && body[0]!.id === photoId],
      [`/api/blocks/${block!.id}/measurements`, (body: unknown[]) => body.length === 0],
      [`/api/swaps/${swap.id}/fees`, (body: { mine: unknown[] }) => Array.isArray(body.mine)],
      [`/api/guilds/${roles.guildId}/dues`, (body: { mine: string }) => typeof body.mine === 'string'],
      ['/api/me/payments', (body: unknown[]) => Array.isArray(body)],
      [
        '/api/me/mail-preferences',
        (body: { email: string; categories: { enabled: boolean }[] }) =>
          body.email === roles.member.email && body.categories.every((c) => c.enabled),
      ],
      // The policy's row, then the placeable blocks and the saved layout side by side.
      [`/api/swaps/${swap.id}/design`, (body: { blocks: unknown[] }) => body.blocks.length === 2],
    ];
    // A swap's chat room that exists is read, never written: an insert that meets the room burns an id.
    const lastRoomId = async () =>
      (await app.deps.pool.query<{ last_value: string }>('SELECT last_value FROM chat_rooms_id_seq')).rows[0]!.last_value;
    const roomIdBefore = await lastRoomId();
    for (const [path, check] of reads) {
      await roles.member.agent.get(path).expect(200); // the session, then the statements, are ready
      const { result, statements, named } = await statementsOf(() => roles.member.agent.get(path));
      expect(result.status, path).toBe(200);
      expect(check(result.body as never), `${path}: ${JSON.stringify(result.body)}`).toBe(true);
      // The guild list, one's payments and mail choices need no policy, a photo and a swap's state changes are read with
      // it: one statement.
      // The others: the policy's row with the role, then the page (the design wall: its two reads at once).
      const oneTrip =
        path === '/api/guilds' || path.startsWith('/api/me/') || path.startsWith('/api/photos/') || path.endsWith('/transitions');
      expect(statements.length, `${path}\n${shown(statements)}`).toBe(oneTrip ? 1 : path.endsWith('/design') ? 3 : 2);
      // Named, or prepared statements executed in one message (oneTripRead): none planned anew.
      const prepared = statements.filter((sql) => /^\s*(?:PREPARE|EXECUTE) /.test(sql)).length;
      expect(named.length + prepared, `${path}: every statement named\n${shown(statements)}`).toBe(statements.length);
    }
    expect(await lastRoomId()).toBe(roomIdBefore);
  });

  it('a text message takes the room’s check and one round trip for the lock, the limit and the write', async () => {
    const { swap } = await sewingSwap(app, roles, { pledges: [2] });
    const room = await roles.member.agent.get(`/api/swaps/${swap.id}/chat`).expect(200);
    await roles.member.agent.post(`/api/chat/rooms/${room.body.id}/messages`).send({ body: 'Warming up the iron' }).expect(201);
    const { result, statements, named } = await statementsOf(() =>
      roles.member.agent.post(`/api/chat/rooms/${room.body.id}/messages`).send({ body: 'Pressing the seams open' }),
    );
    expect(result.status, JSON.stringify(result.body)).toBe(201);
    expect(statements.length, shown(statements)).toBe(2);
    // The room with the role, named; then BEGIN, the lock, the counted write and COMMIT in one message
    // (after their PREPAREs on a connection that meets them for the first time).
    expect(named).toHaveLength(1);
    expect(statements[1], shown(statements)).toMatch(
      /^(?:PREPARE trip_bp_\w+ AS [^;]*;\n)*BEGIN;\nEXECUTE trip_bp_\w+\(\d+\);\nEXECUTE trip_bp_\w+\(.*\);\nCOMMIT$/s,
    );
  });
});
