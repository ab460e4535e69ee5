/**
 * Edge input and small leaks: ids too large to exist, impossible dates, NUL characters, insecure
 * video links, names that hide or imitate, outsiders probing ids, another maker's hand-in note, and
 * chat edits sent in a flood. Each answer is a clear 4xx that names the field; nothing is stored.
 */
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles, joinGuild, PASSWORD, signedInUser, uniqueEmail } from '../helpers/factories';
import { myBlocks, sewingSwap, type Roles } from './swaps-support';

let app: TestApp;
let roles: Roles;
let swapId: number;
let memberBlock: number;
let sewDayId: number;
let roomId: number;
let photoId: number;

const nextYear = new Date().getUTCFullYear() + 1;
const sewDay = {
  title: 'Edge sew day',
  startsAt: `${nextYear}-03-14T10:00`,
  endsAt: `${nextYear}-03-14T15:00`,
  place: 'Library room B',
};

beforeAll(async () => {
  app = await createTestApp();
  roles = await guildWithRoles(app);
  const { swap } = await sewingSwap(app, roles, { pledges: [2, 1] });
  swapId = swap.id;
  memberBlock = (await myBlocks(roles.member.agent, swapId))[0]!.id;
  sewDayId = (await roles.coordinator.agent.post(`/api/guilds/${roles.guildId}/sew-days`).send(sewDay).expect(201)).body.id;
  roomId = (await roles.member.agent.get(`/api/swaps/${swapId}/chat`).expect(200)).body.id;
  const jpeg = await sharp({ create: { width: 200, height: 200, channels: 3, background: '#5F7A5A' } })
    .jpeg()
    .toBuffer();
  const up = await roles.member.agent.post(`/api/blocks/${memberBlock}/photos`).attach('photos', jpeg, 'block.jpg').expect(201);
  photoId = up.body.photos[0].id;
}, 60_000);
afterAll(() => app.close());

async function rowCount(table: string) {
  const { rows } = await app.deps.pool.query<{ n: string }>(`SELECT count(*) AS n FROM ${table}`);
  return Number(rows[0]!.n);
}

describe('ids too large to exist', () => {
  const huge = ['2147483648', '9999999999', '99999999999999999999'];
  it.each([
    ['block', (id: string) => `/api/blocks/${id}`],
    ['block measurements', (id: string) => `/api/blocks/${id}/measurements`],
    ['block photos', (id: string) => `/api/blocks/${id}/photos`],
    ['swap', (id: string) => `/api/swaps/${id}`],
    ['sew day', (id: string) => `/api/sew-days/${id}`],
    ['photo', (id: string) => `/api/photos/${id}`],
    ['guild', (id: string) => `/api/guilds/${id}`],
    ['chat room', (id: string) => `/api/chat/rooms/${id}`],
  ])('answer 404 for a %s', async (_what, path) => {
    for (const id of huge) {
      const res = await roles.admin.agent.get(path(id));
      expect(res.status, `${path(id)}: ${JSON.stringify(res.body)}`).toBe(404);
      expect(res.body.error.code).toBe('not_found');
    }
  });

  it('answers 404 for a state change on a block too', async () => {
    const res = await roles.member.agent.post('/api/blocks/2147483648/handed-in').send({ how: 'post' });
    expect(res.status).toBe(404);
  });
});

describe('sew-day times', () => {
  it.each([
    ['0000-01-01T10:00', 'Choose a year between 2000 and 2200.'],
    ['9999-01-01T10:00', 'Choose a year between 2000 and 2200.'],
    [`${nextYear}-02-30T10:00`, `February ${nextYear} has 28 days: there is no day 30.`],
    [`${nextYear}-04-31T10:00`, `April ${nextYear} has 30 days: there is no day 31.`],
    [`${nextYear}-13-01T10:00`, 'There is no month 13: use 01 to 12.'],
    [`${nextYear}-03-14T24:00`, 'Give a time of day from 00:00 to 23:59.'],
  ])('refuses %s with a reason', async (startsAt, message) => {
    const before = await rowCount('sew_days');
    const res = await roles.coordinator.agent
      .post(`/api/guilds/${roles.guildId}/sew-days`)
      .send({ ...sewDay, startsAt })
      .expect(400);
    expect(res.body.error.fields.startsAt).toBe(message);
    expect(await rowCount('sew_days')).toBe(before);
  });

  it('accepts 29 February in a leap year', async () => {
    await roles.coordinator.agent
      .post(`/api/guilds/${roles.guildId}/sew-days`)
      .send({ ...sewDay, startsAt: '2028-02-29T10:00', endsAt: '2028-02-29T12:00' })
      .expect(201);
  });

  it('takes video links over https only', async () => {
    const res = await roles.coordinator.agent
      .post(`/api/guilds/${roles.guildId}/sew-days`)
      .send({ ...sewDay, place: null, videoUrl: 'http://video.example.org/bee' })
      .expect(400);
    expect(res.body.error.fields.videoUrl).toBe('Give a video link starting with https://');
  });
});

describe('NUL characters', () => {
  it('refuses a NUL anywhere in a JSON body, naming the field, and stores nothing', async () => {
    const before = await rowCount('sew_days');
    const res = await roles.coordinator.agent
      .post(`/api/guilds/${roles.guildId}/sew-days`)
      .send({ ...sewDay, notes: 'Bring pins\u0000 and thread' })
      .expect(400);
    expect(res.body.error).toMatchObject({
      code: 'validation',
      fields: { notes: 'Remove the invisible NUL character from this text.' },
    });
    expect(await rowCount('sew_days')).toBe(before);
  });

  it('refuses a NUL in a query string', async () => {
    await roles.admin.agent.get(`/api/guilds/${roles.guildId}/mail-messages?q=a%00b`).expect(400);
  });

  it('refuses a photo whose file name holds a NUL', async () => {
    const jpeg = await sharp({ create: { width: 64, height: 64, channels: 3, background: '#2F4B7C' } })
      .jpeg()
      .toBuffer();
    const before = await rowCount('photos');
    const res = await roles.member.agent.post(`/api/blocks/${memberBlock}/photos`).attach('photos', jpeg, 'block\u0000.jpg');
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'bad_file_name', message: expect.stringMatching(/Rename the photo/) });
    expect(await rowCount('photos')).toBe(before);
  });
});

describe('display names', () => {
  it('strips control and direction-changing characters', async () => {
    const email = uniqueEmail('bidi');
    await app
      .agent()
      .post('/api/auth/register')
      .send({ email, password: PASSWORD, displayName: 'Ma\u202Eeva\u202C\u0007\t\u200BLindqvist\u2066' })
      .expect(202);
    // The name is stored as cleaned with the sign-up waiting for its address to be confirmed.
    const { PendingSignup } = await import('../../server/db/models');
    const pending = await PendingSignup.findOne({ where: { email } });
    expect(pending?.displayName).toBe('Maeva Lindqvist');
  });

  it.each(['\u200B\u200B\u200B', '\u202E\u202C', '   ', '\u2066\u2069 ...'])(
    'refuses a name with nothing to read (%j)',
    async (displayName) => {
      const res = await app
        .agent()
        .post('/api/auth/register')
        .send({ email: uniqueEmail('blank'), password: PASSWORD, displayName })
        .expect(400);
      expect(res.body.error.fields.displayName).toMatch(/Enter your name|at least one letter/);
    },
  );

  it('refuses another member’s exact name in a guild, with a suggestion', async () => {
    const other = await joinGuild(app, roles.guildId, 'member');
    const res = await other.agent.patch('/api/me').send({ displayName: ' ada  ADMIN ' }).expect(409);
    expect(res.body.error.code).toBe('name_taken');
    expect(res.body.error.message).toMatch(/already called “Ada Admin”/);
    const suggestion = /such as “([^”]+)”/.exec(res.body.error.message)?.[1];
    expect(suggestion).toBeTruthy();
    await other.agent.patch('/api/me').send({ displayName: suggestion }).expect(200);
  });

  it('refuses to join a guild under a name a member already has', async () => {
    const twin = await signedInUser(app, { displayName: 'Ada Admin' });
    await roles.admin.agent.post(`/api/guilds/${roles.guildId}/invitations`).send({ email: twin.email }).expect(201);
    const { Invitation } = await import('../../server/db/models');
    const { newToken } = await import('../../server/auth/tokens');
    const { token, tokenHash } = newToken();
    await Invitation.update({ tokenHash }, { where: { email: twin.email } });
    const res = await twin.agent.post(`/api/invitations/${token}/accept`).expect(409);
    expect(res.body.error.code).toBe('name_taken');
    await twin.agent.get(`/api/guilds/${roles.guildId}`).expect(404);
  });
});

describe('outsiders', () => {
  it.each([
    ['swap', () => `/api/swaps/${swapId}`, '/api/swaps/2000000000'],
    ['block', () => `/api/blocks/${memberBlock}`, '/api/blocks/2000000000'],
    ['sew day', () => `/api/sew-days/${sewDayId}`, '/api/sew-days/2000000000'],
    ['chat room', () => `/api/chat/rooms/${roomId}/messages`, '/api/chat/rooms/2000000000/messages'],
    ['photo', () => `/api/photos/${photoId}`, '/api/photos/2000000000'],
    ['guild', () => `/api/guilds/${roles.guildId}/members`, '/api/guilds/2000000000/members'],
  ])('get the same answer for a %s that exists and one that does not', async (_what, existing, missing) => {
    const seen = await roles.stranger.agent.get(existing());
    const absent = await roles.stranger.agent.get(missing);
    expect(seen.status).toBe(404);
    expect(seen.body).toEqual(absent.body);
  });
});

describe('hand-in notes', () => {
  it('are shown to the block’s maker and the officers only', async () => {
    const [block] = await myBlocks(roles.member.agent, swapId);
    await roles.member.agent.post(`/api/blocks/${block!.id}/sewn`).expect(200);
    await roles.member.agent
      .post(`/api/blocks/${block!.id}/handed-in`)
      .send({ how: 'post', note: 'Tracking 9400 1000 0000 0000' })
      .expect(200);
    const noteSeenBy = async (agent: typeof roles.member.agent) =>
      (await agent.get(`/api/blocks/${block!.id}`).expect(200)).body.handIn;
    expect(await noteSeenBy(roles.member.agent)).toEqual({ how: 'post', note: 'Tracking 9400 1000 0000 0000' });
    expect(await noteSeenBy(roles.coordinator.agent)).toEqual({ how: 'post', note: 'Tracking 9400 1000 0000 0000' });
    expect(await noteSeenBy(roles.admin.agent)).toEqual({ how: 'post', note: 'Tracking 9400 1000 0000 0000' });
    const otherMaker = await joinGuild(app, roles.guildId, 'member');
    expect(await noteSeenBy(otherMaker.agent)).toEqual({ how: 'post', note: null });
  });
});

describe('chat edits', () => {
  it('are rate limited like new messages', async () => {
    const { CHAT_RATE_LIMIT } = await import('../../shared/schemas/chat');
    const posted = await roles.coordinator.agent
      .post(`/api/chat/rooms/${roomId}/messages`)
      .send({ body: 'first draft' })
      .expect(201);
    const edits = [];
    for (let i = 0; i < CHAT_RATE_LIMIT; i += 1) {
      edits.push(
        (await roles.coordinator.agent.patch(`/api/chat/messages/${posted.body.id}`).send({ body: `draft ${i}` })).status,
      );
    }
    expect(edits.every((s) => s === 200)).toBe(true);
    const refused = await roles.coordinator.agent
      .patch(`/api/chat/messages/${posted.body.id}`)
      .send({ body: 'one too many' })
      .expect(429);
    expect(refused.body.error.message).toMatch(/editing messages faster than the room allows/);
    expect(Number(refused.body.error.fields.retryAfterSeconds)).toBeGreaterThan(0);
    const page = await roles.coordinator.agent.get(`/api/chat/rooms/${roomId}/messages`).expect(200);
    expect(page.body.messages.find((m: { id: number }) => m.id === posted.body.id).body).toBe(`draft ${CHAT_RATE_LIMIT - 1}`);
  });
});
