/**
 * The board's viewers for the burst benchmark, in a process of their own: on meeting night they are
 * phones and laptops around the room, not the intake stations' event loop, so neither set of clients
 * delays the other's timing here. Driven over the IPC channel by bench/live-burst.ts: `open` connects
 * and joins, `mark` starts counting from the version each viewer has reached, `progress` answers how
 * many measurement lines the slowest viewer has seen, `report` sends back what each viewer received.
 */
import { performance } from 'node:perf_hooks';
import type { BoardChange, BoardJoined } from '../shared/live-events';
import { ask, connect, type LiveClient as Client } from './lib/sockets';

/** One board change as a viewer received it, reduced to what the benchmark counts. */
export interface ReceivedChange {
  version: number;
  /** receipt time, ms since the epoch */
  at: number;
  /** the change's measurement lines: the block and when the line was written (ms since the epoch) */
  measured: { id: number; blockId: number; writtenAt: number }[];
}

export interface ViewerReport {
  joinedAt: number;
  changes: ReceivedChange[];
}

export type ViewersCommand =
  | { type: 'open'; url: string; swapId: number; cookies: string[]; count: number }
  | { type: 'mark' }
  | { type: 'progress' }
  | { type: 'report' };

export type ViewersAnswer =
  | { type: 'opened' }
  | { type: 'marked' }
  | { type: 'progress'; leastTold: number }
  | { type: 'report'; viewers: ViewerReport[]; cpuMs: number };

const now = () => performance.timeOrigin + performance.now();

const reduce = (change: BoardChange, at: number): ReceivedChange => ({
  version: change.version,
  at,
  measured: change.activities
    .filter((a) => a.kind === 'block.measured')
    .map((a) => ({ id: a.id, blockId: a.blockId!, writtenAt: Date.parse(a.at) })),
});

const sockets: Client[] = [];
const viewers: ViewerReport[] = [];
let cpuFrom = process.cpuUsage();
const send = (answer: ViewersAnswer) => process.send!(answer);
const told = (v: ViewerReport) => v.changes.reduce((n, c) => n + c.measured.length, 0);

process.on('message', (command: ViewersCommand) => {
  void (async () => {
    if (command.type === 'open') {
      for (let i = 0; i < command.count; i++) {
        const socket = await connect(command.url, command.cookies[i % command.cookies.length]!);
        const viewer: ViewerReport = { joinedAt: 0, changes: [] };
        socket.on('board:changed', (change) => void viewer.changes.push(reduce(change, now())));
        viewer.joinedAt = (await ask<BoardJoined>(socket, 'board:join', { swapId: command.swapId })).version;
        sockets.push(socket);
        viewers.push(viewer);
      }
      send({ type: 'opened' });
    } else if (command.type === 'mark') {
      for (const viewer of viewers) {
        viewer.joinedAt = viewer.changes.at(-1)?.version ?? viewer.joinedAt;
        viewer.changes = [];
      }
      cpuFrom = process.cpuUsage();
      send({ type: 'marked' });
    } else if (command.type === 'progress') {
      send({ type: 'progress', leastTold: Math.min(...viewers.map(told)) });
    } else {
      const cpu = process.cpuUsage(cpuFrom);
      for (const s of sockets) s.disconnect();
      // Out only once the report has gone: a large one takes more than a moment through the channel.
      process.send!({ type: 'report', viewers, cpuMs: (cpu.user + cpu.system) / 1000 } satisfies ViewersAnswer, () =>
        process.exit(0),
      );
    }
  })().catch((error: unknown) => {
    console.error(error);
    process.exit(1);
  });
});
