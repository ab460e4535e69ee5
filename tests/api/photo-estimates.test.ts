import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Quad } from '@shared/quilt';
import type { PhotoEstimateDto, PhotoEstimatesDto } from '@shared/schemas/photo-estimates';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles, joinGuild } from '../helpers/factories';
import type { DomainEventName } from '../../server/events';
import { rectangle, scene, scenePhoto, type Scene } from '../fixtures/photo-measure-scene';
import { move, myBlocks, sewingSwap, type Roles } from './swaps-support';

type Agent = ReturnType<TestApp['agent']>;

let app: TestApp;
let roles: Roles;
let swapId: number;
let memberBlock: number;
let coordinatorBlock: number;
let photoId: number;
const events: { name: DomainEventName; payload: Record<string, unknown> }[] = [];

// A 9⅛″ × 9½″ block inside a 12″ square of the mat's grid: ⅜″ short of the 9½″ target.
const shortScene: Scene = scene({ referenceSize: 12, block: rectangle(1.25, 1.25, 9.125, 9.5, 2), camera: { target: [6, 6] } });
const bodyFor = (s: Scene, over: Record<string, unknown> = {}) => ({
  photoId,
  reference: { corners: s.image.reference, size: '12' },
  block: { corners: s.image.block },
  ...over,
});

async function uploadScene(agent: Agent, blockId: number, s: Scene): Promise<number> {
  const res = await agent
    .post(`/api/blocks/${blockId}/photos`)
    .attach('photos', await scenePhoto(s, 'jpeg'), 'on-the-mat.jpg')
    .expect(201);
  expect(res.body.photos[0]).toMatchObject({ width: s.width, height: s.height });
  return res.body.photos[0].id as number;
}

beforeAll(async () => {
  app = await createTestApp();
  roles = await guildWithRoles(app);
  const { swap } = await sewingSwap(app, roles, { pledges: [1, 1] });
  swapId = swap.id;
  memberBlock = (await myBlocks(roles.member.agent, swapId))[0]!.id;
  coordinatorBlock = (await myBlocks(roles.coordinator.agent, swapId))[0]!.id;
  photoId = await uploadScene(roles.member.agent, memberBlock, shortScene);
  app.deps.events.onAny((name, payload) => void events.push({ name, payload: payload as Record<string, unknown> }));
});
afterAll(() => app.close());

describe('saving a photo estimate', () => {
  it('works the size and verdict out on the server, stores the corners, and keeps the ruler verdict apart', async () => {
    // Numbers a client might send are ignored: the server measures from the corners itself.
    const res = await roles.member.agent
      .post(`/api/blocks/${memberBlock}/photo-estimates`)
      .send(bodyFor(shortScene, { verdict: 'true', width: 9.5, height: 9.5, expectedError: 0 }))
      .expect(201);
    const e = res.body as PhotoEstimateDto;
    expect(e.verdict).toBe('short');
    expect(Math.abs(e.width - 9.125)).toBeLessThan(1 / 64);
    expect(Math.abs(e.height - 9.5)).toBeLessThan(1 / 64);
    expect(e.expectedError).toBeGreaterThan(0);
    expect(e.reference).toEqual({ corners: shortScene.image.reference, size: 12 });
    expect(e.block.corners).toEqual(shortScene.image.block);
    expect(e).toMatchObject({ blockId: memberBlock, photoId, measuredBy: { id: roles.member.id } });

    const event = events.find((x) => x.name === 'block.estimated');
    expect(event?.payload).toMatchObject({
      swapId,
      guildId: roles.guildId,
      blockId: memberBlock,
      makerId: roles.member.id,
      estimateId: e.id,
      photoId,
      verdict: 'short',
    });

    const block = await roles.member.agent.get(`/api/blocks/${memberBlock}`).expect(200);
    expect(block.body.verdict).toBeNull();
    expect(block.body.state).toBe('sewn');
    expect(block.body.photoEstimate).toMatchObject({
      id: e.id,
      verdict: 'short',
      width: e.width,
      height: e.height,
      expectedError: e.expectedError,
    });

    const roster = await roles.member.agent.get(`/api/swaps/${swapId}/roster`).expect(200);
    const rows = roster.body.rows as { blocks: { id: number; verdict: string | null; photoEstimate: unknown }[] }[];
    const mine = rows.flatMap((r) => r.blocks).find((b) => b.id === memberBlock)!;
    expect(mine.verdict).toBeNull();
    expect(mine.photoEstimate).toMatchObject({ verdict: 'short', at: e.at });
    expect(roster.body.totals.verdicts.short).toBe(0);
  });

  it('lists the history newest first, with the block, its target and its photos', async () => {
    const again = await roles.member.agent
      .post(`/api/blocks/${memberBlock}/photo-estimates`)
      .send(bodyFor(shortScene, { reference: { corners: shortScene.image.reference, size: '304.8 mm' } }))
      .expect(201);
    const res = await roles.member.agent.get(`/api/blocks/${memberBlock}/photo-estimates`).expect(200);
    const list = res.body as PhotoEstimatesDto;
    expect(list.estimates[0]!.id).toBe(again.body.id);
    expect(list.estimates.length).toBeGreaterThanOrEqual(2);
    expect(list.estimates[0]!.reference.size).toBe(12);
    expect(list.swap).toMatchObject({ id: swapId, unfinished: { width: 9.5, height: 9.5 }, tolerance: 0.125, squareness: 0.25 });
    expect(list.block).toMatchObject({ id: memberBlock, swapId, guildId: roles.guildId, maker: { id: roles.member.id } });
    expect(list.photos).toEqual([
      { id: photoId, url: `/api/photos/${photoId}`, thumbUrl: `/api/photos/${photoId}?size=thumb`, width: 1600, height: 1200 },
    ]);
    expect(list.canEstimate).toBe(true);
  });
});

describe('who may measure from a photo', () => {
  it('lets the maker, a coordinator and an admin; refuses another member and a stranger', async () => {
    await roles.coordinator.agent.post(`/api/blocks/${memberBlock}/photo-estimates`).send(bodyFor(shortScene)).expect(201);
    await roles.admin.agent.post(`/api/blocks/${memberBlock}/photo-estimates`).send(bodyFor(shortScene)).expect(201);
    await roles.coordinator.agent.get(`/api/blocks/${memberBlock}/photo-estimates`).expect(200);

    const other = await joinGuild(app, roles.guildId, 'member');
    const refused = await other.agent.post(`/api/blocks/${memberBlock}/photo-estimates`).send(bodyFor(shortScene)).expect(403);
    expect(refused.body.error.message).toMatch(/Only the maker of this block or a coordinator/);
    await other.agent.get(`/api/blocks/${memberBlock}/photo-estimates`).expect(403);
    // The member may not measure the coordinator's block either.
    await roles.member.agent.post(`/api/blocks/${coordinatorBlock}/photo-estimates`).send(bodyFor(shortScene)).expect(403);

    const stranger = await roles.stranger.agent
      .post(`/api/blocks/${memberBlock}/photo-estimates`)
      .send(bodyFor(shortScene))
      .expect(404);
    expect(stranger.body.error.message).toBe('That block does not exist.');
    await roles.stranger.agent.get(`/api/blocks/${memberBlock}/photo-estimates`).expect(404);
    await app.agent().post(`/api/blocks/${memberBlock}/photo-estimates`).send(bodyFor(shortScene)).expect(401);
    await roles.member.agent.post('/api/blocks/999999/photo-estimates').send(bodyFor(shortScene)).expect(404);
  });

  it('refuses a stranger before reading the body, so a bad body tells them nothing', async () => {
    await roles.stranger.agent.post(`/api/blocks/${memberBlock}/photo-estimates`).send({ nonsense: true }).expect(404);
  });
});

describe('corners that cannot be measured', () => {
  const ref = shortScene.image.reference;
  const blk = shortScene.image.block;

  async function refused(body: Record<string, unknown>, field: string, message: RegExp) {
    const before = (await roles.member.agent.get(`/api/blocks/${memberBlock}/photo-estimates`).expect(200)).body.estimates.length;
    const res = await roles.member.agent.post(`/api/blocks/${memberBlock}/photo-estimates`).send(body).expect(400);
    expect(res.body.error.code).toBe('validation');
    expect(res.body.error.message).toMatch(message);
    expect(res.body.error.fields?.[field]).toMatch(message);
    expect(JSON.stringify(res.body)).not.toMatch(/at .*\.ts:\d+/);
    const after = (await roles.member.agent.get(`/api/blocks/${memberBlock}/photo-estimates`).expect(200)).body.estimates.length;
    expect(after).toBe(before);
  }

  it('fewer than four corners', () =>
    refused(
      bodyFor(shortScene, { block: { corners: blk.slice(0, 3) } }),
      'block.corners',
      /Mark all four corners of the block \(3 marked\)/,
    ));

  it('corners in a crossing order (a self-intersecting outline)', () =>
    refused(bodyFor(shortScene, { block: { corners: [blk[0], blk[2], blk[1], blk[3]] } }), 'block.corners', /cross over/));

  it('three reference corners on one line', () => {
    const mid: [number, number] = [(ref[0][0] + ref[1][0]) / 2, (ref[0][1] + ref[1][1]) / 2];
    return refused(
      bodyFor(shortScene, { reference: { corners: [ref[0], mid, ref[1], ref[3]], size: 12 } }),
      'reference.corners',
      /lie on one line/,
    );
  });

  it('two corners on the same spot', () =>
    refused(bodyFor(shortScene, { block: { corners: [blk[0], blk[0], blk[2], blk[3]] } }), 'block.corners', /same spot/));

  it('a corner off the photo', () => {
    const off = ref.map(([x, y]) => [x + 1200, y]) as Quad;
    return refused(
      bodyFor(shortScene, { reference: { corners: off, size: 12 } }),
      'reference.corners',
      /outside the photo \(1600 × 1200 pixels\)/,
    );
  });

  it('a reference size that is not a length', () =>
    refused(
      bodyFor(shortScene, { reference: { corners: ref, size: 'a bit' } }),
      'reference.size',
      /“a bit” is not a length we can read/,
    ));

  it('a photo of another block', async () => {
    const other = await uploadScene(roles.coordinator.agent, coordinatorBlock, shortScene);
    await refused(bodyFor(shortScene, { photoId: other }), 'photoId', /this block’s photos/);
  });
});

describe('after the swap closes, and after the photo goes', () => {
  it('keeps estimates when their photo is removed, and refuses new ones once the swap is cancelled', async () => {
    const { swap } = await sewingSwap(app, roles, { pledges: [1, 1] });
    const block = (await myBlocks(roles.member.agent, swap.id))[0]!.id;
    const photo = await uploadScene(roles.member.agent, block, shortScene);
    const saved = await roles.member.agent
      .post(`/api/blocks/${block}/photo-estimates`)
      .send(bodyFor(shortScene, { photoId: photo }))
      .expect(201);
    await roles.member.agent.delete(`/api/photos/${photo}`).expect(204);
    const list = (await roles.member.agent.get(`/api/blocks/${block}/photo-estimates`).expect(200)).body as PhotoEstimatesDto;
    expect(list.estimates.map((e) => [e.id, e.photoId])).toEqual([[saved.body.id, null]]);

    const another = await uploadScene(roles.member.agent, block, shortScene);
    await move(roles.coordinator.agent, swap.id, 'cancelled');
    const closed = await roles.member.agent
      .post(`/api/blocks/${block}/photo-estimates`)
      .send(bodyFor(shortScene, { photoId: another }))
      .expect(409);
    expect(closed.body.error.message).toMatch(/cancelled; photo estimates are closed/);
    expect((await roles.member.agent.get(`/api/blocks/${block}/photo-estimates`).expect(200)).body.canEstimate).toBe(false);
  });
});
