/** Real servers and real socket.io clients for the live tests; people sign in over HTTP like a browser. */
import { randomBytes } from 'node:crypto';
import { io as connectClient, type Socket } from 'socket.io-client';
import type { Ack, ClientToServerEvents, ServerToClientEvents } from '../../shared/live-events';
import type { Role } from '../../shared/schemas/guilds';
import { startServer, type RunningServer } from '../../server/index';
import { createTestDatabase, testConfig } from '../helpers/test-app';
import { PASSWORD, testPasswordHash } from '../helpers/factories';

export type ClientSocket = Socket<ServerToClientEvents, ClientToServerEvents>;

export async function startNode(databaseUrl?: string, overrides: Record<string, string> = {}): Promise<RunningServer> {
  return startServer(testConfig(databaseUrl ?? (await createTestDatabase()), { PORT: '0', ...overrides }));
}

export interface Person {
  id: number;
  email: string;
  displayName: string;
  cookie: string;
  /** A JSON call to the API with this person's session and the CSRF header. */
  api<T = unknown>(method: string, path: string, body?: unknown): Promise<{ status: number; body: T; headers: Headers }>;
}

function caller(baseUrl: string, cookie: string) {
  return async <T>(method: string, path: string, body?: unknown) => {
    const res = await fetch(`${baseUrl}/api${path}`, {
      method,
      headers: { cookie, 'x-requested-with': 'blockpost', ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    const text = await res.text();
    let parsed: unknown = text;
    try {
      parsed = text ? JSON.parse(text) : null;
    } catch {
      // not JSON (an .ics file): keep the text
    }
    return { status: res.status, body: parsed as T, headers: res.headers };
  };
}

/**
 * A new confirmed account (written as opening its confirmation link would; sign-up by mail has its
 * own tests), signed in on `baseUrl` through the sign-in route, keeping its session cookie.
 */
export async function register(baseUrl: string, displayName = `Maker ${randomBytes(2).toString('hex')}`): Promise<Person> {
  const email = `live-${randomBytes(5).toString('hex')}@example.test`;
  const { User } = await import('../../server/db/models');
  await User.create({ email, displayName, passwordHash: await testPasswordHash() });
  const res = await fetch(`${baseUrl}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-requested-with': 'blockpost' },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`sign-in answered ${res.status}: ${await res.text()}`);
  const cookie = res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  const body = (await res.json()) as { user: { id: number } };
  return { id: body.user.id, email, displayName, cookie, api: caller(baseUrl, cookie) };
}

/** The same person seen through another node (sessions live in PostgreSQL). */
export function onNode(person: Person, baseUrl: string): Person {
  return { ...person, api: caller(baseUrl, person.cookie) };
}

/** A guild created by its admin, with a coordinator, a member, and a stranger from another guild. */
export async function liveGuild(baseUrl: string) {
  const admin = await register(baseUrl, 'Ada Admin');
  const guild = await admin.api<{ id: number }>('POST', '/guilds', {
    name: `Lantern Street Quilters ${randomBytes(2).toString('hex')}`,
  });
  const guildId = guild.body.id;
  const coordinator = await addMember(baseUrl, guildId, 'coordinator', 'Cora Coordinator');
  const member = await addMember(baseUrl, guildId, 'member', 'Milo Member');
  const stranger = await register(baseUrl, 'Sam Stranger');
  await stranger.api('POST', '/guilds', { name: 'Elsewhere Stitchers' });
  return { guildId, admin, coordinator, member, stranger };
}

/** A new account joined to the guild directly (invitations have their own tests). */
export async function addMember(baseUrl: string, guildId: number, role: Role, displayName?: string): Promise<Person> {
  const person = await register(baseUrl, displayName);
  const { Membership } = await import('../../server/db/models');
  await Membership.create({ guildId, userId: person.id, role });
  return person;
}

/** Connects with the person's session cookie (or none) over WebSocket only. */
export function connect(baseUrl: string, person?: Pick<Person, 'cookie'>): ClientSocket {
  return connectClient(baseUrl, {
    transports: ['websocket'],
    extraHeaders: person ? { cookie: person.cookie } : {},
    reconnection: false,
    forceNew: true,
  });
}

export function connected(socket: ClientSocket): Promise<ClientSocket> {
  return new Promise((resolve, reject) => {
    if (socket.connected) return resolve(socket);
    socket.once('connect', () => resolve(socket));
    socket.once('connect_error', reject);
  });
}

/** Emits a client event and waits for its acknowledgement. */
export function request<T>(socket: ClientSocket, event: keyof ClientToServerEvents, payload: unknown): Promise<Ack<T>> {
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`no answer to ${event}`)), 5000);
    (socket.emit as (e: string, p: unknown, cb: (a: Ack<T>) => void) => void)(event, payload, (answer) => {
      clearTimeout(timer);
      resolve(answer);
    });
  });
}

/** Resolves with the first `event` that passes `match`; rejects after `timeoutMs`. */
export function nextEvent<E extends keyof ServerToClientEvents>(
  socket: ClientSocket,
  event: E,
  match: (...args: Parameters<ServerToClientEvents[E]>) => boolean = () => true,
  timeoutMs = 5000,
): Promise<Parameters<ServerToClientEvents[E]>[0]> {
  return new Promise((resolve, reject) => {
    const listener = (...args: Parameters<ServerToClientEvents[E]>) => {
      if (!match(...args)) return;
      clearTimeout(timer);
      socket.off(event, listener as never);
      resolve(args[0]);
    };
    const timer = setTimeout(() => {
      socket.off(event, listener as never);
      reject(new Error(`no ${event} within ${timeoutMs} ms`));
    }, timeoutMs);
    socket.on(event, listener as never);
  });
}

/** Collects every `event` a socket receives, for asserting that something did not arrive. */
export function collect<E extends keyof ServerToClientEvents>(socket: ClientSocket, event: E) {
  const seen: Parameters<ServerToClientEvents[E]>[0][] = [];
  socket.on(event, ((payload: Parameters<ServerToClientEvents[E]>[0]) => seen.push(payload)) as never);
  return seen;
}

export const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));
