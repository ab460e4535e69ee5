import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { move, myBlocks, receiveAndMeasure, sewingSwap, type Roles } from './swaps-support';

let app: TestApp;
let roles: Roles;
beforeAll(async () => {
  app = await createTestApp();
  roles = await guildWithRoles(app);
});
afterAll(() => app.close());

describe('a block’s life', () => {
  it('goes sewn → handed in (posted) → received → measured, with times and events', async () => {
    const { swap } = await sewingSwap(app, roles, { pledges: [2, 1] });
    const events: string[] = [];
    app.deps.events.onAny((name) => void events.push(name));
    const [block] = await myBlocks(roles.member.agent, swap.id);

    const sewn = await roles.member.agent.post(`/api/blocks/${block!.id}/sewn`).expect(200);
    expect(sewn.body).toMatchObject({ state: 'sewn', maker: { id: roles.member.id }, photos: [] });
    expect(sewn.body.times.sewn).toEqual(expect.any(String));
    const handed = await roles.member.agent
      .post(`/api/blocks/${block!.id}/handed-in`)
      .send({ how: 'post', note: 'Tracked letter, ref 55-102' })
      .expect(200);
    expect(handed.body).toMatchObject({ state: 'handed_in', handIn: { how: 'post', note: 'Tracked letter, ref 55-102' } });

    await move(roles.coordinator.agent, swap.id, 'collecting');
    const received = await roles.coordinator.agent.post(`/api/blocks/${block!.id}/received`).send({}).expect(200);
    expect(received.body.state).toBe('received');
    const late = await roles.member.agent.post(`/api/blocks/${block!.id}/handed-in`).send({ how: 'in-person' }).expect(409);
    expect(late.body.error.code).toBe('already_received');

    const measured = await roles.coordinator.agent
      .post(`/api/blocks/${block!.id}/measurements`)
      .send({ width: '9 1/2', height: '9½"' })
      .expect(201);
    expect(measured.body).toMatchObject({
      verdict: 'true',
      source: 'ruler',
      deviations: { width: 0, height: 0 },
      block: { state: 'measured', verdict: 'true', accepted: true },
    });
    expect(events).toEqual([
      'block.changed',
      'block.changed',
      'swap.transitioned',
      'block.changed',
      'block.measured',
      'block.changed',
    ]);
  });

  it('recomputes the verdict on the server and keeps the history', async () => {
    const { swap } = await sewingSwap(app, roles, { pledges: [4, 1] });
    await move(roles.coordinator.agent, swap.id, 'collecting');
    const blocks = await myBlocks(roles.member.agent, swap.id);
    // Target 9½″ ± ⅛″, diagonals within ¼″ (the swap's settings).
    const short = await receiveAndMeasure(roles.coordinator.agent, blocks[0]!.id, { width: 9.25, height: 9.5, verdict: 'true' });
    expect(short).toMatchObject({ verdict: 'short', deviations: { width: -0.25, height: 0 } });
    // Exactly at target − tolerance is within tolerance (8⅜ against 8½ ± ⅛ in the engine's own words).
    const edge = await receiveAndMeasure(roles.coordinator.agent, blocks[1]!.id, { width: '9 3/8', height: '9 5/8' });
    expect(edge.verdict).toBe('true');
    const trim = await receiveAndMeasure(roles.coordinator.agent, blocks[2]!.id, { width: '9 7/8', height: 9.5 });
    expect(trim.verdict).toBe('trim');
    // 13.43″ vs 13.75″ diagonals: 0.32″ apart, over the ¼″ limit.
    const skewed = await receiveAndMeasure(roles.coordinator.agent, blocks[3]!.id, {
      width: 9.5,
      height: 9.5,
      diagonals: ['13.43', '13.75'],
    });
    expect(skewed).toMatchObject({ verdict: 'skewed', deviations: { diagonal: -0.32 } });
    const metric = await roles.coordinator.agent
      .post(`/api/blocks/${blocks[0]!.id}/measurements`)
      .send({ width: '241.3 mm', height: '24.13 cm' })
      .expect(201);
    // 241.3 mm = 9.5″ exactly (25.4 mm to the inch, NIST SP 811).
    expect(metric.body).toMatchObject({ verdict: 'true', width: 9.5, height: 9.5 });

    const history = await roles.member.agent.get(`/api/blocks/${blocks[0]!.id}/measurements`).expect(200);
    expect(history.body.map((m: { verdict: string }) => m.verdict)).toEqual(['true', 'short']);
    const block = await roles.member.agent.get(`/api/blocks/${blocks[0]!.id}`).expect(200);
    expect(block.body).toMatchObject({ verdict: 'true', latest: { ruler: { verdict: 'true' }, maker: null } });
  });

  it('counts a trim block once it is trimmed', async () => {
    const { swap } = await sewingSwap(app, roles, { pledges: [2, 1] });
    await move(roles.coordinator.agent, swap.id, 'collecting');
    const [a, b] = await myBlocks(roles.member.agent, swap.id);
    await receiveAndMeasure(roles.coordinator.agent, a!.id, { width: 10, height: 10 });
    await receiveAndMeasure(roles.coordinator.agent, b!.id, { width: 9.5, height: 9.5 });
    const refused = await roles.coordinator.agent.post(`/api/blocks/${b!.id}/trimmed`).expect(409);
    expect(refused.body.error.code).toBe('not_trim');
    const trimmed = await roles.coordinator.agent.post(`/api/blocks/${a!.id}/trimmed`).expect(200);
    expect(trimmed.body).toMatchObject({ verdict: 'trim', trimmed: true, accepted: true });
    const roster = await roles.coordinator.agent.get(`/api/swaps/${swap.id}/roster`).expect(200);
    expect(roster.body.rows.find((r: { userId: number }) => r.userId === roles.member.id)).toMatchObject({
      accepted: 2,
      verdicts: { true: 1, trim: 1 },
    });
  });

  it('keeps the maker’s own measurement apart from the ruler', async () => {
    const { swap } = await sewingSwap(app, roles, { pledges: [1, 1] });
    const [block] = await myBlocks(roles.member.agent, swap.id);
    const own = await roles.member.agent
      .post(`/api/blocks/${block!.id}/measurements`)
      .send({ width: '9 1/4', height: '9 1/2' })
      .expect(201);
    expect(own.body).toMatchObject({ source: 'maker', verdict: 'short', block: { state: 'pledged', verdict: null } });
    const ruler = await roles.member.agent
      .post(`/api/blocks/${block!.id}/measurements`)
      .send({ width: 9.5, height: 9.5, source: 'ruler' })
      .expect(403);
    expect(ruler.body.error.message).toMatch(/coordinator or admin/);
    const notReceived = await roles.coordinator.agent
      .post(`/api/blocks/${block!.id}/measurements`)
      .send({ width: 9.5, height: 9.5 })
      .expect(409);
    expect(notReceived.body.error.code).toBe('not_received');
    const got = await roles.member.agent.get(`/api/blocks/${block!.id}`).expect(200);
    expect(got.body.latest).toMatchObject({ ruler: null, maker: { verdict: 'short', measuredBy: { id: roles.member.id } } });
  });
});

describe('bad bodies', () => {
  it('answers 400 with the field’s message and records nothing', async () => {
    const { swap } = await sewingSwap(app, roles, { pledges: [1, 1] });
    await move(roles.coordinator.agent, swap.id, 'collecting');
    const [block] = await myBlocks(roles.member.agent, swap.id);
    await roles.coordinator.agent.post(`/api/blocks/${block!.id}/received`).send({}).expect(200);
    const cases: [Record<string, unknown>, string, RegExp][] = [
      [{ width: '9 1/2 in', height: 'nine' }, 'height', /not a length we can read/],
      [{ width: '9 3/0', height: 9.5 }, 'width', /divides by zero/],
      [{ width: -9.5, height: 9.5 }, 'width', /negative/],
      [{ width: 0, height: 9.5 }, 'width', /more than zero/],
      [{ width: 900, height: 9.5 }, 'width', /at most 120/],
      [{ height: 9.5 }, 'width', /./],
      [{ width: 9.5, height: 9.5, diagonals: [13.4] }, 'diagonals', /./],
      [{ width: 9.5, height: 9.5, clientId: 'not-a-uuid' }, 'clientId', /UUID/],
    ];
    for (const [body, field, message] of cases) {
      const res = await roles.coordinator.agent.post(`/api/blocks/${block!.id}/measurements`).send(body).expect(400);
      expect(res.body.error.fields[field], JSON.stringify(body)).toMatch(message);
    }
    await roles.member.agent.post(`/api/blocks/${block!.id}/handed-in`).send({ how: 'pigeon' }).expect(400);
    await roles.coordinator.agent.post('/api/blocks/not-a-number/received').send({}).expect(400);
    const history = await roles.coordinator.agent.get(`/api/blocks/${block!.id}/measurements`).expect(200);
    expect(history.body).toEqual([]);
    const after = await roles.coordinator.agent.get(`/api/blocks/${block!.id}`).expect(200);
    expect(after.body).toMatchObject({ state: 'received', verdict: null });
  });
});

describe('clientId idempotency', () => {
  it('records a repeated measurement or receipt once and answers with the first result', async () => {
    const { swap } = await sewingSwap(app, roles, { pledges: [2, 1] });
    await move(roles.coordinator.agent, swap.id, 'collecting');
    const [a, b] = await myBlocks(roles.member.agent, swap.id);
    const receiptId = randomUUID();
    const first = await roles.coordinator.agent.post(`/api/blocks/${a!.id}/received`).send({ clientId: receiptId }).expect(200);
    const again = await roles.coordinator.agent.post(`/api/blocks/${a!.id}/received`).send({ clientId: receiptId }).expect(200);
    expect(again.headers['idempotent-replay']).toBe('true');
    expect(again.body).toEqual(first.body);

    const clientId = randomUUID();
    const body = { width: '9 5/8', height: 9.5, clientId };
    const m1 = await roles.coordinator.agent.post(`/api/blocks/${a!.id}/measurements`).send(body).expect(201);
    // The same request again, even concurrently, records nothing new.
    const [m2, m3] = await Promise.all([
      roles.coordinator.agent.post(`/api/blocks/${a!.id}/measurements`).send(body),
      roles.coordinator.agent.post(`/api/blocks/${a!.id}/measurements`).send({ ...body, width: 12 }),
    ]);
    expect(m2.status).toBe(201);
    expect(m2.body).toEqual(m1.body);
    expect(m3.body.id).toBe(m1.body.id);
    const history = await roles.coordinator.agent.get(`/api/blocks/${a!.id}/measurements`).expect(200);
    expect(history.body).toHaveLength(1);

    const reused = await roles.coordinator.agent
      .post(`/api/blocks/${b!.id}/measurements`)
      .send({ width: 9.5, height: 9.5, clientId })
      .expect(409);
    expect(reused.body.error.code).toBe('client_id_reused');
  });

  it('answers a late repeat as the first time, even after the block has moved on', async () => {
    const { swap } = await sewingSwap(app, roles, { pledges: [1, 1] });
    const [block] = await myBlocks(roles.member.agent, swap.id);
    const receiptId = randomUUID();
    const first = await roles.coordinator.agent
      .post(`/api/blocks/${block!.id}/received`)
      .send({ clientId: receiptId })
      .expect(200);
    await roles.coordinator.agent.post(`/api/blocks/${block!.id}/measurements`).send({ width: 9.5, height: 9.5 }).expect(201);
    // An offline station resends its receipt after the block was measured: the stored answer, no 409.
    const late = await roles.coordinator.agent
      .post(`/api/blocks/${block!.id}/received`)
      .send({ clientId: receiptId })
      .expect(200);
    expect(late.headers['idempotent-replay']).toBe('true');
    expect(late.body).toEqual(first.body);
    const now = await roles.coordinator.agent.get(`/api/blocks/${block!.id}`).expect(200);
    expect(now.body.state).toBe('measured');
  });

  it('lets a failed request be retried with the same clientId', async () => {
    const { swap } = await sewingSwap(app, roles, { pledges: [1, 1] });
    const [block] = await myBlocks(roles.member.agent, swap.id);
    const clientId = randomUUID();
    // Not received yet: refused, and nothing kept under that clientId.
    await roles.coordinator.agent
      .post(`/api/blocks/${block!.id}/measurements`)
      .send({ width: 9.5, height: 9.5, clientId })
      .expect(409);
    await roles.coordinator.agent.post(`/api/blocks/${block!.id}/received`).send({}).expect(200);
    const ok = await roles.coordinator.agent
      .post(`/api/blocks/${block!.id}/measurements`)
      .send({ width: 9.5, height: 9.5, clientId })
      .expect(201);
    expect(ok.headers['idempotent-replay']).toBeUndefined();
  });
});
