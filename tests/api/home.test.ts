/** The home screen's "what is next for me", and the quiet session probe. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { NextForMeDto } from '@shared/schemas/home';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { createSwap, move, myBlocks, sewingSwap, type Roles } from './swaps-support';

let app: TestApp;
let g: Roles;
beforeAll(async () => {
  app = await createTestApp();
  g = await guildWithRoles(app);
});
afterAll(() => app.close());

const next = async (agent: Roles['member']['agent']) => (await agent.get('/api/me/next').expect(200)).body as NextForMeDto;

describe('GET /api/session', () => {
  it('answers 204 to a visitor and the account when signed in', async () => {
    await app.agent().get('/api/session').expect(204);
    const me = await g.member.agent.get('/api/session').expect(200);
    expect(me.body.user.id).toBe(g.member.id);
  });
});

describe('GET /api/me/next', () => {
  it('is for signed-in people only', async () => {
    await app.agent().get('/api/me/next').expect(401);
  });

  it('lists the blocks I owe per swap, swaps open for sign-up, the next sew day, and what officers must do', async () => {
    const { swap } = await sewingSwap(app, g, { pledges: [2, 1] });
    const open = await createSwap(g.coordinator.agent, g.guildId, { title: 'Open Sign-up Stars' });
    await move(g.coordinator.agent, open.id, 'signup');
    const day = await g.coordinator.agent
      .post(`/api/guilds/${g.guildId}/sew-days`)
      .send({ title: 'Winter sew day', startsAt: '2030-01-12T10:00', endsAt: '2030-01-12T15:00', place: 'Library room B' })
      .expect(201);
    await g.member.agent.put(`/api/sew-days/${day.body.id}/rsvp`).send({ answer: 'going' }).expect(200);

    const mine = await next(g.member.agent);
    const owed = mine.blocksOwed.find((s) => s.swapId === swap.id)!;
    expect(owed.blocks.map((b) => b.state)).toEqual(['pledged', 'pledged']);
    expect(owed.guildId).toBe(g.guildId);
    expect(mine.openSwaps.find((s) => s.swapId === open.id)).toMatchObject({ swapTitle: 'Open Sign-up Stars', pledged: null });
    expect(mine.sewDays).toEqual([expect.objectContaining({ sewDayId: day.body.id, answer: 'going' })]);
    expect(mine.officer).toEqual({ toReceive: [], overdue: [] });

    // Handing in moves a block off my list and onto the officers'.
    const [first] = await myBlocks(g.member.agent, swap.id);
    await g.member.agent.post(`/api/blocks/${first!.id}/sewn`).send({}).expect(200);
    await g.member.agent.post(`/api/blocks/${first!.id}/handed-in`).send({ how: 'in-person' }).expect(200);
    const after = await next(g.member.agent);
    expect(after.blocksOwed.find((s) => s.swapId === swap.id)!.blocks).toHaveLength(1);
    const officer = await next(g.coordinator.agent);
    expect(officer.officer.toReceive).toEqual([expect.objectContaining({ swapId: swap.id, count: 1 })]);
    // A stranger sees none of it.
    const stranger = await next(g.stranger.agent);
    expect(stranger.blocksOwed).toEqual([]);
    expect(stranger.officer.toReceive).toEqual([]);
  });

  it('lists a swap past its due date for officers, with the blocks still owed', async () => {
    const late = await sewingSwap(app, g, { pledges: [1, 1] });
    await app.deps.sequelize.query(
      `UPDATE swaps SET due_at = now() - interval '2 days', signup_closes_at = now() - interval '9 days' WHERE id = $id`,
      {
        bind: { id: late.swap.id },
      },
    );
    const officer = await next(g.admin.agent);
    expect(officer.officer.overdue).toEqual([expect.objectContaining({ swapId: late.swap.id, count: 2 })]);
    expect((await next(g.member.agent)).officer.overdue).toEqual([]);
  });

  it('counts chat messages from others since I last looked, and forgets them once I have', async () => {
    const swap = await createSwap(g.coordinator.agent, g.guildId, { title: 'Chatty Churn Dash' });
    await move(g.coordinator.agent, swap.id, 'signup');
    const room = (await g.member.agent.get(`/api/swaps/${swap.id}/chat`).expect(200)).body as { id: number };
    await g.coordinator.agent.post(`/api/chat/rooms/${room.id}/messages`).field('body', 'Fabric pull on Saturday').expect(201);
    await g.coordinator.agent.post(`/api/chat/rooms/${room.id}/messages`).field('body', 'Bring your rulers').expect(201);
    await g.member.agent.post(`/api/chat/rooms/${room.id}/messages`).field('body', 'I will be there').expect(201);

    const before = await next(g.member.agent);
    expect(before.unreadRooms.find((r) => r.roomId === room.id)).toMatchObject({
      kind: 'swap',
      ownerId: swap.id,
      title: 'Chatty Churn Dash',
      unread: 2,
    });

    const seen = await g.member.agent.put(`/api/me/rooms/${room.id}/seen`).expect(200);
    expect(seen.body).toMatchObject({ roomId: room.id, seenAt: expect.any(String) });
    await g.member.agent.put(`/api/me/rooms/${room.id}/seen`).send({ when: 'yesterday' }).expect(400);
    expect((await next(g.member.agent)).unreadRooms.find((r) => r.roomId === room.id)).toBeUndefined();
    // Only someone who may read the room can mark it.
    await g.stranger.agent.put(`/api/me/rooms/${room.id}/seen`).expect(404);
    await g.member.agent.put('/api/me/rooms/999999/seen').expect(404);
    await g.member.agent.put('/api/me/rooms/nope/seen').expect(400);
  });
});
