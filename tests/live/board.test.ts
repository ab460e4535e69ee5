import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BoardChange, BoardJoined } from '../../shared/live-events';
import type { RosterDto } from '../../shared/swap-types';
import type { RunningServer } from '../../server/index';
import {
  collect,
  connect,
  connected,
  liveGuild,
  nextEvent,
  pause,
  request,
  startNode,
  type ClientSocket,
  type Person,
} from './live-helpers';
import { collectingSwap, receiveAndMeasure, swapBody } from './swap-setup';

let node: RunningServer;
let g: Awaited<ReturnType<typeof liveGuild>>;
let swapId: number;
let blockIds: Map<number, number[]>;
const sockets: ClientSocket[] = [];

async function viewer(person: Person) {
  const socket = await connected(connect(node.url, person));
  sockets.push(socket);
  return socket;
}

async function joinBoard(socket: ClientSocket, id = swapId) {
  const answer = await request<BoardJoined>(socket, 'board:join', { swapId: id });
  if ('error' in answer) throw new Error(answer.error.message);
  return answer.data;
}

beforeAll(async () => {
  node = await startNode();
  g = await liveGuild(node.url);
  ({ swapId, blockIds } = await collectingSwap(g.coordinator, g.guildId, [g.member, g.coordinator]));
});
afterAll(async () => {
  for (const s of sockets) s.disconnect();
  await node?.close();
});

describe('live swap board', () => {
  it('sends a change made through the REST API to every viewer, numbered after the version they joined at', async () => {
    const watchers = await Promise.all([viewer(g.admin), viewer(g.coordinator), viewer(g.member)]);
    await pause(300); // the set-up's last change leaves its 50 ms coalescing window before anyone joins
    const joinedAt = await Promise.all(watchers.map((s) => joinBoard(s)));
    expect(joinedAt.map((j) => j.version)).toEqual([joinedAt[0]!.version, joinedAt[0]!.version, joinedAt[0]!.version]);
    // The set-up's last change may still be in its 50 ms coalescing window: let it land first.
    const seen: number[] = [];
    const track = (c: BoardChange) => void (c.swapId === swapId && seen.push(c.version));
    for (const s of watchers) s.on('board:changed', track);
    await pause(300);
    for (const s of watchers) s.off('board:changed', track);
    const version = Math.max(joinedAt[0]!.version, ...seen);

    const arriving = watchers.map((s) => nextEvent(s, 'board:changed', (c) => c.swapId === swapId && c.version > version));
    const blockId = blockIds.get(g.member.id)![0]!;
    await g.coordinator.api('POST', `/blocks/${blockId}/received`, {});
    const changes = await Promise.all(arriving);

    for (const change of changes) {
      expect(change.version).toBe(version + 1);
      expect(change.patch?.complete).toBe(false);
      expect(change.patch?.rows.map((r) => r.userId)).toEqual([g.member.id]);
      expect(change.patch?.rows[0]).toMatchObject({ received: 1, handedIn: 1, owed: 1 });
      expect(change.patch?.rows[0]?.blocks.find((b) => b.id === blockId)?.state).toBe('received');
      expect(change.patch?.totals).toMatchObject({ pledged: 4, received: 1 });
      expect(change.activities).toEqual([
        expect.objectContaining({
          kind: 'block.changed',
          actor: { userId: g.coordinator.id, displayName: 'Cora Coordinator' },
          subject: { userId: g.member.id, displayName: 'Milo Member' },
          detail: expect.objectContaining({ to: 'received', sequence: 1 }),
        }),
      ]);
    }
    // The roster the REST API gives agrees with the patch.
    const roster = (await g.member.api<RosterDto>('GET', `/swaps/${swapId}/roster`)).body;
    expect(roster.rows.find((r) => r.userId === g.member.id)).toMatchObject(changes[0]!.patch!.rows[0]!);
  });

  it('gives each change the next number and carries the verdict of a measurement', async () => {
    // An officer: with the guild's default, members are not sent other makers' verdicts (board-verdicts.test.ts).
    const socket = await viewer(g.admin);
    const { version } = await joinBoard(socket);
    const seen = collect(socket, 'board:changed');
    const blockId = blockIds.get(g.coordinator.id)![0]!;
    await receiveAndMeasure(g.coordinator, blockId, '9 1/4', '9 1/2');
    await nextEvent(socket, 'board:changed', (c) => c.activities.some((a) => a.kind === 'block.measured'));
    const versions = seen.map((c) => c.version);
    expect(versions).toEqual(versions.map((_, i) => version + 1 + i));
    const last = seen.at(-1)!;
    const row = last.patch!.rows.find((r) => r.userId === g.coordinator.id)!;
    expect(row.blocks.find((b) => b.id === blockId)).toMatchObject({ state: 'measured', verdict: 'short' });
    expect(last.patch!.totals.verdicts.short).toBe(1);
  });

  it('sends the whole roster when the swap itself changes', async () => {
    const socket = await viewer(g.admin);
    await joinBoard(socket);
    const arriving = nextEvent(socket, 'board:changed', (c) => c.activities.some((a) => a.kind === 'swap.updated'));
    const res = await g.coordinator.api('PATCH', `/swaps/${swapId}`, { title: 'Harvest Stripes, spring round' });
    expect(res.status).toBe(200);
    const change = await arriving;
    expect(change.patch).toMatchObject({
      complete: true,
      swap: { id: swapId, state: 'collecting', title: 'Harvest Stripes, spring round' },
    });
    expect(change.patch!.rows.map((r) => r.userId).sort()).toEqual([g.member.id, g.coordinator.id].sort());
  });

  it('keeps what happened for the activity list, newest first', async () => {
    const res = await g.member.api<BoardChange['activities']>('GET', `/swaps/${swapId}/activity?limit=5`);
    expect(res.status).toBe(200);
    expect(res.body.length).toBe(5);
    expect(res.body.map((a) => a.id)).toEqual([...res.body.map((a) => a.id)].sort((a, b) => b - a));
    expect(res.body[0]).toMatchObject({ kind: 'swap.updated', actor: { userId: g.coordinator.id } });
    expect((await g.stranger.api('GET', `/swaps/${swapId}/activity`)).status).toBe(404);
  });

  it('refuses a foreign-guild user and sends them nothing', async () => {
    const socket = await viewer(g.stranger);
    const seen = collect(socket, 'board:changed');
    const answer = await request<BoardJoined>(socket, 'board:join', { swapId });
    expect(answer).toEqual({ error: { code: 'not_found', message: 'That swap does not exist.' } });
    const watcher = await viewer(g.member);
    await joinBoard(watcher);
    const arriving = nextEvent(watcher, 'board:changed');
    await g.coordinator.api('POST', `/blocks/${blockIds.get(g.member.id)![1]!}/received`, {});
    await arriving;
    await pause(100);
    expect(seen).toEqual([]);
  });

  it('hides a draft swap from members and validates every payload', async () => {
    const draft = (await g.coordinator.api<{ id: number }>('POST', `/guilds/${g.guildId}/swaps`, swapBody('Quiet draft'))).body;
    const socket = await viewer(g.member);
    const hidden = await request(socket, 'board:join', { swapId: draft.id });
    expect(hidden).toMatchObject({ error: { code: 'not_found' } });
    const officer = await viewer(g.coordinator);
    expect(await request(officer, 'board:join', { swapId: draft.id })).toMatchObject({ data: { version: expect.any(Number) } });

    const wrong = await request(socket, 'board:join', { swapId: '7' });
    expect(wrong).toMatchObject({ error: { code: 'validation', fields: { swapId: expect.any(String) } } });
    const extra = await request(socket, 'board:join', { swapId, room: 'g1:board:1' });
    expect(extra).toMatchObject({ error: { code: 'validation' } });
    expect(await request(socket, 'board:join', null)).toMatchObject({ error: { code: 'validation' } });
  });

  it('shows who is viewing, and updates when someone leaves', async () => {
    const first = await viewer(g.admin);
    await joinBoard(first);
    const second = await viewer(g.member);
    const withBoth = nextEvent(
      first,
      'presence:changed',
      (p) => p.room.kind === 'board' && p.viewers.some((v) => v.userId === g.member.id),
    );
    const joined = await joinBoard(second);
    expect(joined.viewers.map((v) => v.userId)).toEqual(expect.arrayContaining([g.admin.id, g.member.id]));
    expect((await withBoth).room).toEqual({ kind: 'board', swapId });

    // Every other socket of the member leaves too, so the member is gone from the list.
    const memberGone = nextEvent(first, 'presence:changed', (p) => !p.viewers.some((v) => v.userId === g.member.id));
    for (const s of sockets) if (s !== first && s.io.opts.extraHeaders?.cookie === g.member.cookie) s.disconnect();
    await memberGone;
  });

  it('closes the rooms of someone removed from the guild', async () => {
    const leaver = await (await import('./live-helpers')).addMember(node.url, g.guildId, 'member', 'Lee Leaving');
    const socket = await viewer(leaver);
    await joinBoard(socket);
    const seen = collect(socket, 'board:changed');
    const left = nextEvent(socket, 'guild:left');
    expect((await g.admin.api('DELETE', `/guilds/${g.guildId}/members/${leaver.id}`)).status).toBe(204);
    expect(await left).toEqual({ guildId: g.guildId });
    const watcher = await viewer(g.admin);
    await joinBoard(watcher);
    const arriving = nextEvent(watcher, 'board:changed');
    await g.coordinator.api('PATCH', `/swaps/${swapId}`, { title: 'Harvest Stripes (late blocks welcome)' });
    await arriving;
    await pause(100);
    expect(seen).toEqual([]);
    expect(await request(socket, 'board:join', { swapId })).toMatchObject({ error: { code: 'not_found' } });
  });
});
