/**
 * A measurement's answer carries the block as it is after the measurement, built from one statement
 * that inserts the measurement, takes the block's step and reads the block's related rows; the new
 * measurement is put among the latest by hand (server/blocks/block-dto.ts withMeasurement). The
 * block in each answer must be exactly what reading the block afterwards gives.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { myBlocks, sewingSwap, type Roles } from './swaps-support';
import { readBlockForMeasurement, writeMeasurement } from '../../server/blocks/blocks.queries';

let app: TestApp;
let roles: Roles;
beforeAll(async () => {
  app = await createTestApp();
  roles = await guildWithRoles(app);
});
afterAll(() => app.close());

describe('the block in a measurement’s answer', () => {
  it('is the block as read afterwards, for the maker’s own and for ruler measurements, first and repeated', async () => {
    const { swap, makers } = await sewingSwap(app, roles, { pledges: [2, 2] });
    const maker = makers[0]!;
    const [block] = await myBlocks(maker.agent, swap.id);
    const officer = roles.coordinator.agent;
    const read = async (agent: typeof officer) => (await agent.get(`/api/blocks/${block!.id}`).expect(200)).body as unknown;
    const measure = async (agent: typeof officer, body: Record<string, unknown>) => {
      const res = await agent.post(`/api/blocks/${block!.id}/measurements`).send(body);
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      return res.body as { id: number; source: string; block: { latest: { ruler: unknown; maker: unknown }; state: string } };
    };

    // The maker's own measurement: no step, the block's latest maker measurement is the new one.
    const own = await measure(maker.agent, { width: '8 1/2', height: '8 3/8', source: 'maker' });
    expect(own.source).toBe('maker');
    expect(own.block).toEqual(await read(maker.agent));
    const { block: _ownBlock, ...ownMeasurement } = own;
    expect(own.block.latest.maker).toEqual(ownMeasurement);

    await officer.post(`/api/blocks/${block!.id}/received`).send({}).expect(200);
    // Ruler measurements, the second replacing the first's verdict; the maker's own stays beside them.
    for (const size of [
      { width: '8 1/4', height: '8 1/2' },
      { width: '8 1/2', height: '8 1/2', diagonals: ['12', '12 1/32'], note: 'pressed again' },
    ]) {
      const ruler = await measure(officer, size);
      expect(ruler.block.state).toBe('measured');
      expect(ruler.block).toEqual(await read(officer));
      const { block: _rulerBlock, ...rulerMeasurement } = ruler;
      expect(ruler.block.latest.ruler).toEqual(rulerMeasurement);
      expect(ruler.block.latest.maker).toEqual(ownMeasurement);
    }

    // Undo takes the last ruler measurement back: the block's latest ruler one is the first again.
    await officer.post(`/api/blocks/${block!.id}/undo`).send({}).expect(200);
    const afterUndo = (await read(officer)) as { latest: { ruler: { width: number } } };
    expect(afterUndo.latest.ruler.width).toBe(8.25);
  });

  it('with a clientId, sends as JSON the answer it stores, and a repeat gets the same answer', async () => {
    const { swap, makers } = await sewingSwap(app, roles, { pledges: [1, 1] });
    const maker = makers[0]!;
    const [block] = await myBlocks(maker.agent, swap.id);
    const body = { width: '8 1/2', height: '8 1/2', source: 'maker', clientId: '0b6f5d1e-2c3a-4b7e-9f10-a1b2c3d4e5f6' };
    const first = await maker.agent.post(`/api/blocks/${block!.id}/measurements`).send(body).expect(201);
    expect(first.headers['content-type']).toBe('application/json; charset=utf-8');
    // The answer is serialised once, for the stored copy and the reply (server/http/route.ts sendReply).
    const stored = await app.deps.pool.query<{ response: unknown }>('SELECT response FROM block_requests WHERE client_id = $1', [
      body.clientId,
    ]);
    expect(JSON.parse(first.text)).toEqual(stored.rows[0]!.response);
    const repeat = await maker.agent.post(`/api/blocks/${block!.id}/measurements`).send(body).expect(201);
    expect(repeat.body).toEqual(first.body);
  });

  it('records every one of several ruler measurements of one block sent at once, each with its step', async () => {
    const { swap, makers } = await sewingSwap(app, roles, { pledges: [1, 1] });
    const [block] = await myBlocks(makers[0]!.agent, swap.id);
    const officer = roles.coordinator.agent;
    await officer.post(`/api/blocks/${block!.id}/received`).send({}).expect(200);
    // Each write checks the block is still as its request read it; the ones that find it changed read again.
    const sizes = ['8 1/4', '8 3/8', '8 1/2', '8 5/8'];
    const answers = await Promise.all(
      sizes.map((width) => officer.post(`/api/blocks/${block!.id}/measurements`).send({ width, height: '8 1/2' })),
    );
    for (const res of answers) expect(res.status, JSON.stringify(res.body)).toBe(201);
    const history = (await officer.get(`/api/blocks/${block!.id}/measurements`).expect(200)).body as { id: number }[];
    expect(history.map((m) => m.id).sort()).toEqual(answers.map((a) => (a.body as { id: number }).id).sort());
    // The block's verdict is the newest one's, and each measurement left a step that Undo takes back in turn.
    const now = (await officer.get(`/api/blocks/${block!.id}`).expect(200)).body as { latest: { ruler: { id: number } } };
    expect(now.latest.ruler.id).toBe(history[0]!.id);
    for (let i = 0; i < sizes.length; i++) await officer.post(`/api/blocks/${block!.id}/undo`).send({}).expect(200);
    const back = (await officer.get(`/api/blocks/${block!.id}`).expect(200)).body as {
      state: string;
      latest: { ruler: unknown };
    };
    expect(back.state).toBe('received');
    expect(back.latest.ruler).toBeNull();
  });

  it('writes nothing when the block changed after it was read', async () => {
    const { swap, makers } = await sewingSwap(app, roles, { pledges: [1, 1] });
    const [block] = await myBlocks(makers[0]!.agent, swap.id);
    await roles.coordinator.agent.post(`/api/blocks/${block!.id}/received`).send({}).expect(200);
    const read = (await readBlockForMeasurement(app.deps.pool, block!.id, roles.coordinator.id))!;
    expect(read.role).toBe('coordinator');
    // Someone else changes the block between the read and the write.
    await app.deps.pool.query(`UPDATE blocks SET hand_in_note = 'moved to the second table' WHERE id = $1`, [block!.id]);
    const values = {
      blockId: block!.id,
      measuredById: roles.coordinator.id,
      source: 'ruler',
      width: 8.5,
      height: 8.5,
      diagonal1: null,
      diagonal2: null,
      verdict: 'true',
      deviationWidth: 0,
      deviationHeight: 0,
      deviationDiagonal: null,
      note: null,
      at: new Date(),
    };
    const step = { changes: { state: 'measured', verdict: 'true', measuredAt: values.at }, byId: roles.coordinator.id };
    const request = { clientId: '6f1c2b7e-3a4d-4e5f-8a9b-0c1d2e3f4a5b', action: 'measurement:ruler', responseJson: '{}' };
    expect(await writeMeasurement(app.deps.pool, read, values, step, request)).toBe(false);
    const counts = await app.deps.pool.query<{ measurements: number; steps: number; requests: number; state: string }>(
      `SELECT (SELECT count(*)::int FROM measurements WHERE block_id = $1) AS measurements,
              (SELECT count(*)::int FROM block_steps WHERE block_id = $1 AND action = 'measured') AS steps,
              (SELECT count(*)::int FROM block_requests WHERE client_id = $2) AS requests,
              (SELECT state FROM blocks WHERE id = $1) AS state`,
      [block!.id, request.clientId],
    );
    expect(counts.rows[0]).toEqual({ measurements: 0, steps: 0, requests: 0, state: 'received' });
    // Read again, the same write goes through.
    const again = (await readBlockForMeasurement(app.deps.pool, block!.id, roles.coordinator.id))!;
    expect(await writeMeasurement(app.deps.pool, again, values, step, request)).toBe(true);
  });
});
