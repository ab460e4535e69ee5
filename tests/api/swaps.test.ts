import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { countStatements, statementsOf } from '../helpers/sql-count';
import { createSwap, move, myBlocks, receiveAndMeasure, sewingSwap, swapBody, type Roles } from './swaps-support';

let app: TestApp;
let roles: Roles;
beforeAll(async () => {
  app = await createTestApp();
  roles = await guildWithRoles(app);
});
const stopCounting = countStatements();
afterAll(async () => {
  stopCounting();
  await app.close();
});

describe('setting up a swap', () => {
  it('creates a draft with the unfinished size worked out by the engine', async () => {
    const swap = await createSwap(roles.coordinator.agent, roles.guildId);
    const res = await roles.coordinator.agent.get(`/api/swaps/${swap.id}`).expect(200);
    // 3 columns of 3½″ with ¼″ seams: 3 × 3.5 − 2 × ¼ × 2 = 9½″ (unfinished = finished 9″ + 2 × ¼″).
    expect(res.body).toMatchObject({
      state: 'draft',
      unfinished: { width: 9.5, height: 9.5 },
      finished: { width: 9, height: 9 },
      seam: 0.25,
      tolerance: 0.125,
      squareness: 0.25,
      quota: { min: 1, max: 6 },
      // Nobody has signed up to a draft: the tallies read 0, not null.
      signups: 0,
      pledged: 0,
      myPledge: 0,
      signupReminderDays: 7,
      dueReminderDays: 2,
      canManage: true,
      colourRules: [
        { role: 'light', note: 'cream to pale gold' },
        { role: 'dark', note: 'indigo' },
      ],
    });
    const history = await roles.coordinator.agent.get(`/api/swaps/${swap.id}/transitions`).expect(200);
    expect(history.body).toEqual([
      expect.objectContaining({ from: null, to: 'draft', by: { id: roles.coordinator.id, displayName: expect.any(String) } }),
    ]);
  });

  it('derives unit and custom block sizes from the engine', async () => {
    const cases: [Record<string, unknown>, { width: number; height: number }][] = [
      // A 3″ finished HST is 3½″ unfinished; a 2 × 4″ goose 2½ × 4½″; custom 6 × 12″ → 6½ × 12½″.
      [
        { kind: 'hst', finished: 3, method: 'trim' },
        { width: 3.5, height: 3.5 },
      ],
      [
        { kind: 'qst', finished: '4 1/2' },
        { width: 5, height: 5 },
      ],
      [
        { kind: 'flying-geese', finished: { width: 4, height: 2 } },
        { width: 4.5, height: 2.5 },
      ],
      [
        { kind: 'square-in-square', finished: '6"' },
        { width: 6.5, height: 6.5 },
      ],
      [
        { kind: 'custom', finished: { width: 12, height: 6 }, cutList: 'One 6½″ × 12½″ background rectangle' },
        { width: 12.5, height: 6.5 },
      ],
    ];
    for (const [block, unfinished] of cases) {
      const swap = await createSwap(roles.admin.agent, roles.guildId, { block });
      expect(swap.unfinished).toEqual(unfinished);
    }
  });

  it('answers a bad body with 400 and field messages, and creates nothing', async () => {
    const before = await roles.coordinator.agent.get(`/api/guilds/${roles.guildId}/swaps`).expect(200);
    const res = await roles.coordinator.agent
      .post(`/api/guilds/${roles.guildId}/swaps`)
      .send(
        swapBody({
          title: '',
          tolerance: 'a bit',
          quota: { min: 4, max: 2 },
          block: { kind: 'grid', columns: [0.4], rows: [] },
          dueAt: 'soon',
        }),
      )
      .expect(400);
    expect(res.body.error.code).toBe('validation');
    expect(res.body.error.fields).toMatchObject({
      title: expect.stringMatching(/title/),
      tolerance: expect.stringMatching(/not a length we can read/),
      'block.rows': expect.stringMatching(/at least one row/),
      dueAt: expect.stringMatching(/date/),
    });
    const cross = await roles.coordinator.agent
      .post(`/api/guilds/${roles.guildId}/swaps`)
      .send(swapBody({ quota: { min: 4, max: 2 }, mode: 'gift' }))
      .expect(400);
    expect(cross.body.error.fields).toMatchObject({ 'quota.max': expect.any(String), giftRecipientName: expect.any(String) });
    const after = await roles.coordinator.agent.get(`/api/guilds/${roles.guildId}/swaps`).expect(200);
    expect(after.body.length).toBe(before.body.length);
  });

  it('refuses a gift recipient from outside the guild', async () => {
    const res = await roles.coordinator.agent
      .post(`/api/guilds/${roles.guildId}/swaps`)
      .send(swapBody({ mode: 'gift', giftRecipientId: roles.stranger.id }))
      .expect(400);
    expect(res.body.error.fields.giftRecipientId).toMatch(/member of this guild/);
  });

  it('hides drafts from members and lists open swaps with their pledges', async () => {
    const draft = await createSwap(roles.coordinator.agent, roles.guildId, { title: 'Quiet Draft' });
    await roles.member.agent.get(`/api/swaps/${draft.id}`).expect(404);
    const open = await createSwap(roles.coordinator.agent, roles.guildId, { title: 'Open Geese' });
    await move(roles.coordinator.agent, open.id, 'signup');
    await roles.member.agent.post(`/api/swaps/${open.id}/signups`).send({ blocks: 3 }).expect(200);
    const list = await roles.member.agent.get(`/api/guilds/${roles.guildId}/swaps`).expect(200);
    const titles = list.body.map((s: { title: string }) => s.title);
    expect(titles).toContain('Open Geese');
    expect(titles).not.toContain('Quiet Draft');
    expect(list.body.find((s: { id: number }) => s.id === open.id)).toMatchObject({
      state: 'signup',
      signups: 1,
      pledged: 3,
      myPledge: 3,
    });
  });

  it('shows a member the swap with its guild, creator, gift recipient and pledges, in one query besides the policy’s', async () => {
    const swap = await createSwap(roles.coordinator.agent, roles.guildId, {
      title: 'Comfort Quilt Stars',
      mode: 'gift',
      giftRecipientId: roles.member.id,
    });
    await move(roles.coordinator.agent, swap.id, 'signup');
    await roles.coordinator.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 4 }).expect(200);
    await roles.member.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 2 }).expect(200);
    const names = await app.deps.pool.query<{ id: number; display_name: string; name: string; time_zone: string }>(
      `SELECT u.id, u.display_name, g.name, g.time_zone FROM users u, guilds g WHERE u.id = ANY($1::int[]) AND g.id = $2`,
      [[roles.coordinator.id, roles.member.id], roles.guildId],
    );
    const nameOf = (id: number) => names.rows.find((r) => r.id === id)!.display_name;

    await roles.member.agent.get(`/api/swaps/${swap.id}`).expect(200); // the session remembered from here on
    const { result, statements } = await statementsOf(() => roles.member.agent.get(`/api/swaps/${swap.id}`));
    expect(result.status).toBe(200);
    expect(result.body).toMatchObject({
      title: 'Comfort Quilt Stars',
      guild: { id: roles.guildId, name: names.rows[0]!.name, timeZone: names.rows[0]!.time_zone },
      createdBy: { id: roles.coordinator.id, displayName: nameOf(roles.coordinator.id) },
      giftRecipient: { userId: roles.member.id, name: nameOf(roles.member.id) },
      signups: 2,
      pledged: 6,
      myPledge: 2,
      myRole: 'member',
      canManage: false,
    });
    expect(statements).toHaveLength(2);
  });
});

describe('editing a swap', () => {
  it('changes the spec while in draft or sign-up, and only the schedule afterwards', async () => {
    const swap = await createSwap(roles.coordinator.agent, roles.guildId);
    const patched = await roles.coordinator.agent
      .patch(`/api/swaps/${swap.id}`)
      .send({
        block: { kind: 'grid', columns: ['2 1/2', '2 1/2', '2 1/2', '2 1/2'], rows: ['2 1/2', '2 1/2', '2 1/2', '2 1/2'] },
        tolerance: '3/16',
      })
      .expect(200);
    // 4 × 2½ − 3 × ½ = 8½″ unfinished.
    expect(patched.body).toMatchObject({ unfinished: { width: 8.5, height: 8.5 }, tolerance: 0.1875 });
    await move(roles.coordinator.agent, swap.id, 'signup');
    await roles.member.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 2 }).expect(200);
    await move(roles.coordinator.agent, swap.id, 'sewing');
    const locked = await roles.coordinator.agent.patch(`/api/swaps/${swap.id}`).send({ tolerance: 0.25 }).expect(409);
    expect(locked.body.error).toMatchObject({ code: 'spec_locked', message: expect.stringMatching(/draft or open for sign-up/) });
    const later = new Date(Date.now() + 60 * 86_400_000).toISOString();
    const moved = await roles.coordinator.agent
      .patch(`/api/swaps/${swap.id}`)
      .send({ dueAt: later, title: 'Harvest Stripes (extended)' })
      .expect(200);
    expect(moved.body).toMatchObject({ dueAt: later, title: 'Harvest Stripes (extended)', tolerance: 0.1875 });
  });

  it('checks rules across fields on the merged swap', async () => {
    const swap = await createSwap(roles.coordinator.agent, roles.guildId);
    const early = new Date(Date.now() + 86_400_000).toISOString();
    const res = await roles.coordinator.agent.patch(`/api/swaps/${swap.id}`).send({ dueAt: early }).expect(400);
    expect(res.body.error.fields.dueAt).toMatch(/due after sign-up closes/);
    await roles.coordinator.agent.patch(`/api/swaps/${swap.id}`).send({}).expect(400);
    const unchanged = await roles.coordinator.agent.get(`/api/swaps/${swap.id}`).expect(200);
    expect(unchanged.body.dueAt).not.toBe(early);
  });
});

describe('states', () => {
  it('walks the whole path with checks and records who moved it', async () => {
    const swap = await createSwap(roles.coordinator.agent, roles.guildId);
    const skip = await roles.coordinator.agent.post(`/api/swaps/${swap.id}/transitions`).send({ to: 'sorting' }).expect(409);
    expect(skip.body.error.message).toMatch(/cannot move to “sorting”/);
    await move(roles.coordinator.agent, swap.id, 'signup');
    const empty = await roles.coordinator.agent.post(`/api/swaps/${swap.id}/transitions`).send({ to: 'sewing' }).expect(409);
    expect(empty.body.error.message).toMatch(/Nobody has signed up/);
    await roles.member.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 1 }).expect(200);
    await move(roles.coordinator.agent, swap.id, 'sewing');
    // Closed for sign-up now, until the coordinator reopens.
    const closed = await roles.admin.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 1 }).expect(409);
    expect(closed.body.error.code).toBe('signup_closed');
    await move(roles.coordinator.agent, swap.id, 'signup');
    await roles.admin.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 1 }).expect(200);
    await move(roles.admin.agent, swap.id, 'sewing');
    await move(roles.admin.agent, swap.id, 'collecting');
    const nothing = await roles.coordinator.agent.post(`/api/swaps/${swap.id}/transitions`).send({ to: 'sorting' }).expect(409);
    expect(nothing.body.error.message).toMatch(/nothing to sort/);
    const [block] = await myBlocks(roles.member.agent, swap.id);
    await roles.coordinator.agent.post(`/api/blocks/${block!.id}/received`).send({}).expect(200);
    const unmeasured = await roles.coordinator.agent
      .post(`/api/swaps/${swap.id}/transitions`)
      .send({ to: 'sorting' })
      .expect(409);
    expect(unmeasured.body.error.message).toMatch(/1 received block is not measured yet/);
    await roles.coordinator.agent.post(`/api/blocks/${block!.id}/measurements`).send({ width: 9.5, height: 9.5 }).expect(201);
    await move(roles.coordinator.agent, swap.id, 'sorting');
    const early = await roles.coordinator.agent.post(`/api/swaps/${swap.id}/transitions`).send({ to: 'complete' }).expect(409);
    expect(early.body.error.message).toMatch(/Confirm who receives which blocks/);
    const cancelled = await roles.coordinator.agent
      .post(`/api/swaps/${swap.id}/transitions`)
      .send({ to: 'cancelled', reason: 'Too few makers' })
      .expect(200);
    expect(cancelled.body.state).toBe('cancelled');
    await roles.coordinator.agent.post(`/api/swaps/${swap.id}/transitions`).send({ to: 'signup' }).expect(409);

    const history = await roles.member.agent.get(`/api/swaps/${swap.id}/transitions`).expect(200);
    expect(history.body.map((t: { to: string }) => t.to)).toEqual([
      'draft',
      'signup',
      'sewing',
      'signup',
      'sewing',
      'collecting',
      'sorting',
      'cancelled',
    ]);
    expect(history.body.at(-1)).toMatchObject({ from: 'sorting', reason: 'Too few makers', by: { id: roles.coordinator.id } });
    expect(history.body[4].by.id).toBe(roles.admin.id);
  });

  it('will not open sign-up once the close date has passed', async () => {
    const swap = await createSwap(roles.coordinator.agent, roles.guildId, {
      signupClosesAt: new Date(Date.now() - 86_400_000).toISOString(),
    });
    const res = await roles.coordinator.agent.post(`/api/swaps/${swap.id}/transitions`).send({ to: 'signup' }).expect(409);
    expect(res.body.error.message).toMatch(/move the sign-up close date later/);
    const bad = await roles.coordinator.agent.post(`/api/swaps/${swap.id}/transitions`).send({ to: 'finished' }).expect(400);
    expect(bad.body.error.fields.to).toBeDefined();
  });
});

describe('sign-up', () => {
  it('creates, grows, shrinks and removes the member’s pledged blocks within the quota', async () => {
    const swap = await createSwap(roles.coordinator.agent, roles.guildId, { quota: { min: 2, max: 4 } });
    // A draft is invisible to members, and closed to officers.
    await roles.member.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 2 }).expect(404);
    const notYet = await roles.admin.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 2 }).expect(409);
    expect(notYet.body.error.code).toBe('signup_closed');
    await move(roles.coordinator.agent, swap.id, 'signup');

    const over = await roles.member.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 5 }).expect(400);
    expect(over.body.error.fields.blocks).toMatch(/between 2 and 4/);
    await roles.member.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 'three' }).expect(400);
    expect(await myBlocks(roles.member.agent, swap.id)).toEqual([]);

    const signed = await roles.member.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 3 }).expect(200);
    expect(signed.body).toMatchObject({ blocks: 3, status: 'active', userId: roles.member.id });
    expect((await myBlocks(roles.member.agent, swap.id)).map((b) => [b.sequence, b.state])).toEqual([
      [1, 'pledged'],
      [2, 'pledged'],
      [3, 'pledged'],
    ]);

    const blocks = await myBlocks(roles.member.agent, swap.id);
    await roles.member.agent.post(`/api/blocks/${blocks[2]!.id}/sewn`).expect(200);
    await roles.member.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 2 }).expect(200);
    // The plain pledge goes first; the sewn block #3 stays.
    expect((await myBlocks(roles.member.agent, swap.id)).map((b) => [b.sequence, b.state])).toEqual([
      [1, 'pledged'],
      [3, 'sewn'],
    ]);
    await roles.member.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 4 }).expect(200);
    expect((await myBlocks(roles.member.agent, swap.id)).map((b) => b.sequence)).toEqual([1, 3, 4, 5]);

    await roles.member.agent.delete(`/api/swaps/${swap.id}/signups/me`).expect(204);
    expect(await myBlocks(roles.member.agent, swap.id)).toEqual([]);
    const me = await roles.member.agent.get(`/api/swaps/${swap.id}/signups/me`).expect(200);
    expect(me.body).toMatchObject({ status: 'withdrawn', blocks: 0 });
    await roles.member.agent.delete(`/api/swaps/${swap.id}/signups/me`).expect(404);
  });

  it('keeps withdrawn members out once sign-up closes', async () => {
    const swap = await createSwap(roles.coordinator.agent, roles.guildId);
    await move(roles.coordinator.agent, swap.id, 'signup');
    await roles.member.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 1 }).expect(200);
    await move(roles.coordinator.agent, swap.id, 'sewing');
    const res = await roles.member.agent.delete(`/api/swaps/${swap.id}/signups/me`).expect(409);
    expect(res.body.error.message).toMatch(/closed/);
    expect(await myBlocks(roles.member.agent, swap.id)).toHaveLength(1);
  });
});

describe('roster', () => {
  /** SQL statements the app runs for one roster request. */
  async function queriesFor(swapId: number) {
    app.sessionCache.clear(); // both read their session, as the first request in a second does
    const { statements } = await statementsOf(() => roles.coordinator.agent.get(`/api/swaps/${swapId}/roster`).expect(200));
    return statements.length;
  }

  it('costs the same number of queries for 2 makers or 8 (no query per member or block)', async () => {
    const small = await sewingSwap(app, roles, { pledges: [1, 1] });
    const large = await sewingSwap(app, roles, { pledges: [4, 4, 4, 4, 4, 4, 4, 4] });
    await move(roles.coordinator.agent, large.swap.id, 'collecting');
    for (const maker of large.makers.slice(0, 3)) {
      for (const b of await myBlocks(maker.agent, large.swap.id))
        await receiveAndMeasure(roles.coordinator.agent, b.id, { width: 9.5, height: 9.5 });
    }
    const roster = await roles.coordinator.agent.get(`/api/swaps/${large.swap.id}/roster`).expect(200);
    expect(roster.body.rows).toHaveLength(8);
    expect(roster.body.totals).toMatchObject({ pledged: 32, measured: 12, verdicts: { true: 12 } });
    const [few, many] = [await queriesFor(small.swap.id), await queriesFor(large.swap.id)];
    // The session with its user, then the swap with the caller's role and its roster.
    expect(few).toBe(2);
    expect(many).toBe(few);
  });
});
