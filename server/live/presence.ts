import type { Viewer } from '@shared/live-events';
import type { Logger } from '../logger';
import type { LiveServer } from './live-types';
import { parseRoom } from './rooms';

/**
 * Who is in a room now, across every node (fetchSockets asks the other nodes through the adapter).
 * Announcements are coalesced per room, so 200 people arriving at once cause a few messages, not 200.
 */
export class Presence {
  private pending = new Map<string, NodeJS.Timeout>();

  constructor(
    private io: LiveServer,
    private logger: Logger,
    private delayMs = 60,
  ) {}

  async viewers(room: string): Promise<Viewer[]> {
    const sockets = await this.io.in(room).fetchSockets();
    const byUser = new Map<number, Viewer>();
    for (const s of sockets) if (s.data.user) byUser.set(s.data.user.userId, s.data.user);
    return [...byUser.values()].sort((a, b) => a.displayName.localeCompare(b.displayName));
  }

  /** Tells the room who is there, shortly, after people came or went. */
  announce(room: string) {
    const parsed = parseRoom(room);
    if (!parsed || this.pending.has(room)) return;
    const timer = setTimeout(() => {
      this.pending.delete(room);
      this.viewers(room).then(
        (viewers) => this.io.to(room).emit('presence:changed', { room: parsed.ref, viewers }),
        (err: unknown) => this.logger.warn({ err, room }, 'presence could not be gathered'),
      );
    }, this.delayMs);
    timer.unref();
    this.pending.set(room, timer);
  }

  close() {
    for (const timer of this.pending.values()) clearTimeout(timer);
    this.pending.clear();
  }
}
