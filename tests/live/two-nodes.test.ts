import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BoardJoined, ChatJoined } from '../../shared/live-events';
import type { ChatMessageDto } from '../../shared/schemas/chat';
import type { SewDayDetailDto } from '../../shared/schemas/sewdays';
import type { RunningServer } from '../../server/index';
import { createTestDatabase } from '../helpers/test-app';
import {
  connect,
  connected,
  liveGuild,
  nextEvent,
  onNode,
  pause,
  request,
  startNode,
  type ClientSocket,
  type Person,
} from './live-helpers';
import { collectingSwap } from './swap-setup';

// Two app processes' worth of servers on one database: sessions and rooms are shared through PostgreSQL.
let nodeA: RunningServer;
let nodeB: RunningServer;
let g: Awaited<ReturnType<typeof liveGuild>>;
const sockets: ClientSocket[] = [];

async function socketOn(node: RunningServer, person: Person) {
  const socket = await connected(connect(node.url, person));
  sockets.push(socket);
  return socket;
}

beforeAll(async () => {
  const databaseUrl = await createTestDatabase();
  nodeA = await startNode(databaseUrl);
  nodeB = await startNode(databaseUrl);
  expect(nodeA.url).not.toBe(nodeB.url);
  g = await liveGuild(nodeA.url);
  // Each node's adapter starts LISTENing and announcing itself shortly after start.
  await pause(300);
});
afterAll(async () => {
  for (const s of sockets) s.disconnect();
  await nodeA?.close();
  await nodeB?.close();
});

/**
 * Joins the board and answers the version once changes still in their coalescing window have arrived,
 * and every change number the socket receives from the join on. The listener is on before the join is
 * asked for: a change sent just after the join's answer can arrive in the same read as that answer,
 * before code awaiting the answer runs (the app's own client listens first too).
 */
async function joinSettled(socket: ClientSocket, swapId: number): Promise<{ version: number; received: number[] }> {
  const received: number[] = [];
  socket.on('board:changed', (c) => {
    if (c.swapId === swapId) received.push(c.version);
  });
  const joined = await request<BoardJoined>(socket, 'board:join', { swapId });
  expect('data' in joined).toBe(true);
  await pause(300);
  return { version: Math.max('data' in joined ? joined.data.version : -1, ...received), received };
}

describe('two app nodes behind one database', () => {
  it('carries a board change made on node A to a viewer connected to node B', async () => {
    const { swapId, blockIds } = await collectingSwap(g.coordinator, g.guildId, [g.member]);
    const onB = await socketOn(nodeB, g.member);
    // The set-up's last change may still be in its 50 ms coalescing window: let it land first.
    const { version } = await joinSettled(onB, swapId);
    expect(version).toBeGreaterThan(0);

    // The change that carries the received block, whatever else the coalescing window grouped.
    const arriving = nextEvent(
      onB,
      'board:changed',
      (c) => c.swapId === swapId && Boolean(c.patch?.rows.some((r) => r.userId === g.member.id && r.received === 1)),
    );
    const res = await g.coordinator.api('POST', `/blocks/${blockIds.get(g.member.id)![0]}/received`, {});
    expect(res.status).toBe(200);
    const change = await arriving;
    expect(change.version).toBeGreaterThan(version);
    expect(change.patch?.rows.find((r) => r.userId === g.member.id)).toMatchObject({ userId: g.member.id, received: 1 });
  });

  it('numbers changes from one counter whichever node makes them', async () => {
    const { swapId, blockIds } = await collectingSwap(g.coordinator, g.guildId, [g.member, g.coordinator]);
    const coordinatorOnB = onNode(g.coordinator, nodeB.url);
    const watcher = await socketOn(nodeA, g.admin);
    const { version: start, received } = await joinSettled(watcher, swapId);
    const before = received.length; // the changes received from here on are the four made below
    // Alternate the node that makes the change.
    await g.coordinator.api('POST', `/blocks/${blockIds.get(g.member.id)![0]}/received`, {});
    await coordinatorOnB.api('POST', `/blocks/${blockIds.get(g.member.id)![1]}/received`, {});
    await g.coordinator.api('POST', `/blocks/${blockIds.get(g.coordinator.id)![0]}/received`, {});
    await coordinatorOnB.api('POST', `/blocks/${blockIds.get(g.coordinator.id)![1]}/received`, {});
    for (let i = 0; i < 50 && received.length - before < 4; i += 1) await pause(50);
    await pause(300); // a change still in its 50 ms coalescing window arrives too
    // One counter for both nodes: every number once, none skipped, however the burst was grouped.
    const sorted = received.slice(before).sort((a, b) => a - b);
    expect(sorted.length).toBeGreaterThanOrEqual(1);
    expect(sorted).toEqual(sorted.map((_, i) => start + 1 + i));
  });

  it('carries a chat message sent on node A to a reader on node B, and shows presence across both', async () => {
    const year = new Date().getUTCFullYear() + 1;
    const sewDay = (
      await g.coordinator.api<SewDayDetailDto>('POST', `/guilds/${g.guildId}/sew-days`, {
        title: 'Hand-quilting evening',
        startsAt: `${year}-09-12T18:00`,
        endsAt: `${year}-09-12T21:00`,
        videoUrl: 'https://video.example.org/evening',
      })
    ).body;
    const roomId = sewDay.chatRoomId!;
    const reader = await socketOn(nodeB, g.admin);
    await request<ChatJoined>(reader, 'chat:join', { roomId });
    const writer = await socketOn(nodeA, g.member);
    const joined = await request<ChatJoined>(writer, 'chat:join', { roomId });
    expect('data' in joined && joined.data.viewers.map((v) => v.userId).sort()).toEqual([g.admin.id, g.member.id].sort());

    const arriving = nextEvent(reader, 'message:created');
    const sent = await request<ChatMessageDto>(writer, 'message:send', { roomId, body: 'Starting on the border tonight' });
    expect(await arriving).toEqual('data' in sent ? sent.data : null);

    const typing = nextEvent(reader, 'typing:started');
    writer.emit('typing:start', { roomId });
    expect((await typing).user.userId).toBe(g.member.id);
  });
});
