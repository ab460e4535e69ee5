import { describe, expect, it } from 'vitest';
import { SessionCache, type CachedSession } from '../../server/auth/session-cache';

const HOUR = 3_600_000;

function session(userId: number, expiresAt = 10 * HOUR): CachedSession {
  return {
    sess: JSON.stringify({ cookie: {}, passport: { user: userId } }),
    userId,
    user: { id: userId, email: `p${userId}@example.org`, displayName: `P${userId}`, units: 'in' },
    expiresAt,
  };
}

function clock(start = 1_000) {
  const c = { now: start, read: () => c.now };
  return c;
}

describe('a node’s memory of the sessions it read', () => {
  it('answers from memory for the trusted time, then asks for a fresh read', () => {
    const time = clock();
    const cache = new SessionCache(1_000, time.read);
    cache.keep('a', session(1), cache.beginRead());
    time.now += 999;
    expect(cache.get('a')?.userId).toBe(1);
    time.now += 1;
    expect(cache.get('a')).toBeUndefined();
    expect(cache.size).toBe(0);
  });

  it('never answers for a session past its expiry, even within the trusted time', () => {
    const time = clock();
    const cache = new SessionCache(1_000, time.read);
    cache.keep('a', session(1, time.now + 10), cache.beginRead());
    time.now += 10;
    expect(cache.get('a')).toBeUndefined();
  });

  it('forgets an ended session at once, and every session of an account that changed', () => {
    const cache = new SessionCache(1_000, clock().read);
    for (const [sid, user] of [
      ['a', 1],
      ['b', 1],
      ['c', 2],
    ] as const)
      cache.keep(sid, session(user), cache.beginRead());
    cache.forget(['c']);
    expect(cache.get('c')).toBeUndefined();
    expect(cache.get('a')).toBeDefined();
    cache.forgetUser(1);
    expect([cache.get('a'), cache.get('b')]).toEqual([undefined, undefined]);
  });

  it('does not keep a read that was under way when a session was forgotten', () => {
    // A request read the session row just before a sign-out deleted it; its answer comes back after.
    const cache = new SessionCache(1_000, clock().read);
    const started = cache.beginRead();
    cache.forget(['a']);
    cache.keep('a', session(1), started);
    expect(cache.get('a')).toBeUndefined();
    // A read begun after the forget is kept as usual.
    cache.keep('a', session(1), cache.beginRead());
    expect(cache.get('a')).toBeDefined();
  });

  it('stays bounded, dropping the oldest entries first', () => {
    const cache = new SessionCache(1_000, clock().read);
    for (let i = 0; i < 5_001; i += 1) cache.keep(`s${i}`, session(i), cache.beginRead());
    expect(cache.size).toBeLessThanOrEqual(5_000);
    expect(cache.get('s0')).toBeUndefined();
    expect(cache.get('s5000')).toBeDefined();
  });
});
