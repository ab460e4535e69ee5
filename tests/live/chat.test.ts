import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import type { ChatJoined } from '../../shared/live-events';
import type { ChatMessageDto, ChatPageDto, ChatRoomDto } from '../../shared/schemas/chat';
import type { SewDayDetailDto } from '../../shared/schemas/sewdays';
import type { RunningServer } from '../../server/index';
import {
  collect,
  connect,
  connected,
  liveGuild,
  nextEvent,
  pause,
  register,
  request,
  startNode,
  type ClientSocket,
  type Person,
} from './live-helpers';
import { collectingSwap } from './swap-setup';

let node: RunningServer;
let g: Awaited<ReturnType<typeof liveGuild>>;
let roomId: number;
const sockets: ClientSocket[] = [];

async function inRoom(person: Person, id = roomId) {
  const socket = await connected(connect(node.url, person));
  sockets.push(socket);
  const answer = await request<ChatJoined>(socket, 'chat:join', { roomId: id });
  if ('error' in answer) throw new Error(answer.error.message);
  return socket;
}

async function newRoom() {
  const year = new Date().getUTCFullYear() + 1;
  const res = await g.coordinator.api<SewDayDetailDto>('POST', `/guilds/${g.guildId}/sew-days`, {
    title: 'Binding bee',
    startsAt: `${year}-05-02T10:00`,
    endsAt: `${year}-05-02T14:00`,
    place: 'Fellowship hall',
  });
  expect(res.status).toBe(201);
  return res.body.chatRoomId!;
}

beforeAll(async () => {
  node = await startNode();
  g = await liveGuild(node.url);
  roomId = await newRoom();
});
afterAll(async () => {
  for (const s of sockets) s.disconnect();
  await node?.close();
});

describe('chat messages', () => {
  it('delivers a message sent over the socket to everyone in the room, and answers the sender', async () => {
    const admin = await inRoom(g.admin);
    const member = await inRoom(g.member);
    const arriving = nextEvent(admin, 'message:created');
    const answer = await request<ChatMessageDto>(member, 'message:send', {
      roomId,
      body: '  Anyone bringing a spare ¼″ foot?  ',
    });
    expect(answer).toMatchObject({
      data: {
        roomId,
        body: 'Anyone bringing a spare ¼″ foot?',
        author: { id: g.member.id, displayName: 'Milo Member' },
        removed: null,
      },
    });
    expect(await arriving).toEqual('data' in answer ? answer.data : null);
  });

  it('keeps markup as plain text and refuses empty or overlong messages with a clear reason', async () => {
    const socket = await inRoom(g.member);
    const markup = '<img src=x onerror="alert(1)"> <b>bold</b>';
    expect(await request(socket, 'message:send', { roomId, body: markup })).toMatchObject({ data: { body: markup } });
    expect(await request(socket, 'message:send', { roomId, body: '   ' })).toMatchObject({
      error: { code: 'validation', fields: { body: 'Write a message first.' } },
    });
    const long = await request(socket, 'message:send', { roomId, body: 'x'.repeat(2001) });
    expect(long).toMatchObject({ error: { code: 'validation', fields: { body: 'Keep a message under 2,000 characters.' } } });
    expect(await request(socket, 'message:send', { roomId: String(roomId), body: 'hi' })).toMatchObject({
      error: { code: 'validation' },
    });
    const rest = await g.member.api('POST', `/chat/rooms/${roomId}/messages`, { body: 'y'.repeat(2001) });
    expect(rest.status).toBe(400);
  });

  it('limits each person to 10 messages in 10 seconds, over the socket and REST alike', async () => {
    const chatty = await (await import('./live-helpers')).addMember(node.url, g.guildId, 'member', 'Chatty Cathy');
    const socket = await inRoom(chatty);
    for (let i = 1; i <= 10; i += 1) {
      expect(await request(socket, 'message:send', { roomId, body: `Seam ${i} pressed` })).toMatchObject({
        data: { body: `Seam ${i} pressed` },
      });
    }
    const refused = await request(socket, 'message:send', { roomId, body: 'one more' });
    expect(refused).toMatchObject({
      error: { code: 'rate_limited', message: expect.stringMatching(/faster than the room allows.*Wait \d+ seconds?/) },
    });
    const rest = await chatty.api<{ error: { code: string } }>('POST', `/chat/rooms/${roomId}/messages`, { body: 'and another' });
    expect(rest.status).toBe(429);
    expect(rest.body.error.code).toBe('rate_limited');
    expect(await request(socket, 'message:send', { roomId, body: 'x' })).toMatchObject({ error: { code: 'rate_limited' } });
    // Someone else is not held back.
    expect((await g.admin.api('POST', `/chat/rooms/${roomId}/messages`, { body: 'Room is open until two.' })).status).toBe(201);
  });

  it('lets the author edit, and nobody else', async () => {
    const admin = await inRoom(g.admin);
    const sent = (
      await g.member.api<ChatMessageDto>('POST', `/chat/rooms/${roomId}/messages`, { body: 'I have a spare rotary blade' })
    ).body;
    const updated = nextEvent(admin, 'message:updated', (m) => m.id === sent.id);
    const edit = await g.member.api<ChatMessageDto>('PATCH', `/chat/messages/${sent.id}`, {
      body: 'I have two spare rotary blades',
    });
    expect(edit.status).toBe(200);
    expect(edit.body).toMatchObject({ body: 'I have two spare rotary blades', editedAt: expect.any(String) });
    expect((await updated).body).toBe('I have two spare rotary blades');
    expect((await g.admin.api('PATCH', `/chat/messages/${sent.id}`, { body: 'Rewritten' })).status).toBe(403);
  });

  it('lets an admin remove any message, a member only their own', async () => {
    const watcher = await inRoom(g.coordinator);
    const mine = (await g.member.api<ChatMessageDto>('POST', `/chat/rooms/${roomId}/messages`, { body: 'Oops, wrong room' }))
      .body;
    const theirs = (
      await g.coordinator.api<ChatMessageDto>('POST', `/chat/rooms/${roomId}/messages`, { body: 'Parking is behind the hall' })
    ).body;
    const rude = (await g.member.api<ChatMessageDto>('POST', `/chat/rooms/${roomId}/messages`, { body: 'Something unkind' }))
      .body;

    const refused = await g.member.api<{ error: { code: string } }>('DELETE', `/chat/messages/${theirs.id}`);
    expect(refused.status).toBe(403);
    const own = await g.member.api<ChatMessageDto>('DELETE', `/chat/messages/${mine.id}`);
    expect(own.body).toMatchObject({ removed: 'author', body: '' });

    const removedLive = nextEvent(watcher, 'message:updated', (m) => m.id === rude.id);
    const removed = await g.admin.api<ChatMessageDto>('DELETE', `/chat/messages/${rude.id}`);
    expect(removed.body).toMatchObject({ id: rude.id, removed: 'moderator', body: '', author: { id: g.member.id } });
    expect(await removedLive).toMatchObject({ removed: 'moderator', body: '' });
    expect((await g.coordinator.api('DELETE', `/chat/messages/${mine.id}`)).status).toBe(403);
    expect((await g.admin.api('DELETE', `/chat/messages/${rude.id}`)).status).toBe(409);
    expect((await g.member.api('PATCH', `/chat/messages/${mine.id}`, { body: 'back' })).status).toBe(409);

    const page = (await g.member.api<ChatPageDto>('GET', `/chat/rooms/${roomId}/messages`)).body;
    expect(page.messages.find((m) => m.id === rude.id)).toMatchObject({ removed: 'moderator', body: '' });
  });

  it('attaches photos through the upload pipeline and takes them away with the message', async () => {
    const jpeg = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#5f7a5a' } })
      .jpeg()
      .toBuffer();
    const form = new FormData();
    form.append('body', 'Finished the flying geese');
    form.append('photos', new Blob([jpeg], { type: 'image/jpeg' }), 'geese.jpg');
    const res = await fetch(`${node.url}/api/chat/rooms/${roomId}/messages`, {
      method: 'POST',
      headers: { cookie: g.member.cookie, 'x-requested-with': 'blockpost' },
      body: form,
    });
    const message = (await res.json()) as ChatMessageDto;
    expect(res.status, JSON.stringify(message)).toBe(201);
    expect(message.body).toBe('Finished the flying geese');
    expect(message.photos).toEqual([
      {
        id: expect.any(Number),
        url: expect.stringMatching(/^\/api\/photos\/\d+$/),
        thumbnailUrl: expect.any(String),
        width: 64,
        height: 48,
      },
    ]);
    const photo = await fetch(`${node.url}${message.photos[0]!.url}`, { headers: { cookie: g.admin.cookie } });
    expect(photo.status).toBe(200);

    await g.member.api('DELETE', `/chat/messages/${message.id}`);
    const gone = await fetch(`${node.url}${message.photos[0]!.url}`, { headers: { cookie: g.admin.cookie } });
    expect(gone.status).toBe(404);
  });
});

describe('chat history', () => {
  it('pages newest first with a cursor, without gaps or repeats', async () => {
    const id = await newRoom();
    const { ChatMessage } = await import('../../server/db/models');
    const authors = [g.admin.id, g.member.id, g.coordinator.id];
    await ChatMessage.bulkCreate(
      Array.from({ length: 67 }, (_, i) => ({ roomId: id, authorId: authors[i % 3]!, body: `Line ${i + 1}`, deletedById: null })),
    );

    const bodies: string[] = [];
    let cursor: number | null | undefined;
    let pages = 0;
    do {
      const res = await g.member.api<ChatPageDto>(
        'GET',
        `/chat/rooms/${id}/messages?limit=30${cursor ? `&before=${cursor}` : ''}`,
      );
      expect(res.status).toBe(200);
      bodies.push(...res.body.messages.map((m) => m.body));
      cursor = res.body.nextCursor;
      pages += 1;
    } while (cursor);
    expect(pages).toBe(3);
    expect(bodies).toEqual(Array.from({ length: 67 }, (_, i) => `Line ${67 - i}`));
    expect((await g.member.api('GET', `/chat/rooms/${id}/messages?limit=500`)).status).toBe(400);
    expect((await g.stranger.api('GET', `/chat/rooms/${id}/messages`)).status).toBe(404);
  });
});

describe('rooms, typing and presence', () => {
  it('refuses people from other guilds and rooms that do not exist', async () => {
    const socket = await connected(connect(node.url, g.stranger));
    sockets.push(socket);
    expect(await request(socket, 'chat:join', { roomId })).toEqual({
      error: { code: 'not_found', message: 'That chat room does not exist.' },
    });
    expect(await request(socket, 'chat:join', { roomId: 987654 })).toMatchObject({ error: { code: 'not_found' } });
    expect(await request(socket, 'message:send', { roomId, body: 'let me in' })).toMatchObject({ error: { code: 'not_found' } });
    const outsider = await register(node.url);
    expect((await outsider.api('POST', `/chat/rooms/${roomId}/messages`, { body: 'hello' })).status).toBe(404);
  });

  it('shows who is typing to the others only, and who is here', async () => {
    const admin = await inRoom(g.admin);
    const adminSeen = nextEvent(
      admin,
      'presence:changed',
      (p) => p.room.kind === 'chat' && p.viewers.some((v) => v.userId === g.member.id),
    );
    const member = await inRoom(g.member);
    expect((await adminSeen).room).toEqual({ kind: 'chat', roomId });
    const ownTyping = collect(member, 'typing:started');
    const typing = nextEvent(admin, 'typing:started');
    member.emit('typing:start', { roomId });
    expect(await typing).toEqual({ roomId, user: { userId: g.member.id, displayName: 'Milo Member' } });
    await pause(100);
    expect(ownTyping).toEqual([]);

    // Typing in a room the socket never joined goes nowhere.
    const other = await newRoom();
    const otherWatcher = await inRoom(g.admin, other);
    const stray = collect(otherWatcher, 'typing:started');
    member.emit('typing:start', { roomId: other });
    await pause(150);
    expect(stray).toEqual([]);
  });

  it('opens one room per swap, the same for everyone', async () => {
    const { swapId } = await collectingSwap(g.coordinator, g.guildId, [g.member], 1);
    const first = await g.member.api<ChatRoomDto>('GET', `/swaps/${swapId}/chat`);
    const again = await g.admin.api<ChatRoomDto>('GET', `/swaps/${swapId}/chat`);
    expect(first.status).toBe(200);
    expect(first.body).toMatchObject({ kind: 'swap', swapId, title: 'Harvest Stripes', canPost: true, canModerate: false });
    expect(again.body).toMatchObject({ id: first.body.id, canModerate: true });
    expect((await g.stranger.api('GET', `/swaps/${swapId}/chat`)).status).toBe(404);
  });
});
