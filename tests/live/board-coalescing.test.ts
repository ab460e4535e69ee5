/**
 * The board's fan-out under a burst: many measurements at once make a few board changes, at most one
 * per swap per interval on this node, numbered without a gap, and together they carry every change.
 * The fan-out sends to a recording stand-in for socket.io, so the times are those of the sending.
 */
import { performance } from 'node:perf_hooks';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BoardChange, BoardPatch } from '../../shared/live-events';
import type { RosterDto } from '../../shared/swap-types';
import { BOARD_CHANGE_INTERVAL_MS, BoardFanout } from '../../server/board/board-fanout';
import type { SwapEvent } from '../../server/board/board-activity';
import type { LiveServer } from '../../server/live/live-types';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { boardRoom, boardViewerRoom } from '../../server/live/rooms';
import { boardVersion } from '../../server/board/board-fanout';
import { move, myBlocks, sewingSwap, type Roles } from '../api/swaps-support';

let app: TestApp;
let roles: Roles;
beforeAll(async () => {
  app = await createTestApp();
  roles = await guildWithRoles(app);
});
afterAll(() => app.close());

/**
 * Records what the board's officers are sent on this node (with the guild's default, members get
 * copies without verdicts), and what is published once per change to the other nodes. Every room
 * has someone in it, and one other node listens.
 */
function recordingIo() {
  const sent: { at: number; room: string; change: BoardChange }[] = [];
  const published: BoardChange[] = [];
  const ignored = { emit: () => undefined };
  const local = {
    to: (room: string) => ({
      emit: (_event: string, change: BoardChange) => {
        if (room.includes(':board-officers:')) sent.push({ at: performance.now(), room, change });
      },
      except: () => ({ ...ignored, except: () => ignored }),
    }),
  };
  const adapter = { rooms: { get: () => new Set(['a socket']) } };
  const io = {
    local,
    of: () => ({ adapter }),
    on: () => undefined,
    serverSideEmit: (_event: string, message: { change: BoardChange }) => void published.push(message.change),
  };
  return { io: io as unknown as LiveServer, sent, published };
}

describe('board fan-out under a burst', () => {
  it('sends at most one change per interval, numbered without a gap, carrying every changed row', async () => {
    const { swap, makers } = await sewingSwap(app, roles, { pledges: [4, 4, 4] });
    await move(roles.coordinator.agent, swap.id, 'collecting');
    const blocks = (await Promise.all(makers.map((m) => myBlocks(m.agent, swap.id)))).flat();
    for (const b of blocks) await roles.coordinator.agent.post(`/api/blocks/${b.id}/received`).send({}).expect(200);

    const { io, sent, published } = recordingIo();
    const fanout = new BoardFanout(io, app.deps, app.deps.pool);
    app.deps.events.onAny((name, payload) => {
      if ((payload as { swapId?: unknown }).swapId === swap.id) fanout.push({ name, payload } as SwapEvent);
    });

    const started = performance.now();
    await Promise.all(
      blocks.map((b) =>
        roles.coordinator.agent.post(`/api/blocks/${b.id}/measurements`).send({ width: '9 1/2', height: '9 1/2' }).expect(201),
      ),
    );
    const measuredActivities = () => sent.flatMap((s) => s.change.activities).filter((a) => a.kind === 'block.measured');
    await expect.poll(() => measuredActivities().length, { timeout: 10_000 }).toBe(blocks.length);
    const elapsed = performance.now() - started;

    // Coalesced: far fewer changes than measurements, and none bunched together. The pacing's own clock
    // keeps them an interval apart (exactly, on fake timers: tests/unit/change-pacing.test.ts); the times
    // here are taken at the emit, which a pause of this busy process (a collection, another suite) can
    // shift by several milliseconds either way.
    expect(sent.length).toBeLessThan(blocks.length);
    expect(sent.length).toBeLessThanOrEqual(1 + Math.ceil(elapsed / BOARD_CHANGE_INTERVAL_MS));
    for (let i = 1; i < sent.length; i++)
      expect(sent[i]!.at - sent[i - 1]!.at).toBeGreaterThanOrEqual(BOARD_CHANGE_INTERVAL_MS / 2);

    // One message per change to the other nodes, whatever the kinds of viewer.
    expect(published.map((c) => c.version)).toEqual(sent.map((s) => s.change.version));

    // Numbered without a gap, each measurement told exactly once, each change carrying its makers' rows.
    expect(sent.map((s) => s.change.version)).toEqual(sent.map((_, i) => sent[0]!.change.version + i));
    expect(
      measuredActivities()
        .map((a) => a.blockId)
        .sort(),
    ).toEqual(blocks.map((b) => b.id).sort());
    for (const { change } of sent) {
      const subjects = new Set(change.activities.map((a) => a.subject?.userId));
      for (const userId of subjects) expect(change.patch!.rows.map((r) => r.userId)).toContain(userId);
    }

    // Applied in order, the changes leave the board where the roster is.
    const roster = (await roles.coordinator.agent.get(`/api/swaps/${swap.id}/roster`).expect(200)).body as RosterDto;
    const board = new Map<number, BoardPatch['rows'][number]>();
    for (const { change } of sent) for (const row of change.patch!.rows) board.set(row.userId, row);
    // The roster answers coordinators with addresses; the board never carries them.
    for (const { mailingAddress: _address, ...row } of roster.rows) expect(board.get(row.userId)).toEqual(row);
    expect(sent.at(-1)!.change.patch!.totals).toEqual(roster.totals);
  });

  it('makes no copy for a room nobody on this node is in, but always publishes the change for other nodes', async () => {
    const { swap, makers } = await sewingSwap(app, roles, { pledges: [2, 2] });
    await move(roles.coordinator.agent, swap.id, 'collecting');
    const [mine, theirs] = await Promise.all(makers.map((m) => myBlocks(m.agent, swap.id)));
    for (const b of [...mine!, ...theirs!])
      await roles.coordinator.agent.post(`/api/blocks/${b.id}/received`).send({}).expect(200);

    // A stand-in that records the rooms sent to; only the rooms in `occupied` have a socket in them.
    const occupied = new Set<string>();
    const emitted: string[] = [];
    const published: unknown[] = [];
    const target = (room: string): object => ({ emit: () => void emitted.push(room), except: () => target(room) });
    const adapter = {
      rooms: { get: (room: string) => (occupied.has(room) ? new Set(['a socket']) : undefined) },
    };
    const io = {
      local: { to: target },
      of: () => ({ adapter }),
      on: () => undefined,
      serverSideEmit: (...a: unknown[]) => published.push(a),
    };
    const fanout = new BoardFanout(io as unknown as LiveServer, app.deps, app.deps.pool);
    app.deps.events.onAny((name, payload) => {
      if ((payload as { swapId?: unknown }).swapId === swap.id) fanout.push({ name, payload } as SwapEvent);
    });
    const measure = async (blockId: number) => {
      const before = await boardVersion(app.deps.sequelize, swap.id);
      await roles.coordinator.agent
        .post(`/api/blocks/${blockId}/measurements`)
        .send({ width: '9 1/2', height: '9 1/2' })
        .expect(201);
      await expect.poll(() => boardVersion(app.deps.sequelize, swap.id), { timeout: 5_000 }).toBeGreaterThan(before);
      await new Promise((r) => setTimeout(r, 20)); // the change is sent just after its commit
    };

    // Nobody watching here: the change is numbered and published once for the other nodes (whose
    // list comes from heartbeats a busy process can miss), but no copy is made on this node.
    await measure(mine![0]!.id);
    expect(emitted).toEqual([]);
    expect(published).toHaveLength(1);

    // A member watches (the guild keeps verdicts to officers): the board's copy without verdicts is
    // made, and the maker's own copy only once the maker watches too.
    const board = boardRoom(roles.guildId, swap.id);
    occupied.add(board);
    await measure(theirs![0]!.id);
    expect(emitted).toEqual([board]);
    occupied.add(boardViewerRoom(roles.guildId, swap.id, makers[1]!.id));
    await measure(theirs![1]!.id);
    expect(emitted).toEqual([board, board, boardViewerRoom(roles.guildId, swap.id, makers[1]!.id)]);
    // One message per change for the other nodes, whoever watches here.
    expect(published).toHaveLength(3);
  });

  it('logs a change whose sending failed and goes on sending the swap’s later changes', async () => {
    const { swap, makers } = await sewingSwap(app, roles, { pledges: [2] });
    await move(roles.coordinator.agent, swap.id, 'collecting');
    const blocks = await myBlocks(makers[0]!.agent, swap.id);
    for (const b of blocks) await roles.coordinator.agent.post(`/api/blocks/${b.id}/received`).send({}).expect(200);

    const { io, sent } = recordingIo();
    let failures = 0;
    const sendOnce = io.local.to.bind(io.local);
    // The first change's copy for the officers throws, as a broken socket layer would.
    (io.local as { to: typeof io.local.to }).to = (room: string) => {
      if (room.includes(':board-officers:') && failures++ === 0) throw new Error('the socket layer failed');
      return sendOnce(room);
    };
    const errors: unknown[] = [];
    const logger = Object.assign(Object.create(app.deps.logger) as typeof app.deps.logger, {
      error: (...args: unknown[]) => void errors.push(args),
    });
    const fanout = new BoardFanout(io, { ...app.deps, logger }, app.deps.pool);
    app.deps.events.onAny((name, payload) => {
      if ((payload as { swapId?: unknown }).swapId === swap.id) fanout.push({ name, payload } as SwapEvent);
    });

    for (const b of blocks) {
      await roles.coordinator.agent
        .post(`/api/blocks/${b.id}/measurements`)
        .send({ width: '9 1/2', height: '9 1/2' })
        .expect(201);
      await new Promise((r) => setTimeout(r, 2 * BOARD_CHANGE_INTERVAL_MS));
    }
    await expect.poll(() => sent.length, { timeout: 5_000 }).toBe(1);
    expect(errors).toHaveLength(1);
    expect(sent[0]!.change.activities.map((a) => a.blockId)).toEqual([blocks[1]!.id]);
  });
});
