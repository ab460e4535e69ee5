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
});
