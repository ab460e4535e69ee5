import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RunningServer } from '../../server/index';
import { connect, connected, register, request, startNode, type ClientSocket } from './live-helpers';
import type { SewDayDetailDto } from '../../shared/schemas/sewdays';

let node: RunningServer;
const sockets: ClientSocket[] = [];

beforeAll(async () => {
  node = await startNode();
});
afterAll(async () => {
  for (const s of sockets) s.disconnect();
  await node?.close();
});

describe('socket authentication', () => {
  it('refuses a socket without a session', async () => {
    const socket = connect(node.url);
    sockets.push(socket);
    const error = await connected(socket).then(
      () => null,
      (e: Error & { data?: { code: string } }) => e,
    );
    expect(error?.message).toBe('Please sign in first.');
    expect(error?.data?.code).toBe('unauthenticated');
  });

  it('refuses a forged session cookie', async () => {
    const socket = connect(node.url, { cookie: 'blockpost.sid=s%3Aforged.signature' });
    sockets.push(socket);
    await expect(connected(socket)).rejects.toThrow('Please sign in first.');
  });

  it('refuses a browser page from another site', async () => {
    const person = await register(node.url);
    const { io } = await import('socket.io-client');
    const socket = io(node.url, {
      transports: ['websocket'],
      reconnection: false,
      forceNew: true,
      extraHeaders: { cookie: person.cookie, origin: 'https://evil.example' },
    }) as ClientSocket;
    sockets.push(socket);
    await expect(connected(socket)).rejects.toThrow('This page may not open a live connection.');
  });

  it('accepts a signed-in person over WebSocket and over long-polling', async () => {
    const person = await register(node.url);
    const ws = connect(node.url, person);
    sockets.push(ws);
    await connected(ws);
    expect(ws.connected).toBe(true);

    const { io } = await import('socket.io-client');
    const polling = io(node.url, {
      transports: ['polling'],
      reconnection: false,
      forceNew: true,
      extraHeaders: { cookie: person.cookie },
    }) as ClientSocket;
    sockets.push(polling);
    await connected(polling);
    expect(polling.connected).toBe(true);
  });

  it('stops acting for someone who signed out since the socket opened', async () => {
    const person = await register(node.url, 'Olive Officer');
    const guild = (await person.api<{ id: number }>('POST', '/guilds', { name: 'Signed-out Circle' })).body;
    const year = new Date().getUTCFullYear() + 1;
    const sewDay = (
      await person.api<SewDayDetailDto>('POST', `/guilds/${guild.id}/sew-days`, {
        title: 'Cutting morning',
        startsAt: `${year}-02-06T09:00`,
        endsAt: `${year}-02-06T12:00`,
        place: 'Annex',
      })
    ).body;
    const socket = connect(node.url, person);
    sockets.push(socket);
    await connected(socket);
    expect(await request(socket, 'chat:join', { roomId: sewDay.chatRoomId })).toMatchObject({
      data: { viewers: expect.any(Array) },
    });

    // Signing out closes the socket at once (tests/live/session-end.test.ts has the cases across nodes).
    const closed = new Promise<string>((resolve) => socket.once('disconnect', resolve));
    expect((await person.api('POST', '/auth/logout')).status).toBe(204);
    expect(await closed).toBe('io server disconnect');
    expect(socket.connected).toBe(false);
  });
});
