/**
 * Who sees which chat room, a swap's room opened once however many people open it at once, and the
 * limit on how fast one person posts, held when their posts arrive together.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { createSwap, move, type Roles } from './swaps-support';
import { picture } from '../fixtures/photos';
import { CHAT_RATE_LIMIT, CHAT_RATE_WINDOW_MS } from '../../shared/schemas/chat';

let app: TestApp;
let roles: Roles;

beforeAll(async () => {
  app = await createTestApp();
  roles = await guildWithRoles(app);
});

afterAll(async () => {
  await app.close();
});

describe('chat rooms', () => {
  it('keeps a draft swap’s room from members until the swap opens, as the swap itself is kept', async () => {
    const swap = await createSwap(roles.coordinator.agent, roles.guildId, { title: 'Scrappy Nine Patch' });
    const room = (await roles.coordinator.agent.get(`/api/swaps/${swap.id}/chat`).expect(200)).body as {
      id: number;
      title: string;
    };
    expect(room.title).toBe('Scrappy Nine Patch');

    for (const path of [`/api/chat/rooms/${room.id}`, `/api/chat/rooms/${room.id}/messages`]) {
      const hidden = await roles.member.agent.get(path).expect(404);
      expect(hidden.body.error.message).toBe('That chat room does not exist.');
      await roles.stranger.agent.get(path).expect(404);
      await roles.admin.agent.get(path).expect(200);
    }

    await move(roles.coordinator.agent, swap.id, 'signup');
    const seen = await roles.member.agent.get(`/api/chat/rooms/${room.id}`).expect(200);
    expect(seen.body).toMatchObject({
      id: room.id,
      kind: 'swap',
      title: 'Scrappy Nine Patch',
      canPost: true,
      canModerate: false,
    });
  });

  it('heads a sew day’s room with the sew day’s title', async () => {
    const nextYear = new Date().getFullYear() + 1;
    const sewDay = await roles.coordinator.agent
      .post(`/api/guilds/${roles.guildId}/sew-days`)
      .send({
        title: 'Half-square triangle marathon',
        startsAt: `${nextYear}-03-07T09:00`,
        endsAt: `${nextYear}-03-07T15:00`,
        place: 'Fire hall',
      })
      .expect(201);
    const room = await roles.admin.agent.get(`/api/chat/rooms/${sewDay.body.chatRoomId}`).expect(200);
    expect(room.body).toMatchObject({
      kind: 'sewday',
      title: 'Half-square triangle marathon',
      sewDayId: sewDay.body.id,
      canModerate: true,
    });
  });

  it('opens a swap’s room once when several people open it at the same moment', async () => {
    const swap = await createSwap(roles.coordinator.agent, roles.guildId, { title: 'Log Cabin Row' });
    await move(roles.coordinator.agent, swap.id, 'signup');
    const agents = [roles.member, roles.coordinator, roles.admin, roles.member, roles.coordinator, roles.admin];
    const answers = await Promise.all(agents.map(({ agent }) => agent.get(`/api/swaps/${swap.id}/chat`)));
    expect(answers.map((a) => a.status)).toEqual(agents.map(() => 200));
    const ids = new Set(answers.map((a) => (a.body as { id: number }).id));
    expect(ids.size).toBe(1);
    const { rows } = await app.deps.pool.query('SELECT id FROM chat_rooms WHERE swap_id = $1', [swap.id]);
    expect(rows).toEqual([{ id: [...ids][0] }]);
  });
});

describe('sending', () => {
  async function openRoom(title: string) {
    const swap = await createSwap(roles.coordinator.agent, roles.guildId, { title });
    await move(roles.coordinator.agent, swap.id, 'signup');
    return (await roles.coordinator.agent.get(`/api/swaps/${swap.id}/chat`).expect(200)).body.id as number;
  }

  it('takes exactly the limit of one person’s posts sent all at once, and says when the next may go', async () => {
    const roomId = await openRoom('Courthouse Steps');
    const bodies = Array.from({ length: CHAT_RATE_LIMIT + 4 }, (_, i) => `Strip ${i + 1} sewn`);
    const answers = await Promise.all(
      bodies.map((body) => roles.admin.agent.post(`/api/chat/rooms/${roomId}/messages`).send({ body })),
    );
    const taken = answers.filter((a) => a.status === 201);
    const refused = answers.filter((a) => a.status === 429);
    expect(taken).toHaveLength(CHAT_RATE_LIMIT);
    expect(refused).toHaveLength(4);
    for (const answer of refused) {
      expect(answer.body.error.code).toBe('rate_limited');
      const wait = Number(answer.body.error.fields.retryAfterSeconds);
      expect(wait).toBeGreaterThanOrEqual(1);
      expect(wait).toBeLessThanOrEqual(CHAT_RATE_WINDOW_MS / 1000);
      expect(answer.headers['retry-after']).toBe(String(wait));
    }
    // Each answer is the message as the history reads it back.
    const page = await roles.member.agent.get(`/api/chat/rooms/${roomId}/messages?limit=50`).expect(200);
    expect(page.body.messages).toHaveLength(CHAT_RATE_LIMIT);
    for (const answer of taken) {
      const stored = (page.body.messages as { id: number }[]).find((m) => m.id === answer.body.id);
      expect(stored).toEqual(answer.body);
    }
  });

  it('counts, under the person’s lock, the posts another node was still writing when theirs arrived', async () => {
    const roomId = await openRoom('Streak of Lightning');
    const author = roles.coordinator;
    // Another node holds the lock and is writing all but one of the limit's posts for the same person.
    const otherNode = await app.deps.pool.connect();
    try {
      await otherNode.query('BEGIN');
      await otherNode.query('SELECT pg_advisory_xact_lock(7314005, $1)', [author.id]);
      await otherNode.query(
        `INSERT INTO chat_messages (room_id, author_id, body, created_at, updated_at)
         SELECT $1, $2, 'from the other node', now(), now() FROM generate_series(1, $3)`,
        [roomId, author.id, CHAT_RATE_LIMIT - 1],
      );
      const posts = Promise.all(
        [1, 2, 3].map((n) => author.agent.post(`/api/chat/rooms/${roomId}/messages`).send({ body: `Lightning row ${n}` })),
      );
      await new Promise((resolve) => setTimeout(resolve, 300));
      await otherNode.query('COMMIT');
      const statuses = (await posts).map((a) => a.status).sort();
      expect(statuses).toEqual([201, 429, 429]);
    } finally {
      otherNode.release();
    }
  });

  it('answers 404, not a failure, when the room goes while a message to it waits its turn', async () => {
    const roomId = await openRoom('Flying Geese');
    const otherNode = await app.deps.pool.connect();
    try {
      await otherNode.query('BEGIN');
      await otherNode.query('SELECT pg_advisory_xact_lock(7314005, $1)', [roles.member.id]);
      // Started now (a supertest request waits to be awaited), to wait on the lock.
      const post = Promise.resolve(
        roles.member.agent.post(`/api/chat/rooms/${roomId}/messages`).send({ body: 'Geese all pointing north' }),
      );
      await new Promise((resolve) => setTimeout(resolve, 300));
      await otherNode.query('DELETE FROM chat_rooms WHERE id = $1', [roomId]);
      await otherNode.query('COMMIT');
      const answer = await post;
      expect(answer.status).toBe(404);
      expect(answer.body.error.message).toBe('This chat room was removed; the message was not sent.');
    } finally {
      otherNode.release();
    }
  });

  it('counts a message with photos like any other, and keeps no photo of a refused one', async () => {
    const roomId = await openRoom('Rail Fence');
    for (let i = 1; i < CHAT_RATE_LIMIT; i += 1)
      await roles.member.agent
        .post(`/api/chat/rooms/${roomId}/messages`)
        .send({ body: `Rail ${i}` })
        .expect(201);
    const withPhoto = await roles.member.agent
      .post(`/api/chat/rooms/${roomId}/messages`)
      .field('body', 'All ten rails pressed')
      .attach('photos', await picture('png', 300, 200), { filename: 'rails.png', contentType: 'image/png' })
      .expect(201);
    expect(withPhoto.body.photos).toHaveLength(1);
    const photosOf = async () =>
      (await app.deps.pool.query('SELECT count(*)::int AS n FROM photos WHERE uploaded_by_id = $1', [roles.member.id])).rows[0]
        .n as number;
    const before = await photosOf();
    const refused = await roles.member.agent
      .post(`/api/chat/rooms/${roomId}/messages`)
      .field('body', 'And the binding')
      .attach('photos', await picture('png', 300, 200), { filename: 'binding.png', contentType: 'image/png' })
      .expect(429);
    expect(refused.body.error.message).toMatch(/your message is still in the box/);
    expect(await photosOf()).toBe(before);
    const page = await roles.member.agent.get(`/api/chat/rooms/${roomId}/messages`).expect(200);
    expect(page.body.messages[0]).toEqual(withPhoto.body);
  });
});
