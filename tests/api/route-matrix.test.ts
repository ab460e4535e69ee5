/**
 * A role matrix over every API route, read from the Express router: a route added without an entry
 * here fails the first test. Each route is called signed out, as a stranger (the admin of another
 * guild), and as a member, coordinator and admin of the guild that owns the resource. Denied callers
 * get 401 (signed out) or 404 (stranger, as for an id that does not exist) or 403 (a role below the one needed); allowed callers get
 * past authorisation (any answer but 401/403); nobody ever gets a 5xx.
 */
import { randomUUID } from 'node:crypto';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles, PASSWORD, signedInUser, uniqueEmail } from '../helpers/factories';
import { listRoutes } from '../../server/http/list-routes';
import { paymentsOverrides } from '../helpers/payments';
import { createSwap, move, receiveAndMeasure, swapBody } from './swaps-support';

type Role = 'signedOut' | 'stranger' | 'member' | 'coordinator' | 'admin';
type Access = 'public' | 'user' | 'member' | 'officer' | 'admin' | Role[];
type Agent = ReturnType<TestApp['agent']>;

interface Case {
  access: Access;
  /** Path with real ids filled in. */
  path: () => string;
  body?: () => unknown;
  /** Every role uses a fresh session: routes that sign in, out or join a guild. */
  fresh?: 'anonymous' | 'user';
}

let app: TestApp;
let g: Awaited<ReturnType<typeof guildWithRoles>>;
const ids = { swap: 0, block: 0, photo: 0, photoToDelete: 0, sewDay: 0, room: 0, message: 0, messageToDelete: 0, token: '' };

beforeAll(async () => {
  app = await createTestApp(paymentsOverrides());
  g = await guildWithRoles(app);
  const swap = await createSwap(g.coordinator.agent, g.guildId);
  ids.swap = swap.id;
  await move(g.coordinator.agent, swap.id, 'signup');
  await g.member.agent.post(`/api/swaps/${swap.id}/signups`).send({ blocks: 2 }).expect(200);
  await move(g.coordinator.agent, swap.id, 'sewing');
  await move(g.coordinator.agent, swap.id, 'collecting');
  const blocks = (await g.member.agent.get(`/api/swaps/${swap.id}/blocks?maker=me`).expect(200)).body as { id: number }[];
  ids.block = blocks[0]!.id;
  const jpeg = await sharp({ create: { width: 400, height: 400, channels: 3, background: '#5F7A5A' } })
    .jpeg()
    .toBuffer();
  const up = await g.member.agent
    .post(`/api/blocks/${blocks[1]!.id}/photos`)
    .attach('photos', jpeg, 'a.jpg')
    .attach('photos', jpeg, 'b.jpg')
    .expect(201);
  ids.photo = up.body.photos[0].id;
  ids.photoToDelete = up.body.photos[1].id;
  await receiveAndMeasure(g.coordinator.agent, ids.block, { width: '9 1/2', height: '9 1/2' });
  const day = await g.coordinator.agent
    .post(`/api/guilds/${g.guildId}/sew-days`)
    .send({ title: 'Matrix sew day', startsAt: '2027-03-14T10:00', endsAt: '2027-03-14T15:00', place: 'Library room B' })
    .expect(201);
  ids.sewDay = day.body.id;
  const room = await g.member.agent.get(`/api/swaps/${swap.id}/chat`).expect(200);
  ids.room = room.body.id ?? room.body.room?.id;
  const post = (text: string) => g.member.agent.post(`/api/chat/rooms/${ids.room}/messages`).field('body', text);
  ids.message = (await post('first message')).body.id;
  ids.messageToDelete = (await post('to be removed')).body.id;
  const { newToken } = await import('../../server/auth/tokens');
  const { Invitation } = await import('../../server/db/models');
  const { token, tokenHash } = newToken();
  await Invitation.create({
    guildId: g.guildId,
    email: uniqueEmail('matrix'),
    role: 'member',
    tokenHash,
    invitedById: g.admin.id,
    expiresAt: new Date(Date.now() + 86_400_000),
  });
  ids.token = token;
}, 60_000);
afterAll(() => app.close());

const G = () => g.guildId;
const NOPE = 999_999;
const sewDay = { title: 'Renamed sew day', startsAt: '2027-03-14T10:00', endsAt: '2027-03-14T16:00', place: 'Library room C' };

const cases: Record<string, Case> = {
  'GET /api/health': { access: 'public', path: () => '/api/health' },
  'POST /api/auth/register': {
    access: 'public',
    fresh: 'anonymous',
    path: () => '/api/auth/register',
    body: () => ({ email: uniqueEmail('m'), password: PASSWORD, displayName: 'Matrix' }),
  },
  'POST /api/auth/confirm-email': {
    access: 'public',
    fresh: 'anonymous',
    path: () => '/api/auth/confirm-email',
    body: () => ({ token: 'x'.repeat(43) }),
  },
  'POST /api/auth/login': {
    access: 'public',
    fresh: 'anonymous',
    path: () => '/api/auth/login',
    body: () => ({ email: g.member.email, password: PASSWORD }),
  },
  'POST /api/auth/logout': { access: 'public', fresh: 'user', path: () => '/api/auth/logout' },
  'POST /api/auth/reset-request': {
    access: 'public',
    fresh: 'anonymous',
    path: () => '/api/auth/reset-request',
    body: () => ({ email: uniqueEmail('r') }),
  },
  'POST /api/auth/reset': {
    access: 'public',
    fresh: 'anonymous',
    path: () => '/api/auth/reset',
    body: () => ({ token: 'x'.repeat(43), password: PASSWORD }),
  },
  'GET /api/me': { access: 'user', path: () => '/api/me' },
  'PATCH /api/me': { access: 'user', path: () => '/api/me', body: () => ({ units: 'in' }) },
  'POST /api/me/password': {
    access: 'user',
    fresh: 'user',
    path: () => '/api/me/password',
    body: () => ({ currentPassword: PASSWORD, newPassword: 'orchard-copper-thimble' }),
  },
  'GET /api/session': { access: 'public', path: () => '/api/session' },
  'GET /api/me/next': { access: 'user', path: () => '/api/me/next' },
  'PUT /api/me/rooms/:roomId/seen': { access: 'member', path: () => `/api/me/rooms/${ids.room}/seen` },
  'GET /api/invitations/:token': { access: 'public', path: () => `/api/invitations/${ids.token}` },
  'POST /api/invitations/:token/accept': {
    access: 'user',
    fresh: 'user',
    path: () => `/api/invitations/${'y'.repeat(43)}/accept`,
  },
  'GET /api/guilds': { access: 'user', path: () => '/api/guilds' },
  'POST /api/guilds': { access: 'user', path: () => '/api/guilds', body: () => ({ name: 'Matrix Made Guild' }) },
  'GET /api/guilds/:guildId': { access: 'member', path: () => `/api/guilds/${G()}` },
  'PATCH /api/guilds/:guildId': { access: 'admin', path: () => `/api/guilds/${G()}`, body: () => ({ timeZone: 'UTC' }) },
  'GET /api/guilds/:guildId/members': { access: 'member', path: () => `/api/guilds/${G()}/members` },
  'PATCH /api/guilds/:guildId/members/:userId': {
    access: 'admin',
    path: () => `/api/guilds/${G()}/members/${g.member.id}`,
    body: () => ({ role: 'member' }),
  },
  'DELETE /api/guilds/:guildId/members/:userId': { access: 'admin', path: () => `/api/guilds/${G()}/members/${NOPE}` },
  'GET /api/guilds/:guildId/invitations': { access: 'officer', path: () => `/api/guilds/${G()}/invitations` },
  'POST /api/guilds/:guildId/invitations': {
    access: 'officer',
    path: () => `/api/guilds/${G()}/invitations`,
    body: () => ({ email: uniqueEmail('inv'), role: 'member' }),
  },
  'GET /api/guilds/:guildId/invitations/limits': { access: 'officer', path: () => `/api/guilds/${G()}/invitations/limits` },
  'DELETE /api/guilds/:guildId/invitations/:invitationId': {
    access: 'officer',
    path: () => `/api/guilds/${G()}/invitations/${NOPE}`,
  },
  'GET /api/guilds/:guildId/sew-days': { access: 'member', path: () => `/api/guilds/${G()}/sew-days` },
  'POST /api/guilds/:guildId/sew-days': { access: 'officer', path: () => `/api/guilds/${G()}/sew-days`, body: () => sewDay },
  'GET /api/sew-days/:sewDayId': { access: 'member', path: () => `/api/sew-days/${ids.sewDay}` },
  'PATCH /api/sew-days/:sewDayId': { access: 'officer', path: () => `/api/sew-days/${ids.sewDay}`, body: () => sewDay },
  'POST /api/sew-days/:sewDayId/cancel': { access: 'officer', path: () => `/api/sew-days/${ids.sewDay}/cancel` },
  'PUT /api/sew-days/:sewDayId/rsvp': {
    access: 'member',
    path: () => `/api/sew-days/${ids.sewDay}/rsvp`,
    body: () => ({ answer: 'maybe' }),
  },
  'GET /api/sew-days/:sewDayId/calendar.ics': { access: 'member', path: () => `/api/sew-days/${ids.sewDay}/calendar.ics` },
  'GET /api/chat/rooms/:roomId': { access: 'member', path: () => `/api/chat/rooms/${ids.room}` },
  'GET /api/chat/rooms/:roomId/messages': { access: 'member', path: () => `/api/chat/rooms/${ids.room}/messages` },
  'POST /api/chat/rooms/:roomId/messages': {
    access: 'member',
    path: () => `/api/chat/rooms/${ids.room}/messages`,
    body: () => ({ body: 'hello from the matrix' }),
  },
  'PATCH /api/chat/messages/:messageId': {
    access: ['member'],
    path: () => `/api/chat/messages/${ids.message}`,
    body: () => ({ body: 'edited by its author' }),
  },
  'DELETE /api/chat/messages/:messageId': {
    access: ['member', 'admin'],
    path: () => `/api/chat/messages/${ids.messageToDelete}`,
  },
  'GET /api/swaps/:swapId/chat': { access: 'member', path: () => `/api/swaps/${ids.swap}/chat` },
  'GET /api/swaps/:swapId/activity': { access: 'member', path: () => `/api/swaps/${ids.swap}/activity` },
  'GET /api/guilds/:guildId/swaps': { access: 'member', path: () => `/api/guilds/${G()}/swaps` },
  'POST /api/guilds/:guildId/swaps': {
    access: 'officer',
    path: () => `/api/guilds/${G()}/swaps`,
    body: () => swapBody({ title: 'Matrix swap' }),
  },
  'GET /api/swaps/:swapId': { access: 'member', path: () => `/api/swaps/${ids.swap}` },
  'PATCH /api/swaps/:swapId': {
    access: 'officer',
    path: () => `/api/swaps/${ids.swap}`,
    body: () => ({ title: 'Renamed in the matrix' }),
  },
  'GET /api/swaps/:swapId/transitions': { access: 'member', path: () => `/api/swaps/${ids.swap}/transitions` },
  'GET /api/swaps/:swapId/transitions/preview': {
    access: 'officer',
    path: () => `/api/swaps/${ids.swap}/transitions/preview?to=sorting`,
  },
  'GET /api/swaps/:swapId/distribution': { access: 'officer', path: () => `/api/swaps/${ids.swap}/distribution?by=recipient` },
  'POST /api/swaps/:swapId/handed-in': {
    access: 'member',
    path: () => `/api/swaps/${ids.swap}/handed-in`,
    body: () => ({ blockIds: [ids.block], how: 'in-person' }),
  },
  'POST /api/blocks/:blockId/undo': { access: 'officer', path: () => `/api/blocks/${ids.block}/undo` },
  'POST /api/blocks/:blockId/accept': {
    access: 'officer',
    path: () => `/api/blocks/${ids.block}/accept`,
    body: () => ({ reason: 'Close enough for the raffle quilt' }),
  },
  'POST /api/swaps/:swapId/transitions': {
    access: 'officer',
    path: () => `/api/swaps/${ids.swap}/transitions`,
    body: () => ({ to: 'draft' }),
  },
  'POST /api/swaps/:swapId/signups': {
    access: 'member',
    path: () => `/api/swaps/${ids.swap}/signups`,
    body: () => ({ blocks: 1 }),
  },
  'GET /api/swaps/:swapId/signups/me': { access: 'member', path: () => `/api/swaps/${ids.swap}/signups/me` },
  'DELETE /api/swaps/:swapId/signups/me': { access: 'member', path: () => `/api/swaps/${ids.swap}/signups/me` },
  'GET /api/swaps/:swapId/roster': { access: 'member', path: () => `/api/swaps/${ids.swap}/roster` },
  // Everyone's blocks are for officers; a member lists their own with ?maker=me (tested in blocks.test.ts).
  'GET /api/swaps/:swapId/blocks': { access: 'officer', path: () => `/api/swaps/${ids.swap}/blocks` },
  'GET /api/swaps/:swapId/export/roster.csv': { access: 'officer', path: () => `/api/swaps/${ids.swap}/export/roster.csv` },
  'GET /api/swaps/:swapId/export/distribution.csv': {
    access: 'officer',
    path: () => `/api/swaps/${ids.swap}/export/distribution.csv`,
  },
  'GET /api/blocks/:blockId': { access: 'member', path: () => `/api/blocks/${ids.block}` },
  'GET /api/blocks/:blockId/measurements': { access: 'member', path: () => `/api/blocks/${ids.block}/measurements` },
  'POST /api/blocks/:blockId/sewn': { access: ['member'], path: () => `/api/blocks/${ids.block}/sewn` },
  'POST /api/blocks/:blockId/handed-in': {
    access: ['member'],
    path: () => `/api/blocks/${ids.block}/handed-in`,
    body: () => ({ how: 'in-person' }),
  },
  'POST /api/blocks/:blockId/received': {
    access: 'officer',
    path: () => `/api/blocks/${ids.block}/received`,
    body: () => ({ clientId: randomUUID() }),
  },
  'POST /api/blocks/:blockId/trimmed': { access: 'officer', path: () => `/api/blocks/${ids.block}/trimmed` },
  'POST /api/blocks/:blockId/measurements': {
    access: 'member',
    path: () => `/api/blocks/${ids.block}/measurements`,
    body: () => ({ width: 9.5, height: 9.5 }),
  },
  'POST /api/swaps/:swapId/distribution/plan': { access: 'officer', path: () => `/api/swaps/${ids.swap}/distribution/plan` },
  'POST /api/swaps/:swapId/distribution/confirm': {
    access: 'officer',
    path: () => `/api/swaps/${ids.swap}/distribution/confirm`,
    body: () => ({ transfers: [{ from: g.member.id, to: g.coordinator.id, count: 1 }] }),
  },
  'GET /api/blocks/:blockId/photos': { access: 'member', path: () => `/api/blocks/${ids.block}/photos` },
  'POST /api/blocks/:blockId/photos': {
    access: ['member', 'coordinator', 'admin'],
    path: () => `/api/blocks/${ids.block}/photos`,
  },
  // ids.block is the member's own block: its maker and the officers may measure it from a photo.
  'GET /api/blocks/:blockId/photo-estimates': {
    access: ['member', 'coordinator', 'admin'],
    path: () => `/api/blocks/${ids.block}/photo-estimates`,
  },
  'POST /api/blocks/:blockId/photo-estimates': {
    access: ['member', 'coordinator', 'admin'],
    path: () => `/api/blocks/${ids.block}/photo-estimates`,
    body: () => ({}),
  },
  'GET /api/photos/:photoId': { access: 'member', path: () => `/api/photos/${ids.photo}?size=thumb` },
  'GET /api/photos/:photoId/colour': { access: 'member', path: () => `/api/photos/${ids.photo}/colour` },
  'GET /api/swaps/:swapId/design': { access: 'member', path: () => `/api/swaps/${ids.swap}/design` },
  'PUT /api/swaps/:swapId/design': {
    access: 'member',
    path: () => `/api/swaps/${ids.swap}/design`,
    body: () => ({ columns: 1, rows: 1, cells: [{ blockId: null, rotation: 0 }] }),
  },
  'POST /api/swaps/:swapId/design/arrange': {
    access: 'member',
    path: () => `/api/swaps/${ids.swap}/design/arrange`,
    body: () => ({}),
  },
  'DELETE /api/photos/:photoId': { access: ['member', 'coordinator', 'admin'], path: () => `/api/photos/${ids.photoToDelete}` },
  // Without a signature the payment service's webhook refuses everyone alike (400), signed in or not.
  'POST /api/payments/webhook': {
    access: 'public',
    path: () => '/api/payments/webhook',
    body: () => ({ id: 'evt_test_unsigned' }),
  },
  'GET /api/me/payments': { access: 'user', path: () => '/api/me/payments' },
  'GET /api/swaps/:swapId/fees': { access: 'member', path: () => `/api/swaps/${ids.swap}/fees` },
  'POST /api/swaps/:swapId/checkout': { access: 'member', path: () => `/api/swaps/${ids.swap}/checkout`, body: () => ({}) },
  'GET /api/guilds/:guildId/dues': { access: 'member', path: () => `/api/guilds/${G()}/dues` },
  'POST /api/guilds/:guildId/dues/checkout': {
    access: 'member',
    path: () => `/api/guilds/${G()}/dues/checkout`,
    body: () => ({}),
  },
  'GET /api/guilds/:guildId/payments': { access: 'admin', path: () => `/api/guilds/${G()}/payments` },
  'POST /api/guilds/:guildId/payments/:paymentId/refund': {
    access: 'admin',
    path: () => `/api/guilds/${G()}/payments/${NOPE}/refund`,
  },
  'GET /api/me/mail-preferences': { access: 'user', path: () => '/api/me/mail-preferences' },
  'PATCH /api/me/mail-preferences': { access: 'user', path: () => '/api/me/mail-preferences', body: () => ({ reminders: true }) },
  'GET /api/unsubscribe': { access: 'public', path: () => `/api/unsubscribe?token=${'z'.repeat(40)}` },
  'GET /api/unsubscribe/info': { access: 'public', path: () => `/api/unsubscribe/info?token=${'z'.repeat(40)}` },
  'POST /api/unsubscribe': { access: 'public', path: () => `/api/unsubscribe?token=${'z'.repeat(40)}` },
  'POST /api/unsubscribe/undo': { access: 'public', path: () => `/api/unsubscribe/undo?token=${'z'.repeat(40)}` },
  'GET /api/guilds/:guildId/mail-messages': { access: 'admin', path: () => `/api/guilds/${G()}/mail-messages` },
  'GET /api/guilds/:guildId/mail-messages/:messageId': {
    access: 'admin',
    path: () => `/api/guilds/${G()}/mail-messages/${NOPE}`,
  },
  'GET /api/swaps/:swapId/labels': { access: 'member', path: () => `/api/swaps/${ids.swap}/labels` },
  'GET /api/swaps/:swapId/intake': { access: 'officer', path: () => `/api/swaps/${ids.swap}/intake` },
  'POST /api/intake/resolve': {
    access: 'officer',
    path: () => '/api/intake/resolve',
    body: () => ({ swapId: ids.swap, shortCode: 'K7QM-3XWD' }),
  },
};

const allowedRoles = (access: Access): Role[] => {
  if (Array.isArray(access)) return access;
  return {
    public: ['signedOut', 'stranger', 'member', 'coordinator', 'admin'],
    user: ['stranger', 'member', 'coordinator', 'admin'],
    member: ['member', 'coordinator', 'admin'],
    officer: ['coordinator', 'admin'],
    admin: ['admin'],
  }[access] as Role[];
};

const methodOrder = { GET: 0, PUT: 1, PATCH: 1, POST: 1, DELETE: 2 } as Record<string, number>;

async function call(agent: Agent, method: string, path: string, body?: unknown) {
  const req = agent[method.toLowerCase() as 'get' | 'post' | 'patch' | 'put' | 'delete'](path);
  return body === undefined ? req : req.send(body as object);
}

async function freshAgent(kind: 'anonymous' | 'user'): Promise<Agent> {
  return kind === 'anonymous' ? app.agent() : (await signedInUser(app)).agent;
}

it('has an entry for every route the router answers', () => {
  const routes = listRoutes(app.app)
    .filter((r) => r.path.startsWith('/api'))
    .map((r) => `${r.method} ${r.path}`);
  expect(routes.filter((r) => !(r in cases))).toEqual([]);
  expect(Object.keys(cases).filter((c) => !routes.includes(c))).toEqual([]);
});

describe('each role gets the expected answer', () => {
  const entries = Object.entries(cases).sort(([a], [b]) => methodOrder[a.split(' ')[0]!]! - methodOrder[b.split(' ')[0]!]!);
  for (const [key, c] of entries) {
    it(key, async () => {
      const method = key.split(' ')[0]!;
      const allowed = allowedRoles(c.access);
      const agents: Record<Role, Agent> = {
        signedOut: app.agent(),
        stranger: g.stranger.agent,
        member: g.member.agent,
        coordinator: g.coordinator.agent,
        admin: g.admin.agent,
      };
      // Denied callers first, so an allowed call that changes something cannot hide a refusal.
      const order: Role[] = ['signedOut', 'stranger', 'member', 'coordinator', 'admin'].sort(
        (a, b) => Number(allowed.includes(a as Role)) - Number(allowed.includes(b as Role)),
      ) as Role[];
      const got: Record<string, number> = {};
      for (const role of order) {
        const agent =
          c.fresh && role !== 'signedOut' ? await freshAgent(c.fresh) : c.fresh === 'anonymous' ? app.agent() : agents[role];
        got[role] = (await call(agent, method, c.path(), c.body?.())).status;
      }
      const problems = order.flatMap((role) => {
        const status = got[role]!;
        if (status >= 500) return [`${role}: ${status}`];
        if (allowed.includes(role)) return status === 401 || status === 403 ? [`${role} should pass but got ${status}`] : [];
        if (role === 'signedOut') return status === 401 ? [] : [`signedOut should get 401, got ${status}`];
        // An outsider learns nothing from an id: 404 whether it exists or not (401/400 where no id is involved).
        if (role === 'stranger') return status === 404 || status === 400 ? [] : [`stranger should get 404, got ${status}`];
        return status === 403 ? [] : [`${role} should get 403, got ${status}`];
      });
      expect(problems, JSON.stringify(got)).toEqual([]);
    });
  }
});
