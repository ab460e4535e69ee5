/** What the session store read for one session id: the session's JSON text and its signed-in user. */
export interface CachedSession {
  /** the session row's `sess`, as text, parsed afresh for each request (handlers change it in place) */
  sess: string;
  /** the signed-in account's id, when there is one (to forget its sessions when the account changes) */
  userId: number | null;
  user: Express.User | null;
  /** when the session row expires (ms since the epoch) */
  expiresAt: number;
}

interface Entry extends CachedSession {
  readAt: number;
}

/** How long a session read from PostgreSQL is trusted without reading it again, in milliseconds. */
export const SESSION_CACHE_MS = 1_000;
const MAX_ENTRIES = 5_000;

/**
 * A node's short memory of the sessions it read, so a signed-in person's requests in the same second
 * do not each read their session row. A session ended on this node (sign-out, password reset or
 * change) is forgotten before the answer goes out; other nodes forget it when the live adapter's
 * message arrives (milliseconds), and at the latest after `SESSION_CACHE_MS` (the same bound #13 set
 * for an ended session's sockets). A read that began before a session was forgotten is used for its
 * own request but not kept, so a read racing a sign-out cannot put the ended session back.
 */
export class SessionCache {
  private entries = new Map<string, Entry>();
  /** bumped by every forget: a read that saw another epoch at its start is not kept */
  private epoch = 0;

  constructor(
    private ttlMs = SESSION_CACHE_MS,
    private now: () => number = Date.now,
  ) {}

  /** The session as read within the last `ttlMs`, unless it has expired since. */
  get(sid: string): CachedSession | undefined {
    const entry = this.entries.get(sid);
    if (!entry) return undefined;
    const now = this.now();
    if (now - entry.readAt >= this.ttlMs || now >= entry.expiresAt) {
      this.entries.delete(sid);
      return undefined;
    }
    return entry;
  }

  /** A token to hand back to `keep`, taken before the read starts. */
  beginRead(): number {
    return this.epoch;
  }

  /** Keeps what a read found, unless a session was forgotten while it was under way. */
  keep(sid: string, found: CachedSession, readStartedAt: number) {
    if (readStartedAt !== this.epoch) return;
    if (this.entries.size >= MAX_ENTRIES) {
      // The oldest entries first (a Map keeps insertion order); most have run out anyway.
      for (const key of [...this.entries.keys()].slice(0, MAX_ENTRIES / 10)) this.entries.delete(key);
    }
    this.entries.delete(sid);
    this.entries.set(sid, { ...found, readAt: this.now() });
  }

  forget(sids: Iterable<string>) {
    this.epoch += 1;
    for (const sid of sids) this.entries.delete(sid);
  }

  /** Every session signed in as the account, after its name, units or standing changed. */
  forgetUser(userId: number) {
    this.epoch += 1;
    for (const [sid, entry] of this.entries) if (entry.userId === userId) this.entries.delete(sid);
  }

  clear() {
    this.epoch += 1;
    this.entries.clear();
  }

  get size() {
    return this.entries.size;
  }
}
