import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BoardChange, BoardJoined } from '../../shared/live-events';
import type { RunningServer } from '../../server/index';
import {
  addMember,
  connect,
  connected,
  liveGuild,
  nextEvent,
  request,
  startNode,
  type ClientSocket,
  type Person,
} from './live-helpers';
import { collectingSwap, receiveAndMeasure } from './swap-setup';

let node: RunningServer;
let g: Awaited<ReturnType<typeof liveGuild>>;
let other: Person;
let swapId: number;
let blockIds: Map<number, number[]>;
const sockets: ClientSocket[] = [];

async function watching(person: Person) {
  const socket = await connected(connect(node.url, person));
  sockets.push(socket);
  const answer = await request<BoardJoined>(socket, 'board:join', { swapId });
  if ('error' in answer) throw new Error(answer.error.message);
  return { socket, version: answer.data.version };
}

/** Measures `blockId` short while the coordinator, the block's maker and another member watch. */
async function measureWhileWatched(blockId: number) {
  const watchers = await Promise.all([watching(g.coordinator), watching(other), watching(g.member)]);
  const arriving = watchers.map(({ socket, version }) =>
    nextEvent(
      socket,
      'board:changed',
      (c: BoardChange) =>
        c.swapId === swapId &&
        c.version > version &&
        !!c.patch?.rows.some((r) => r.blocks.some((b) => b.id === blockId && b.state === 'measured')),
    ),
  );
  await receiveAndMeasure(g.coordinator, blockId, '9 1/4', '9 1/2');
  const [officer, maker, member] = await Promise.all(arriving);
  return { officer: officer!, maker: maker!, member: member! };
}

const blockIn = (change: BoardChange, userId: number, blockId: number) =>
  change.patch!.rows.find((r) => r.userId === userId)!.blocks.find((b) => b.id === blockId)!;

beforeAll(async () => {
  node = await startNode();
  g = await liveGuild(node.url);
  other = await addMember(node.url, g.guildId, 'member', 'Olive Other');
  ({ swapId, blockIds } = await collectingSwap(g.coordinator, g.guildId, [g.member, other], 2));
});
afterAll(async () => {
  for (const s of sockets) s.disconnect();
  await node?.close();
});

describe('verdicts on the live board', () => {
  it('sends other makers’ verdicts to officers only, and each maker their own', async () => {
    const blockId = blockIds.get(other.id)![0]!;
    const { officer, maker, member } = await measureWhileWatched(blockId);
    expect(blockIn(officer, other.id, blockId)).toMatchObject({ state: 'measured', verdict: 'short' });
    expect(blockIn(maker, other.id, blockId)).toMatchObject({ state: 'measured', verdict: 'short' });
    const seen = blockIn(member, other.id, blockId);
    expect(seen.state).toBe('measured');
    expect(seen).not.toHaveProperty('verdict');
    expect(member.patch!.rows.find((r) => r.userId === other.id)).not.toHaveProperty('verdicts');
  });

  it('sends every verdict to every member once the guild shows them to all', async () => {
    await g.admin.api('PATCH', `/guilds/${g.guildId}`, { verdictsVisibleTo: 'guild' });
    const blockId = blockIds.get(other.id)![1]!;
    const { member } = await measureWhileWatched(blockId);
    expect(blockIn(member, other.id, blockId)).toMatchObject({ state: 'measured', verdict: 'short' });
  });
});
