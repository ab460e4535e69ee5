/**
 * A session that ends takes its live sockets with it, on every node and within a second: after a
 * sign-out, after a password reset or change (which end every session of the account), and when the
 * session expires. Two app servers share one database, as two processes behind a load balancer do.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ChatJoined } from '../../shared/live-events';
import type { SewDayDetailDto } from '../../shared/schemas/sewdays';
import type { RunningServer } from '../../server/index';
import { createTestDatabase } from '../helpers/test-app';
import { connect, connected, liveGuild, onNode, pause, request, startNode, type ClientSocket, type Person } from './live-helpers';

let nodeA: RunningServer;
let nodeB: RunningServer;
let g: Awaited<ReturnType<typeof liveGuild>>;
let roomId: number;
const sockets: ClientSocket[] = [];

beforeAll(async () => {
  const databaseUrl = await createTestDatabase();
  nodeA = await startNode(databaseUrl);
  nodeB = await startNode(databaseUrl);
  g = await liveGuild(nodeA.url);
  const year = new Date().getUTCFullYear() + 1;
  const day = await g.admin.api<SewDayDetailDto>('POST', `/guilds/${g.guildId}/sew-days`, {
    title: 'Binding bee',
    startsAt: `${year}-04-11T10:00`,
    endsAt: `${year}-04-11T13:00`,
    place: 'Guild hall',
  });
  roomId = day.body.chatRoomId!;
  await pause(300); // the adapters start listening shortly after start
});
afterAll(async () => {
  for (const s of sockets) s.disconnect();
  await nodeA?.close();
  await nodeB?.close();
});

/** Signs `person` in again on `node`: a second session of the same account. */
async function signIn(node: RunningServer, person: Person, password = 'correct-horse-staple'): Promise<Person> {
  const res = await fetch(`${node.url}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-requested-with': 'blockpost' },
    body: JSON.stringify({ email: person.email, password }),
  });
  expect(res.status).toBe(200);
  const cookie = res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  return onNode({ ...person, cookie }, node.url);
}

/** A socket of `person` on `node`, in the sew day's chat room. */
async function inRoom(node: RunningServer, person: Person) {
  const socket = await connected(connect(node.url, person));
  sockets.push(socket);
  const joined = await request<ChatJoined>(socket, 'chat:join', { roomId });
  expect('data' in joined).toBe(true);
  return socket;
}

/** Resolves with the time from now until the socket is closed by the server; rejects after `ms`. */
function closedWithin(socket: ClientSocket, ms: number): Promise<number> {
  const start = Date.now();
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`socket still open after ${ms} ms`)), ms);
    socket.once('disconnect', (reason) => {
      clearTimeout(timer);
      if (reason === 'io server disconnect') resolve(Date.now() - start);
      else reject(new Error(`closed by ${reason}`));
    });
  });
}

/** Messages that reach `socket` from now on. */
function received(socket: ClientSocket) {
  const bodies: string[] = [];
  socket.on('message:created', (m) => bodies.push(m.body));
  return bodies;
}

/** Whether `person`'s session is refused (401) within `ms`, asking again and again. */
async function refusedWithin(person: Person, ms: number): Promise<boolean> {
  const start = Date.now();
  do {
    if ((await person.api('GET', '/me')).status === 401) return true;
  } while (Date.now() - start < ms);
  return false;
}

describe('sockets of an ended session', () => {
  it('close on both nodes within a second of signing out, and hear nothing more', async () => {
    const member = await signIn(nodeA, g.member);
    const onA = await inRoom(nodeA, member);
    const onB = await inRoom(nodeB, member);
    const other = await inRoom(nodeB, await signIn(nodeB, g.member)); // another session of the same person
    const heardA = received(onA);
    const closing = [closedWithin(onA, 1000), closedWithin(onB, 1000)];

    expect((await member.api('POST', '/auth/logout')).status).toBe(204);
    await Promise.all(closing);
    await g.admin.api('POST', `/chat/rooms/${roomId}/messages`, { body: 'after the sign-out' });
    await pause(300);
    expect(heardA).toEqual([]);
    expect(onA.connected || onB.connected).toBe(false);
    expect(other.connected).toBe(true); // signing out one device leaves the others
  });

  it('refuses the ended session’s requests at once on the node that ended it, and within a second on the other', async () => {
    const member = await signIn(nodeA, g.member);
    const onB = onNode(member, nodeB.url);
    // Both nodes have just read the session, so both remember it.
    expect((await member.api('GET', '/me')).status).toBe(200);
    expect((await onB.api('GET', '/me')).status).toBe(200);

    expect((await member.api('POST', '/auth/logout')).status).toBe(204);
    expect((await member.api('GET', '/me')).status).toBe(401);
    expect(await refusedWithin(onB, 1000)).toBe(true);
  });

  it('close for every session of the account after a password reset', async () => {
    const coordinator = g.coordinator;
    const first = await inRoom(nodeA, coordinator);
    const second = await inRoom(nodeB, await signIn(nodeB, coordinator));
    const closing = [closedWithin(first, 1000), closedWithin(second, 1000)];
    expect((await coordinator.api('GET', '/me')).status).toBe(200); // node A remembers this session
    const { PasswordReset } = await import('../../server/db/models');
    const { newToken } = await import('../../server/auth/tokens');
    const { token, tokenHash } = newToken();
    await PasswordReset.create({ userId: coordinator.id, tokenHash, expiresAt: new Date(Date.now() + 600_000) });

    const res = await fetch(`${nodeB.url}/api/auth/reset`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-requested-with': 'blockpost' },
      body: JSON.stringify({ token, password: 'thimble-lantern-orchard' }),
    });
    expect(res.status).toBe(200);
    await Promise.all(closing);
    // Node A stops answering for the session it remembered once the adapter's message arrives.
    expect(await refusedWithin(coordinator, 1000)).toBe(true);
  });

  it('close on other devices after a password change, and stay open on the device that changed it', async () => {
    const admin = await signIn(nodeA, g.admin);
    const here = await inRoom(nodeA, admin);
    const elsewhere = await inRoom(nodeB, await signIn(nodeB, g.admin));
    const closing = closedWithin(elsewhere, 1000);
    const res = await admin.api('POST', '/me/password', {
      currentPassword: 'correct-horse-staple',
      newPassword: 'copper-meadow-lantern',
    });
    expect(res.status).toBe(200);
    await closing;
    await pause(200);
    expect(here.connected).toBe(true);
  });

  it('close when the session expires', async () => {
    const member = await signIn(nodeB, g.member);
    // The session row as the store keeps it: cut its life short, as if it were signed in 30 days ago.
    const sid = decodeURIComponent(member.cookie.split('=')[1]!).slice(2).split('.')[0]!;
    const { User } = await import('../../server/db/models');
    const expires = new Date(Date.now() + 1500);
    await User.sequelize!.query(
      `UPDATE session SET expire = $1, sess = jsonb_set(sess::jsonb, '{cookie,expires}', to_jsonb($2::text))::json WHERE sid = $3`,
      { bind: [expires, expires.toISOString(), sid] },
    );
    const socket = await inRoom(nodeA, member);
    const after = await closedWithin(socket, 3000);
    expect(after).toBeLessThan(2500);
  });
});
