/** Who sees which chat room, and a swap's room opened once however many people open it at once. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { createSwap, move, type Roles } from './swaps-support';

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
