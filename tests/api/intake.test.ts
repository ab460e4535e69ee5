import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fromBase64Url, toBase64Url } from '../../shared/block-reference';
import type { IntakePackDto, LabelSheetDataDto } from '../../shared/schemas/intake';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { createSwap, move, sewingSwap, type Roles } from './swaps-support';

let app: TestApp;
let roles: Roles;
let swapId: number;
let pack: IntakePackDto;

beforeAll(async () => {
  app = await createTestApp();
  roles = await guildWithRoles(app);
  const { swap } = await sewingSwap(app, roles, { pledges: [3, 2, 1] });
  swapId = swap.id;
  await move(roles.coordinator.agent, swapId, 'collecting');
  pack = (await roles.coordinator.agent.get(`/api/swaps/${swapId}/intake`).expect(200)).body;
});
afterAll(() => app.close());

const resolve = (agent: Roles['coordinator']['agent'], body: Record<string, unknown>) =>
  agent.post('/api/intake/resolve').send(body);

describe('the intake pack', () => {
  it('lists every block with its target, numbering per maker and codes', () => {
    expect(pack.swap).toMatchObject({
      id: swapId,
      unfinished: { width: 9.5, height: 9.5 },
      tolerance: 0.125,
      squareness: 0.25,
      state: 'collecting',
    });
    expect(pack.blocks).toHaveLength(6);
    const member = pack.blocks.filter((b) => b.maker.id === roles.member.id);
    expect(member.map((b) => [b.ordinal, b.of])).toEqual([
      [1, 3],
      [2, 3],
      [3, 3],
    ]);
    expect(new Set(pack.blocks.map((b) => b.shortCode)).size).toBe(6);
  });

  it('is for officers only', async () => {
    await roles.admin.agent.get(`/api/swaps/${swapId}/intake`).expect(200);
    const member = await roles.member.agent.get(`/api/swaps/${swapId}/intake`).expect(403);
    expect(member.body.error.message).toMatch(/coordinators/);
    await roles.stranger.agent.get(`/api/swaps/${swapId}/intake`).expect(404);
    await app.agent().get(`/api/swaps/${swapId}/intake`).expect(401);
  });
});

describe('resolving a label', () => {
  it('finds the block from the scanned reference or the typed short code', async () => {
    const block = pack.blocks[1]!;
    const scanned = await resolve(roles.coordinator.agent, { swapId, reference: block.reference }).expect(200);
    expect(scanned.body).toMatchObject({
      via: 'reference',
      block: { id: block.id, ordinal: block.ordinal, maker: { id: block.maker.id } },
    });
    expect(scanned.body.block.reference).toBeUndefined();
    const typed = `${block.shortCode.slice(0, 4)}-${block.shortCode.slice(4)}`.toLowerCase();
    const byCode = await resolve(roles.coordinator.agent, { swapId, shortCode: typed }).expect(200);
    expect(byCode.body).toMatchObject({ via: 'shortCode', block: { id: block.id } });
  });

  it('refuses a tampered reference, a made-up one, and an unknown short code, in plain words', async () => {
    const bytes = fromBase64Url(pack.blocks[0]!.reference)!;
    bytes[bytes.length - 1]! ^= 0x80;
    const tampered = await resolve(roles.coordinator.agent, { swapId, reference: toBase64Url(bytes) }).expect(400);
    expect(tampered.body.error).toMatchObject({ code: 'label_not_valid', message: expect.stringMatching(/does not check out/) });
    // The real block id with a made-up tag: a guessed id does not make a label.
    const guessed = Uint8Array.from([...bytes.slice(0, -16), ...new Uint8Array(16)]);
    await resolve(roles.coordinator.agent, { swapId, reference: toBase64Url(guessed) }).expect(400);
    const junk = await resolve(roles.coordinator.agent, { swapId, reference: 'not a label at all' }).expect(400);
    expect(junk.body.error.code).toBe('not_a_label');
    const unknown = await resolve(roles.coordinator.agent, { swapId, shortCode: 'ZZZZ-ZZZZ' }).expect(404);
    expect(unknown.body.error).toMatchObject({ code: 'unknown_code', message: expect.stringContaining('ZZZZ-ZZZZ') });
  });

  it('refuses a label of another swap of the guild, naming it', async () => {
    const other = await createSwap(roles.coordinator.agent, roles.guildId, { title: 'Autumn Geese' });
    await move(roles.coordinator.agent, other.id, 'signup');
    await roles.member.agent.post(`/api/swaps/${other.id}/signups`).send({ blocks: 1 }).expect(200);
    const labels: LabelSheetDataDto = (await roles.member.agent.get(`/api/swaps/${other.id}/labels`).expect(200)).body;
    const res = await resolve(roles.coordinator.agent, { swapId, reference: labels.labels[0]!.reference }).expect(409);
    expect(res.body.error).toMatchObject({ code: 'other_swap', message: expect.stringContaining('“Autumn Geese”') });
  });

  it('refuses a label of another guild, without naming that guild’s swap', async () => {
    const guilds = (await roles.stranger.agent.get('/api/guilds').expect(200)).body as { id: number }[];
    const theirs = await createSwap(roles.stranger.agent, guilds[0]!.id, { title: 'Private Stars' });
    await move(roles.stranger.agent, theirs.id, 'signup');
    await roles.stranger.agent.post(`/api/swaps/${theirs.id}/signups`).send({ blocks: 1 }).expect(200);
    const labels: LabelSheetDataDto = (await roles.stranger.agent.get(`/api/swaps/${theirs.id}/labels`).expect(200)).body;
    const res = await resolve(roles.coordinator.agent, { swapId, reference: labels.labels[0]!.reference }).expect(409);
    expect(res.body.error.code).toBe('other_swap');
    expect(res.body.error.message).not.toContain('Private Stars');
    // …and that guild's swap is not theirs to run intake on.
    await resolve(roles.coordinator.agent, { swapId: theirs.id, reference: labels.labels[0]!.reference }).expect(404);
  });

  it('is for officers only, and checks its body', async () => {
    const body = { swapId, reference: pack.blocks[0]!.reference };
    await resolve(roles.member.agent, body).expect(403);
    await resolve(roles.stranger.agent, body).expect(404);
    const both = await resolve(roles.coordinator.agent, { swapId, reference: 'x', shortCode: 'y' }).expect(400);
    expect(both.body.error).toMatchObject({ code: 'validation', fields: { reference: expect.stringMatching(/either/) } });
    const none = await resolve(roles.coordinator.agent, { reference: pack.blocks[0]!.reference }).expect(400);
    expect(none.body.error.fields).toHaveProperty('swapId');
  });
});

describe('received and measured with a clientId, sent twice', () => {
  it('records one change and one measurement, and answers the repeat with the first answer', async () => {
    const block = pack.blocks.find((b) => b.maker.id === roles.coordinator.id)!;
    const found = (await resolve(roles.coordinator.agent, { swapId, shortCode: block.shortCode }).expect(200)).body.block;

    const receiveId = randomUUID();
    const first = await roles.coordinator.agent
      .post(`/api/blocks/${found.id}/received`)
      .send({ clientId: receiveId })
      .expect(200);
    const again = await roles.coordinator.agent
      .post(`/api/blocks/${found.id}/received`)
      .send({ clientId: receiveId })
      .expect(200);
    expect(again.headers['idempotent-replay']).toBe('true');
    expect(again.body).toEqual(first.body);
    expect(first.body.state).toBe('received');

    const measureId = randomUUID();
    const size = { width: '9 5/8', height: '9½', clientId: measureId };
    const m1 = await roles.coordinator.agent.post(`/api/blocks/${found.id}/measurements`).send(size).expect(201);
    const m2 = await roles.coordinator.agent.post(`/api/blocks/${found.id}/measurements`).send(size).expect(201);
    expect(m2.body).toEqual(m1.body);
    expect(m1.body).toMatchObject({ verdict: 'true', block: { state: 'measured' } });
    const history = await roles.coordinator.agent.get(`/api/blocks/${found.id}/measurements`).expect(200);
    expect(history.body).toHaveLength(1);

    // The pack now shows the block measured, for the next device that opens intake.
    const fresh: IntakePackDto = (await roles.coordinator.agent.get(`/api/swaps/${swapId}/intake`).expect(200)).body;
    expect(fresh.blocks.find((b) => b.id === found.id)).toMatchObject({ state: 'measured', verdict: 'true' });
  });
});
