import type pg from 'pg';
import { QueryTypes } from 'sequelize';
import type { BoardChange, BoardPatch } from '@shared/live-events';
import type { RosterRowDto } from '@shared/swap-types';
import { Swap } from '../db/models';
import { buildRoster, membersFromChunks, rosterPartFrom, type RosterData, type RosterPartRow } from './roster.service';
import type { AppDeps } from '../deps';
import type { LiveServer } from '../live/live-types';
import { activityDtos, activityLinesJson, type SwapEvent } from './board-activity';
import { BOARD_VERSION, bumpVersion, RECORD_ACTIVITY, ROSTER_CHUNKS, ROSTER_PART_POSITIONAL } from './board.queries';
import { oneTripTransaction, type TripStatement } from '../db/one-trip';
import { boardOfficersRoom, boardRoom, boardViewerRoom } from '../live/rooms';
import { swapColumns } from '../swaps/swaps.queries';
import { activitiesForMember, rosterForMember } from '../blocks/verdict-visibility';
import { buildFromRow } from '../db/model-columns';
import { paceChanges } from './change-pacing';

const FOREIGN_KEY_VIOLATION = '23503';

// Changes to the swap as a whole (its state, a redistribution) touch every row.
const WHOLE_BOARD = new Set(['swap.created', 'swap.updated', 'swap.transitioned', 'distribution.confirmed']);

function affectedUser(event: SwapEvent): number | null {
  const p = event.payload as Record<string, unknown>;
  const id = p.userId ?? p.makerId;
  return typeof id === 'number' ? id : null;
}

/** The members whose rows the batch touched; null when the swap as a whole changed. */
function affectedUsers(batch: SwapEvent[]): number[] | null {
  if (batch.some((e) => WHOLE_BOARD.has(e.name))) return null;
  return [...new Set(batch.map(affectedUser).filter((id): id is number => id !== null))];
}

/**
 * The change's patch from the rows read for it: every row when the swap as a whole changed, else the
 * touched rows that are still on the board and the touched members that left it.
 */
function patchFor(roster: RosterData, affected: number[] | null): BoardPatch {
  const rows = roster.rows.map(({ email: _email, ...row }): RosterRowDto => row);
  if (!affected) return { swap: roster.swap, totals: roster.totals, rows, removedUserIds: [], complete: true };
  const removedUserIds = affected.filter((id) => !rows.some((r) => r.userId === id));
  return { swap: roster.swap, totals: roster.totals, rows, removedUserIds, complete: false };
}

/** The shortest time between two board changes of one swap sent by one node, in milliseconds. */
export const BOARD_CHANGE_INTERVAL_MS = 50;

/**
 * Turns committed swap events into board changes. Events of one swap are handled one batch at a time,
 * and a node sends at most one change per swap per `intervalMs`: the first event after a quiet spell
 * goes out at once, and whatever arrives meanwhile goes out as one change carrying every row it
 * touched once the interval has passed, read a little ahead so that it is ready then (change-pacing.ts;
 * a meeting night's burst of measurements makes a few changes a second, not one per block). Each
 * change takes the next number from the swap's counter in PostgreSQL and holds that row lock while the
 * roster is read, so on every node a higher number always carries a later state.
 */
export class BoardFanout {
  private queues = new Map<number, SwapEvent[]>();
  /** the swaps' drains under way, which `close` waits for */
  private draining = new Set<Promise<void>>();

  /**
   * @param db the fan-out's own small pool (see `readChange`), with the plain pool's settings.
   */
  constructor(
    private io: LiveServer,
    private deps: Pick<AppDeps, 'sequelize' | 'pool' | 'logger'>,
    private db: pg.Pool,
    private intervalMs = BOARD_CHANGE_INTERVAL_MS,
  ) {
    io.on('board:fanout', ({ guildId, verdictsVisibleTo, change }) => this.sendLocal(guildId, verdictsVisibleTo, change));
  }

  push(event: SwapEvent) {
    const swapId = event.payload.swapId;
    const queued = this.queues.get(swapId);
    if (queued) {
      queued.push(event);
      return;
    }
    this.queues.set(swapId, [event]);
    const drain = this.drain(swapId);
    this.draining.add(drain);
    void drain.finally(() => this.draining.delete(drain));
  }

  /**
   * Waits until every change already queued has gone out (at most one interval and a change per swap):
   * the other nodes' viewers hear of a change committed on this node only from this node.
   */
  async close() {
    while (this.draining.size > 0) await Promise.all(this.draining);
  }

  private drain(swapId: number) {
    return paceChanges(this.intervalMs, {
      take: () => {
        const batch = this.queues.get(swapId)!.splice(0);
        return batch.length > 0 ? batch : null;
      },
      read: (batch) =>
        this.changeFor(swapId, batch).catch((err: unknown) => {
          this.deps.logger.error({ err, swapId }, 'board change not sent');
          return null;
        }),
      send: ({ guildId, verdictsVisibleTo, change }) => {
        try {
          this.send(guildId, verdictsVisibleTo, change);
        } catch (err) {
          this.deps.logger.error({ err, swapId }, 'board change not sent');
        }
      },
      stopped: () => this.queues.delete(swapId),
    });
  }

  private async changeFor(swapId: number, batch: SwapEvent[]) {
    const affected = affectedUsers(batch);
    const result = await this.readChange(swapId, batch, affected);
    if (!result) return null;
    const change: BoardChange = {
      swapId,
      version: result.version,
      activities: result.activities,
      patch: patchFor(result.roster, affected),
    };
    return { guildId: result.swap.guildId, verdictsVisibleTo: result.verdictsVisibleTo, change };
  }

  /**
   * Numbers and reads a change in one round trip on the fan-out's own connection: the next number
   * with the swap, the activity lines, and the touched rows with the totals (every row when the swap
   * as a whole changed), in one transaction (`oneTripTransaction`). The number's row lock is taken
   * first and held while the rows are read, so a higher number always carries a later state.
   */
  private async readChange(swapId: number, batch: SwapEvent[], affected: number[] | null) {
    const lines = activityLinesJson(batch);
    const statements: TripStatement[] = [
      { name: 'fanout_bump', text: bumpVersion(swapColumns()), values: [swapId] },
      ...(lines ? [{ name: 'fanout_activity', text: RECORD_ACTIVITY, values: [lines, new Date()] }] : []),
      affected
        ? { name: 'fanout_rows', text: ROSTER_PART_POSITIONAL, values: [swapId, affected] }
        : { name: 'fanout_roster_chunks', text: ROSTER_CHUNKS, values: [swapId] },
    ];
    const answered = await oneTripTransaction(this.db, statements).catch((error: { code?: string }) => {
      if (error.code === FOREIGN_KEY_VIOLATION) return null; // the swap was deleted since
      throw error;
    });
    const bumped = answered?.[0]?.[0];
    if (!answered || !bumped) return null; // nobody's board shows a deleted swap any more
    const { version, verdictsVisibleTo, ...values } = bumped as Record<string, unknown> & {
      version: string;
      verdictsVisibleTo: string;
    };
    const swap = buildFromRow(Swap, values);
    const read = answered[answered.length - 1]!;
    return {
      swap,
      version: Number(version),
      verdictsVisibleTo,
      activities: lines ? activityDtos(answered[1]!) : [],
      roster: affected
        ? rosterPartFrom(swap, read[0] as unknown as RosterPartRow)
        : await buildRoster(this.deps, swap, {
            withAddresses: false,
            members: membersFromChunks((read as { members: string }[]).map((r) => r.members)),
          }),
    };
  }

  /**
   * One message to the other nodes for the change, not one per kind of viewer: each node splits it
   * for its own sockets (through the PostgreSQL adapter every message is a NOTIFY and its encoding).
   * Always published, even while the adapter has heard of no other node: its list of nodes comes
   * from heartbeats, which a busy process can miss, and a change not sent is a board left stale.
   */
  private send(guildId: number, verdictsVisibleTo: string, change: BoardChange) {
    // This node's sockets first: they need not wait for the message's encoding for the other nodes.
    this.sendLocal(guildId, verdictsVisibleTo, change);
    this.io.serverSideEmit('board:fanout', { guildId, verdictsVisibleTo, change });
  }

  /**
   * Everyone on the board gets the change when the guild shows verdicts to all. Otherwise its officers
   * get it whole; each maker whose row changed gets a copy with only their own verdicts; every other
   * member a copy without verdicts. A change of every row reaches members with no patch, and their
   * board fetches its own roster (one message instead of one per member). socket.io encodes a message
   * before it looks who is in the room, so no copy is made for a room nobody on this node is in.
   */
  private sendLocal(guildId: number, verdictsVisibleTo: string, change: BoardChange) {
    const { swapId, patch } = change;
    const rooms = this.io.of('/').adapter.rooms;
    const occupied = (room: string) => (rooms.get(room)?.size ?? 0) > 0;
    const boardName = boardRoom(guildId, swapId);
    if (!occupied(boardName)) return;
    const local = this.io.local;
    const board = local.to(boardName);
    if (verdictsVisibleTo === 'guild') {
      board.emit('board:changed', change);
      return;
    }
    const officers = boardOfficersRoom(guildId, swapId);
    if (occupied(officers)) local.to(officers).emit('board:changed', change);
    const activities = (viewerId: number | null) => activitiesForMember(change.activities, viewerId);
    if (!patch || patch.complete) {
      board.except(officers).emit('board:changed', { ...change, activities: activities(null), patch: null });
      return;
    }
    const makers = patch.rows.map((r) => r.userId);
    const viewerRooms = makers.map((userId) => boardViewerRoom(guildId, swapId, userId));
    board
      .except([officers, ...viewerRooms])
      .emit('board:changed', { ...change, activities: activities(null), patch: rosterForMember(patch, null) });
    for (const [i, userId] of makers.entries()) {
      if (!occupied(viewerRooms[i]!)) continue;
      local
        .to(viewerRooms[i]!)
        .except(officers)
        .emit('board:changed', { ...change, activities: activities(userId), patch: rosterForMember(patch, userId) });
    }
  }
}

/** The swap's current change number (0 before its first change). */
export async function boardVersion(sequelize: AppDeps['sequelize'], swapId: number): Promise<number> {
  const [row] = await sequelize.query<{ version: string }>(BOARD_VERSION, {
    bind: { swapId },
    type: QueryTypes.SELECT,
  });
  return row ? Number(row.version) : 0;
}
