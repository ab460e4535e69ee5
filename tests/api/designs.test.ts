/**
 * The design wall API: the caller's own layout of the blocks returned to them (and their own), the
 * finishing plan in the answer, the refusals, the colour-spreading proposal and a photo's colours.
 */
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { srgbToLab } from '@shared/colour';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { move, myBlocks, receiveAndMeasure, sewingSwap, type Roles } from './swaps-support';

let app: TestApp;
let roles: Roles;
let swapId: number;
type Maker = Roles['member'];
let makers: Maker[];
/** block id → hex colour of its photo */
const photoColour = new Map<number, string>();
const HEXES = ['#2F4B7C', '#B5462F', '#C8920F', '#5F7A5A', '#6B3F69', '#F7F3EA', '#1E2B44', '#E9C46A'];

async function solidJpeg(hex: string) {
  return sharp({ create: { width: 300, height: 300, channels: 3, background: hex } })
    .jpeg({ quality: 95 })
    .toBuffer();
}

beforeAll(async () => {
  app = await createTestApp();
  roles = await guildWithRoles(app);
  // Four makers, two blocks each; every block photographed in its own colour, then all returned.
  const built = await sewingSwap(app, roles, { pledges: [2, 2, 2, 2] });
  swapId = built.swap.id;
  makers = built.makers;
  let n = 0;
  for (const maker of makers) {
    for (const block of await myBlocks(maker.agent, swapId)) {
      const hex = HEXES[n++ % HEXES.length]!;
      photoColour.set(block.id, hex);
      await maker.agent
        .post(`/api/blocks/${block.id}/photos`)
        .attach('photos', await solidJpeg(hex), 'block.jpg')
        .expect(201);
      await maker.agent.post(`/api/blocks/${block.id}/handed-in`).send({ how: 'in-person' }).expect(200);
    }
  }
  await move(roles.coordinator.agent, swapId, 'collecting');
  for (const maker of makers) {
    for (const block of await myBlocks(maker.agent, swapId))
      await receiveAndMeasure(roles.coordinator.agent, block.id, { width: 9.5, height: 9.5 });
  }
  await move(roles.coordinator.agent, swapId, 'sorting');
  const plan = await roles.coordinator.agent.post(`/api/swaps/${swapId}/distribution/plan`).expect(200);
  const transfers = (plan.body.transfers as { from: number; to: number; count: number }[]).map(({ from, to, count }) => ({
    from,
    to,
    count,
  }));
  await roles.coordinator.agent.post(`/api/swaps/${swapId}/distribution/confirm`).send({ transfers }).expect(200);
}, 120_000);
afterAll(() => app.close());

async function incoming(agent: Maker['agent']) {
  const res = await agent.get(`/api/swaps/${swapId}/blocks?recipient=me`).expect(200);
  return (res.body as { id: number }[]).map((b) => b.id);
}

describe('GET /api/swaps/:swapId/design', () => {
  it('starts with every block returned to the caller and their own, with photos, colours and a plan', async () => {
    const member = roles.member;
    const res = await member.agent.get(`/api/swaps/${swapId}/design`).expect(200);
    const mine = (await myBlocks(member.agent, swapId)).map((b) => b.id);
    const returned = await incoming(member.agent);
    expect(res.body.savedAt).toBeNull();
    expect((res.body.blocks as { id: number }[]).map((b) => b.id).sort()).toEqual([...mine, ...returned].sort());
    expect(res.body.cells).toHaveLength(res.body.columns * res.body.rows);
    expect(res.body.cells.filter((c: { blockId: number | null }) => c.blockId !== null)).toHaveLength(4);
    // 9″ finished blocks in a 2 × 2 layout, no sashing or borders: 18″ × 18″.
    expect(res.body.plan.finished).toEqual({ width: 18, height: 18 });
    const block = res.body.blocks.find((b: { id: number }) => b.id === returned[0]);
    expect(block.photo.url).toMatch(/^\/api\/photos\/\d+$/);
    // Statistics from the stored JPEG: close to the solid colour it was made from.
    const expected = srgbToLab(photoColour.get(returned[0]!)!);
    expect(Math.abs(block.colour.meanLab[0] - expected[0])).toBeLessThan(1.5);
    expect(Math.abs(block.colour.meanLab[1] - expected[1])).toBeLessThan(2.5);
  });

  it('is refused to someone outside the guild', async () => {
    const res = await roles.stranger.agent.get(`/api/swaps/${swapId}/design`);
    expect([403, 404]).toContain(res.status);
  });
});

describe('PUT /api/swaps/:swapId/design', () => {
  it('saves a layout with sashing, cornerstones and borders and answers with the finishing plan', async () => {
    const member = roles.member;
    const ids = [...(await incoming(member.agent)), ...(await myBlocks(member.agent, swapId)).map((b) => b.id)];
    const body = {
      columns: 3,
      rows: 2,
      sashing: '2',
      cornerstones: true,
      borders: [2, '4 1/2'],
      cells: [
        { blockId: ids[0], rotation: 90, pinned: true },
        { blockId: null, rotation: 0 },
        { blockId: ids[1], rotation: 180 },
        { blockId: ids[2], rotation: 0 },
        { blockId: ids[3], rotation: 270 },
        { blockId: null, rotation: 0 },
      ],
    };
    const res = await member.agent.put(`/api/swaps/${swapId}/design`).send(body);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // Across: 3 × 9 + 4 × 2 = 35, plus 2 × (2 + 4½) = 48″. Down: 2 × 9 + 3 × 2 = 24, plus 13 = 37″.
    expect(res.body.plan.finished).toEqual({ width: 48, height: 37 });
    expect(res.body.sashing).toBe(2);
    expect(res.body.borders).toEqual([2, 4.5]);
    const parts = (res.body.plan.cutList as { part: string; count: number }[]).map((r) => `${r.part}:${r.count}`);
    expect(parts).toEqual(expect.arrayContaining(['sashing:8', 'sashing:9', 'cornerstones:12']));
    expect(res.body.savedAt).not.toBeNull();

    const again = await member.agent.get(`/api/swaps/${swapId}/design`).expect(200);
    expect(again.body.cells).toEqual(body.cells.map((c) => (c.pinned ? c : { blockId: c.blockId, rotation: c.rotation })));
    expect(again.body.plan.finished).toEqual({ width: 48, height: 37 });
  });

  it('refuses a block that was neither returned to the caller nor made by them, with a message', async () => {
    const member = roles.member;
    const mine = new Set([...(await incoming(member.agent)), ...(await myBlocks(member.agent, swapId)).map((b) => b.id)]);
    const other = [...photoColour.keys()].find((id) => !mine.has(id))!;
    const res = await member.agent
      .put(`/api/swaps/${swapId}/design`)
      .send({ columns: 1, rows: 1, cells: [{ blockId: other, rotation: 0 }] })
      .expect(400);
    expect(res.body.error.message).toBe(
      `Block ${other} is not yours to place: your wall takes the blocks returned to you and the blocks you made.`,
    );
    expect(res.body.error.fields['cells.0.blockId']).toMatch(/not yours/);
  });

  it('refuses a grid whose cells do not match columns × rows', async () => {
    const res = await roles.member.agent
      .put(`/api/swaps/${swapId}/design`)
      .send({ columns: 3, rows: 2, cells: [{ blockId: null, rotation: 0 }] })
      .expect(400);
    expect(res.body.error.message).toBe('The grid is 3 × 2 = 6 cells, but 1 cell was sent.');
  });

  it('refuses a block in a plain cell of a checkerboard setting, and odd turns and lengths', async () => {
    const [a] = await incoming(roles.member.agent);
    const plain = await roles.member.agent
      .put(`/api/swaps/${swapId}/design`)
      .send({
        columns: 2,
        rows: 1,
        alternate: true,
        cells: [
          { blockId: null, rotation: 0 },
          { blockId: a, rotation: 0 },
        ],
      })
      .expect(400);
    expect(plain.body.error.message).toMatch(/plain alternate block/);
    const turn = await roles.member.agent
      .put(`/api/swaps/${swapId}/design`)
      .send({ columns: 1, rows: 1, cells: [{ blockId: a, rotation: 45 }] })
      .expect(400);
    expect(turn.body.error.message).toMatch(/0, 90, 180 or 270/);
    const sash = await roles.member.agent
      .put(`/api/swaps/${swapId}/design`)
      .send({ columns: 1, rows: 1, sashing: 'wide', cells: [{ blockId: null, rotation: 0 }] })
      .expect(400);
    expect(sash.body.error.fields.sashing).toBeTruthy();
  });

  it('gives each member their own design', async () => {
    const other = makers[2]!;
    const res = await other.agent.get(`/api/swaps/${swapId}/design`).expect(200);
    expect(res.body.savedAt).toBeNull();
  });
});

describe('POST /api/swaps/:swapId/design/arrange', () => {
  it('never moves pinned tiles or empty cells, keeps each block’s turn, and never scores worse', async () => {
    const coordinator = roles.coordinator;
    const ids = [...(await incoming(coordinator.agent)), ...(await myBlocks(coordinator.agent, swapId)).map((b) => b.id)];
    const cells = [
      { blockId: ids[0]!, rotation: 90 as const, pinned: true },
      { blockId: ids[1]!, rotation: 180 as const },
      { blockId: null, rotation: 0 as const },
      { blockId: ids[2]!, rotation: 0 as const },
      { blockId: ids[3]!, rotation: 270 as const },
      { blockId: null, rotation: 0 as const },
    ];
    const res = await coordinator.agent.post(`/api/swaps/${swapId}/design/arrange`).send({ columns: 3, rows: 2, cells });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.cells[0]).toEqual(cells[0]);
    expect(res.body.cells[2]).toEqual(cells[2]);
    expect(res.body.cells[5]).toEqual(cells[5]);
    for (const c of res.body.cells as { blockId: number | null; rotation: number }[]) {
      if (c.blockId !== null) expect(c.rotation).toBe(cells.find((x) => x.blockId === c.blockId)!.rotation);
    }
    expect(res.body.score).toBeGreaterThanOrEqual(res.body.before);
    expect(res.body.before).toBeGreaterThan(0);
  });

  it('uses the saved design when no layout is sent', async () => {
    const res = await roles.member.agent.post(`/api/swaps/${swapId}/design/arrange`).send({}).expect(200);
    expect(res.body.cells).toHaveLength(6);
    expect(res.body.cells[0].pinned).toBe(true);
  });
});

describe('GET /api/photos/:photoId/colour', () => {
  it('gives the mean L*a*b* and lightness percentiles to anyone who may see the photo', async () => {
    const design = await roles.admin.agent.get(`/api/swaps/${swapId}/design`).expect(200);
    expect(design.body.blocks).toEqual([]); // the admin made no block and got none back
    const member = await roles.member.agent.get(`/api/swaps/${swapId}/design`).expect(200);
    const photoId = member.body.blocks[0].photo.id as number;
    const res = await roles.admin.agent.get(`/api/photos/${photoId}/colour`).expect(200);
    expect(Object.keys(res.body).sort()).toEqual(['lightness', 'meanLab']);
    expect(res.body.meanLab).toHaveLength(3);
    expect(res.body.lightness.p10).toBeLessThanOrEqual(res.body.lightness.p50);
    expect(res.body.lightness.p50).toBeLessThanOrEqual(res.body.lightness.p90);
    const stranger = await roles.stranger.agent.get(`/api/photos/${photoId}/colour`);
    expect([403, 404]).toContain(stranger.status);
  });

  it('works out the colours of a photo stored before colour statistics existed', async () => {
    const member = await roles.member.agent.get(`/api/swaps/${swapId}/design`).expect(200);
    const photoId = member.body.blocks[1].photo.id as number;
    const before = (await roles.member.agent.get(`/api/photos/${photoId}/colour`).expect(200)).body;
    await app.deps.sequelize.query('DELETE FROM photo_colours WHERE photo_id = $1', { bind: [photoId] });
    const { backfillPhotoColours } = await import('../../server/uploads/photo-colour');
    expect(await backfillPhotoColours(app.deps)).toBe(1);
    const after = (await roles.member.agent.get(`/api/photos/${photoId}/colour`).expect(200)).body;
    expect(after).toEqual(before);
  });
});

describe('a gift swap', () => {
  it('lets coordinators and admins lay out the whole gift; members place only their own blocks', async () => {
    const { swap, makers: gifters } = await sewingSwap(app, roles, {
      pledges: [2, 1],
      body: { mode: 'gift', giftRecipientName: 'Riverside Hospice comfort quilts' },
    });
    await move(roles.coordinator.agent, swap.id, 'collecting');
    const all: number[] = [];
    for (const maker of gifters) {
      for (const block of await myBlocks(maker.agent, swap.id)) {
        all.push(block.id);
        await receiveAndMeasure(roles.coordinator.agent, block.id, { width: 9.5, height: 9.5 });
      }
    }
    await move(roles.coordinator.agent, swap.id, 'sorting');
    const plan = await roles.coordinator.agent.post(`/api/swaps/${swap.id}/distribution/plan`).expect(200);
    const transfers = (plan.body.transfers as { from: number; to: number | null; count: number }[]).map(
      ({ from, to, count }) => ({ from, to, count }),
    );
    await roles.coordinator.agent.post(`/api/swaps/${swap.id}/distribution/confirm`).send({ transfers }).expect(200);

    const admin = await roles.admin.agent.get(`/api/swaps/${swap.id}/design`).expect(200);
    expect((admin.body.blocks as { id: number }[]).map((b) => b.id).sort()).toEqual([...all].sort());
    const member = await roles.member.agent.get(`/api/swaps/${swap.id}/design`).expect(200);
    const own = (await myBlocks(roles.member.agent, swap.id)).map((b) => b.id);
    expect((member.body.blocks as { id: number }[]).map((b) => b.id).sort()).toEqual(own.sort());
    const other = all.find((id) => !own.includes(id))!;
    await roles.member.agent
      .put(`/api/swaps/${swap.id}/design`)
      .send({ columns: 1, rows: 1, cells: [{ blockId: other, rotation: 0 }] })
      .expect(400);
  });
});
