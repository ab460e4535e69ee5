/**
 * Running a swap without fear: a preview before each big step, steps taken back while nobody outside
 * has felt them, undo for small block steps, accepting an off-size block with a reason, handing in
 * several blocks at once, and the confirmed return listed by recipient for hand-out night.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { createSwap, move, myBlocks, receiveAndMeasure, sewingSwap, type Roles } from './swaps-support';

let app: TestApp;
let roles: Roles;

beforeAll(async () => {
  app = await createTestApp();
  roles = await guildWithRoles(app);
});
afterAll(() => app.close());

type Preview = { to: string; emails: number; owedBlocks: number; warnings: { code: string; message: string }[] };

async function preview(swapId: number, to: string): Promise<Preview> {
  const res = await roles.coordinator.agent.get(`/api/swaps/${swapId}/transitions/preview?to=${to}`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as Preview;
}
const codes = (p: Preview) => p.warnings.map((w) => w.code);

describe('big steps: preview and going back', () => {
  it('says who is e-mailed and what is unusual, and changes nothing', async () => {
    const swap = await createSwap(roles.coordinator.agent, roles.guildId);
    const open = await preview(swap.id, 'signup');
    // The guild's admin, coordinator and member get the announcement.
    expect(open).toEqual({ to: 'signup', emails: 3, owedBlocks: 0, warnings: [] });
    expect((await roles.coordinator.agent.get(`/api/swaps/${swap.id}`).expect(200)).body.state).toBe('draft');

    await move(roles.coordinator.agent, swap.id, 'signup');
    const refused = await preview(swap.id, 'sewing');
    expect(codes(refused)).toEqual(['move_refused', 'before_signup_close']);
    expect(refused.warnings[0]!.message).toMatch(/Nobody has signed up/);
    // Nobody signed up yet: back to draft is allowed, and the history says who went back.
    expect(codes(await preview(swap.id, 'draft'))).toEqual(['step_back']);
    await move(roles.coordinator.agent, swap.id, 'draft');
    const history = (await roles.coordinator.agent.get(`/api/swaps/${swap.id}/transitions`).expect(200)).body;
    expect(history.at(-1)).toMatchObject({ from: 'signup', to: 'draft', by: { id: roles.coordinator.id } });

    // The members were announced to already: reopening e-mails nobody new.
    await move(roles.coordinator.agent, swap.id, 'signup');
    await roles.member.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 2 }).expect(200);
    const back = await roles.coordinator.agent.post(`/api/swaps/${swap.id}/transitions`).send({ to: 'draft' }).expect(409);
    expect(back.body.error.message).toMatch(/1 member has signed up already/);
  });

  it('warns about owed blocks and the due date before sorting, and goes back to sewing only before blocks arrive', async () => {
    const { swap, makers } = await sewingSwap(app, roles, { pledges: [2, 1] });
    await move(roles.coordinator.agent, swap.id, 'collecting');
    expect(codes(await preview(swap.id, 'sewing'))).toEqual(['step_back']);
    await move(roles.coordinator.agent, swap.id, 'sewing');
    await move(roles.coordinator.agent, swap.id, 'collecting');

    const [first] = await myBlocks(makers[0]!.agent, swap.id);
    await roles.coordinator.agent.post(`/api/blocks/${first!.id}/received`).send({}).expect(200);
    const early = await preview(swap.id, 'sorting');
    expect(early.owedBlocks).toBe(2);
    expect(codes(early)).toEqual(['move_refused', 'blocks_owed', 'before_due_date', 'unmeasured_blocks']);
    expect(early.warnings.find((w) => w.code === 'before_due_date')!.message).toMatch(
      /not due until \w+day \d+ \w+ \d{4} \(in 40 days\)/,
    );
    const noBack = await preview(swap.id, 'sewing');
    expect(noBack.warnings[0]).toMatchObject({
      code: 'move_refused',
      message: expect.stringMatching(/1 block has been taken in already/),
    });

    await roles.coordinator.agent.post(`/api/blocks/${first!.id}/measurements`).send({ width: 9.5, height: 9.5 }).expect(201);
    expect(codes(await preview(swap.id, 'sorting'))).toEqual(['blocks_owed', 'before_due_date']);
  });

  it('is for officers only and checks the state name', async () => {
    const swap = await createSwap(roles.coordinator.agent, roles.guildId);
    await move(roles.coordinator.agent, swap.id, 'signup');
    await roles.member.agent.get(`/api/swaps/${swap.id}/transitions/preview?to=sewing`).expect(403);
    const bad = await roles.coordinator.agent.get(`/api/swaps/${swap.id}/transitions/preview?to=finished`).expect(400);
    expect(bad.body.error.fields.to).toMatch(/Choose one of/);
  });
});

describe('small steps: undo, accept, several at once', () => {
  it('hands in several blocks at once, and undoes each step in turn', async () => {
    const { swap, makers } = await sewingSwap(app, roles, { pledges: [3, 1] });
    const maker = makers[0]!;
    const blocks = await myBlocks(maker.agent, swap.id);
    const many = await maker.agent
      .post(`/api/swaps/${swap.id}/handed-in`)
      .send({ blockIds: blocks.map((b) => b.id), how: 'post', note: 'Tracking 12345' })
      .expect(200);
    expect(many.body.map((b: { state: string }) => b.state)).toEqual(['handed_in', 'handed_in', 'handed_in']);
    // Someone else's block in the list: nothing at all changes.
    const [other] = await myBlocks(makers[1]!.agent, swap.id);
    const mixed = await maker.agent
      .post(`/api/swaps/${swap.id}/handed-in`)
      .send({ blockIds: [other!.id], how: 'in-person' })
      .expect(400);
    expect(mixed.body.error.fields.blockIds).toMatch(/not one of your blocks/);
    expect((await myBlocks(makers[1]!.agent, swap.id))[0]!.state).toBe('pledged');

    // The maker undoes her own hand-in.
    const undone = await maker.agent.post(`/api/blocks/${blocks[2]!.id}/undo`).expect(200);
    expect(undone.body).toMatchObject({ state: 'pledged', handIn: null, undone: 'Handed in' });

    await move(roles.coordinator.agent, swap.id, 'collecting');
    const b = blocks[0]!.id;
    await receiveAndMeasure(roles.coordinator.agent, b, { width: 9.5, height: 9.5 });
    await roles.coordinator.agent.post(`/api/blocks/${b}/measurements`).send({ width: 9, height: 9 }).expect(201);
    // A wrong measurement is not the maker's to undo.
    await maker.agent.post(`/api/blocks/${b}/undo`).expect(403);
    const back = await roles.coordinator.agent.post(`/api/blocks/${b}/undo`).expect(200);
    expect(back.body).toMatchObject({ state: 'measured', verdict: 'true', undone: 'Measured' });
    const history = (await roles.coordinator.agent.get(`/api/blocks/${b}/measurements`).expect(200)).body as {
      width: number;
      withdrawnAt: string | null;
    }[];
    expect(history.map((m) => [m.width, m.withdrawnAt !== null])).toEqual([
      [9, true],
      [9.5, false],
    ]);
    expect(back.body.latest.ruler.width).toBe(9.5);

    // Taken in by mistake: back to handed in, then the hand-in itself.
    await roles.coordinator.agent.post(`/api/blocks/${b}/undo`).expect(200);
    const received = await roles.coordinator.agent.post(`/api/blocks/${b}/undo`).expect(200);
    expect(received.body).toMatchObject({ state: 'handed_in', undone: 'Taken in', latest: { ruler: null } });
    await maker.agent.post(`/api/blocks/${b}/undo`).expect(200);
    const none = await maker.agent.post(`/api/blocks/${b}/undo`).expect(409);
    expect(none.body.error.code).toBe('nothing_to_undo');
  });

  it('lets an officer accept a short block with a reason; it then takes part in the return and is listed by recipient', async () => {
    const { swap, makers } = await sewingSwap(app, roles, { pledges: [2, 2] });
    await move(roles.coordinator.agent, swap.id, 'collecting');
    const [a1, a2] = await myBlocks(makers[0]!.agent, swap.id);
    const [b1, b2] = await myBlocks(makers[1]!.agent, swap.id);
    for (const blk of [a1!, b1!, b2!]) await receiveAndMeasure(roles.coordinator.agent, blk.id, { width: 9.5, height: 9.5 });
    await receiveAndMeasure(roles.coordinator.agent, a2!.id, { width: 9.25, height: 9.5 });

    await roles.member.agent.post(`/api/blocks/${a2!.id}/accept`).send({ reason: 'fine' }).expect(403);
    const tooShort = await roles.coordinator.agent.post(`/api/blocks/${a2!.id}/accept`).send({ reason: '' }).expect(400);
    expect(tooShort.body.error.fields.reason).toMatch(/why/);
    const accepted = await roles.coordinator.agent
      .post(`/api/blocks/${a2!.id}/accept`)
      .send({ reason: 'Only ¼″ short; the sashing hides it' })
      .expect(200);
    expect(accepted.body).toMatchObject({
      verdict: 'short',
      accepted: true,
      decision: { reason: 'Only ¼″ short; the sashing hides it', by: { id: roles.coordinator.id } },
    });
    await roles.coordinator.agent.post(`/api/blocks/${a1!.id}/accept`).send({ reason: 'Already fine' }).expect(409);

    await move(roles.coordinator.agent, swap.id, 'sorting');
    const plan = (await roles.coordinator.agent.post(`/api/swaps/${swap.id}/distribution/plan`).expect(200)).body;
    expect(plan.acceptedTotal).toBe(4);
    expect((await roles.coordinator.agent.get(`/api/swaps/${swap.id}/distribution`).expect(200)).body).toEqual([]);
    const transfers = plan.transfers.map(({ from, to, count }: { from: number; to: number; count: number }) => ({
      from,
      to,
      count,
    }));
    await roles.coordinator.agent.post(`/api/swaps/${swap.id}/distribution/confirm`).send({ transfers }).expect(200);
    await roles.coordinator.agent.post(`/api/blocks/${a1!.id}/undo`).expect(409);

    const bundles = (await roles.coordinator.agent.get(`/api/swaps/${swap.id}/distribution?by=recipient`).expect(200)).body as {
      recipient: { id: number; displayName: string };
      blocks: { id: number; maker: { id: number; displayName: string }; code: string }[];
    }[];
    expect(bundles.map((x) => x.recipient.id).sort()).toEqual([makers[0]!.id, makers[1]!.id].sort());
    const toFirst = bundles.find((x) => x.recipient.id === makers[0]!.id)!;
    expect(toFirst.blocks.map((x) => x.id).sort()).toEqual([b1!.id, b2!.id].sort());
    expect(toFirst.blocks.every((x) => x.maker.id === makers[1]!.id && /^[2-9A-HJ-NP-Z]{8}$/.test(x.code))).toBe(true);
    // The short code is the one on the block's label.
    const sheet = (await roles.coordinator.agent.get(`/api/swaps/${swap.id}/labels?maker=all`).expect(200)).body as {
      labels: { blockId: number; shortCode: string }[];
    };
    expect(toFirst.blocks.find((x) => x.id === b1!.id)!.code).toBe(sheet.labels.find((l) => l.blockId === b1!.id)!.shortCode);
    const byMaker = (await roles.coordinator.agent.get(`/api/swaps/${swap.id}/distribution?by=maker`).expect(200)).body;
    expect(byMaker.find((x: { maker: { id: number } }) => x.maker.id === makers[0]!.id).blocks).toHaveLength(2);
    // The export uses the screen's words for verdicts.
    const csv = (await roles.coordinator.agent.get(`/api/swaps/${swap.id}/export/roster.csv`).expect(200)).text;
    expect(csv).toContain('#2 Returned (Runs short, accepted by decision)');
    expect(csv).toContain('#1 Returned (True to size)');
    expect(csv).not.toMatch(/\((true|short|skewed|trim)[,)]/);
    await roles.coordinator.agent.get(`/api/swaps/${swap.id}/distribution?by=colour`).expect(400);
    await roles.member.agent.get(`/api/swaps/${swap.id}/distribution`).expect(403);
  });
});
