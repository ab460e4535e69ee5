/**
 * A node that stops still sends the board changes it holds: the other nodes' viewers hear of a change
 * committed on a node only from that node (server/board/board-fanout.ts close).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BoardChange, BoardJoined } from '../../shared/live-events';
import type { RunningServer } from '../../server/index';
import { createTestDatabase } from '../helpers/test-app';
import { connect, connected, liveGuild, pause, request, startNode, type ClientSocket } from './live-helpers';
import { collectingSwap } from './swap-setup';

let nodeA: RunningServer;
let nodeB: RunningServer;
let viewer: ClientSocket | undefined;

beforeAll(async () => {
  const databaseUrl = await createTestDatabase();
  nodeA = await startNode(databaseUrl);
  nodeB = await startNode(databaseUrl);
});
afterAll(async () => {
  viewer?.disconnect();
  await nodeA?.close();
  await nodeB?.close();
});

describe('a node shutting down', () => {
  it('sends the board changes still in their coalescing window before it stops', async () => {
    const g = await liveGuild(nodeA.url);
    await pause(300); // each node's adapter starts listening shortly after start
    const { swapId, blockIds } = await collectingSwap(g.coordinator, g.guildId, [g.member]);
    viewer = await connected(connect(nodeB.url, g.admin));
    const changes: BoardChange[] = [];
    viewer.on('board:changed', (c) => void changes.push(c));
    const joined = await request<BoardJoined>(viewer, 'board:join', { swapId });
    expect('data' in joined).toBe(true);
    await pause(300); // the set-up's last change lands first

    // Two blocks received back to back on node A: the second waits out the first's 50 ms window...
    for (const blockId of blockIds.get(g.member.id)!) {
      expect((await g.coordinator.api('POST', `/blocks/${blockId}/received`, {})).status).toBe(200);
    }
    // ...and node A stops at once.
    await nodeA.close();

    const both = () => changes.some((c) => c.patch?.rows.some((r) => r.userId === g.member.id && r.received === 2));
    for (let i = 0; i < 40 && !both(); i++) await pause(50);
    expect(both()).toBe(true);
  });
});
