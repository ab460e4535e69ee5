import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import ICAL from 'ical.js';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles, signedInUser } from '../helpers/factories';
import type { SewDayDetailDto, SewDayListDto } from '../../shared/schemas/sewdays';

let app: TestApp;
let g: Awaited<ReturnType<typeof guildWithRoles>>;

const nextYear = new Date().getUTCFullYear() + 1;
const winterDay = {
  title: 'Winter piecing day',
  startsAt: `${nextYear}-01-16T10:00`,
  endsAt: `${nextYear}-01-16T15:30`,
  place: 'Library community room, 2nd floor',
  videoUrl: 'https://video.example.org/kestrel',
  notes: 'Bring a project and a sandwich.',
};

beforeAll(async () => {
  app = await createTestApp();
  g = await guildWithRoles(app);
  // A guild in a zone with daylight-saving time, to check wall times are read there.
  await g.admin.agent.patch(`/api/guilds/${g.guildId}`).send({ timeZone: 'America/Chicago' }).expect(200);
});
afterAll(async () => {
  await app?.close();
});

async function schedule(body: Record<string, unknown> = winterDay) {
  const res = await g.coordinator.agent.post(`/api/guilds/${g.guildId}/sew-days`).send(body).expect(201);
  return res.body as SewDayDetailDto;
}

describe('scheduling', () => {
  it('lets admins and coordinators schedule, and refuses members, strangers and the signed-out', async () => {
    await g.admin.agent.post(`/api/guilds/${g.guildId}/sew-days`).send(winterDay).expect(201);
    const made = await schedule();
    expect(made).toMatchObject({
      title: 'Winter piecing day',
      place: winterDay.place,
      videoUrl: winterDay.videoUrl,
      canManage: true,
      cancelledAt: null,
    });
    expect(made.chatRoomId).toEqual(expect.any(Number));

    const member = await g.member.agent.post(`/api/guilds/${g.guildId}/sew-days`).send(winterDay).expect(403);
    expect(member.body.error.code).toBe('forbidden');
    await g.stranger.agent.post(`/api/guilds/${g.guildId}/sew-days`).send(winterDay).expect(404);
    await app.agent().post(`/api/guilds/${g.guildId}/sew-days`).send(winterDay).expect(401);
  });

  it('reads wall times in the guild time zone', async () => {
    // IANA tz database: America/Chicago is UTC−6 in January and UTC−5 from the second Sunday of
    // March (US Energy Policy Act of 2005), so 10:00 becomes 16:00 UTC in winter and 15:00 UTC in summer.
    const winter = await schedule();
    expect(winter.startsAt).toBe(`${nextYear}-01-16T16:00:00.000Z`);
    expect(winter.startsAtLocal).toBe(`${nextYear}-01-16T10:00`);
    expect(winter.timeZone).toBe('America/Chicago');
    const summer = await schedule({ ...winterDay, startsAt: `${nextYear}-07-10T10:00`, endsAt: `${nextYear}-07-10T12:00` });
    expect(summer.startsAt).toBe(`${nextYear}-07-10T15:00:00.000Z`);
  });

  it('explains what is wrong and names the field', async () => {
    const res = await g.coordinator.agent
      .post(`/api/guilds/${g.guildId}/sew-days`)
      .send({ ...winterDay, endsAt: winterDay.startsAt, place: '', videoUrl: '' })
      .expect(400);
    expect(res.body.error.fields).toMatchObject({
      endsAt: 'The end must come after the start.',
      place: 'Give a place, a video link, or both.',
    });
    const link = await g.coordinator.agent
      .post(`/api/guilds/${g.guildId}/sew-days`)
      .send({ ...winterDay, videoUrl: 'javascript:alert(1)' })
      .expect(400);
    expect(link.body.error.fields.videoUrl).toBe('Give a video link starting with https://');
    const date = await g.coordinator.agent
      .post(`/api/guilds/${g.guildId}/sew-days`)
      .send({ ...winterDay, startsAt: 'next tuesday' })
      .expect(400);
    expect(date.body.error.fields.startsAt).toMatch(/date and time/);
  });
});

describe('editing and cancelling', () => {
  it('lets officers edit some fields, keeps the rest, and refuses members', async () => {
    const made = await schedule();
    const res = await g.admin.agent
      .patch(`/api/sew-days/${made.id}`)
      .send({ title: 'Winter piecing day (moved upstairs)', place: 'Room 204' })
      .expect(200);
    expect(res.body).toMatchObject({
      title: 'Winter piecing day (moved upstairs)',
      place: 'Room 204',
      startsAt: made.startsAt,
      notes: made.notes,
    });
    await g.member.agent.patch(`/api/sew-days/${made.id}`).send({ title: 'Mine now' }).expect(403);
    const bad = await g.coordinator.agent
      .patch(`/api/sew-days/${made.id}`)
      .send({ endsAt: `${nextYear}-01-16T09:00` })
      .expect(400);
    expect(bad.body.error.fields.endsAt).toBe('The end must come after the start.');
    const unknown = await g.coordinator.agent.patch(`/api/sew-days/${made.id}`).send({ guildId: 99 }).expect(400);
    expect(unknown.body.error.message).toMatch(/Only title/);
  });

  it('cancels once, keeps the day listed as cancelled, and then refuses changes and answers', async () => {
    const made = await schedule();
    await g.member.agent.post(`/api/sew-days/${made.id}/cancel`).expect(403);
    const res = await g.coordinator.agent.post(`/api/sew-days/${made.id}/cancel`).expect(200);
    expect(res.body.cancelledAt).toEqual(expect.any(String));
    expect((await g.coordinator.agent.post(`/api/sew-days/${made.id}/cancel`).expect(409)).body.error.code).toBe(
      'sew_day_cancelled',
    );
    await g.coordinator.agent.patch(`/api/sew-days/${made.id}`).send({ title: 'Back on' }).expect(409);
    await g.member.agent.put(`/api/sew-days/${made.id}/rsvp`).send({ answer: 'going' }).expect(409);
    const list = await g.member.agent.get(`/api/guilds/${g.guildId}/sew-days`).expect(200);
    expect((list.body as SewDayListDto).sewDays.find((d) => d.id === made.id)?.cancelledAt).toEqual(expect.any(String));
  });
});

describe('answers', () => {
  it('records, replaces and counts answers, and shows who is coming', async () => {
    const made = await schedule();
    const first = await g.member.agent.put(`/api/sew-days/${made.id}/rsvp`).send({ answer: 'going' }).expect(200);
    expect(first.body).toMatchObject({ myRsvp: 'going', rsvpCounts: { going: 1, maybe: 0, no: 0 }, canManage: false });
    await g.admin.agent.put(`/api/sew-days/${made.id}/rsvp`).send({ answer: 'maybe' }).expect(200);
    const changed = await g.member.agent.put(`/api/sew-days/${made.id}/rsvp`).send({ answer: 'no' }).expect(200);
    expect(changed.body.rsvpCounts).toEqual({ going: 0, maybe: 1, no: 1 });
    expect(changed.body.rsvps).toEqual(
      expect.arrayContaining([
        { userId: g.member.id, displayName: expect.any(String), answer: 'no' },
        { userId: g.admin.id, displayName: 'Ada Admin', answer: 'maybe' },
      ]),
    );
    const bad = await g.member.agent.put(`/api/sew-days/${made.id}/rsvp`).send({ answer: 'perhaps' }).expect(400);
    expect(bad.body.error.fields.answer).toBe('Answer going, maybe or no.');
    await g.stranger.agent.put(`/api/sew-days/${made.id}/rsvp`).send({ answer: 'going' }).expect(404);
    await g.stranger.agent.get(`/api/sew-days/${made.id}`).expect(404);
    await g.member.agent.get('/api/sew-days/999999').expect(404);
  });

  it('lists upcoming soonest first and past most recent first, and takes no answers once over', async () => {
    const pastYear = new Date().getUTCFullYear() - 1;
    const past = await schedule({
      ...winterDay,
      title: 'Last year',
      startsAt: `${pastYear}-02-01T10:00`,
      endsAt: `${pastYear}-02-01T12:00`,
    });
    const later = await schedule({
      ...winterDay,
      title: 'Much later',
      startsAt: `${nextYear + 1}-02-01T10:00`,
      endsAt: `${nextYear + 1}-02-01T12:00`,
    });
    const upcomingList = (await g.member.agent.get(`/api/guilds/${g.guildId}/sew-days?when=upcoming`).expect(200))
      .body as SewDayListDto;
    expect(upcomingList).toMatchObject({ timeZone: 'America/Chicago', canManage: false });
    const upcoming = upcomingList.sewDays;
    expect(upcoming.map((d) => d.id)).not.toContain(past.id);
    expect(upcoming.at(-1)?.id).toBe(later.id);
    expect(upcoming.map((d) => d.startsAt)).toEqual([...upcoming.map((d) => d.startsAt)].sort());
    const before = ((await g.member.agent.get(`/api/guilds/${g.guildId}/sew-days?when=past`).expect(200)).body as SewDayListDto)
      .sewDays;
    expect(before.map((d) => d.id)).toEqual([past.id]);
    expect(
      (await g.member.agent.put(`/api/sew-days/${past.id}/rsvp`).send({ answer: 'going' }).expect(409)).body.error.code,
    ).toBe('sew_day_over');
    await g.member.agent.get(`/api/guilds/${g.guildId}/sew-days?when=someday`).expect(400);
  });
});

describe('calendar file', () => {
  it('is an iCalendar event a standard parser reads back, updated in place when the day changes', async () => {
    const made = await schedule();
    const res = await g.member.agent.get(`/api/sew-days/${made.id}/calendar.ics`).expect(200);
    expect(res.headers['content-type']).toMatch(/^text\/calendar/);
    expect(res.headers['content-disposition']).toBe(`attachment; filename="sew-day-${made.id}.ics"`);

    // ical.js (a standalone RFC 5545 parser) is the outside check of the ics package's output.
    const event = new ICAL.Event(new ICAL.Component(ICAL.parse(res.text)).getFirstSubcomponent('vevent')!);
    expect(event.summary).toContain('Winter piecing day');
    expect(event.startDate.toJSDate().toISOString()).toBe(made.startsAt);
    expect(event.endDate.toJSDate().toISOString()).toBe(made.endsAt);
    expect(event.location).toBe(winterDay.place);
    expect(event.description).toContain('Bring a project and a sandwich.');
    expect(event.description).toContain(winterDay.videoUrl);
    expect(event.description).toMatch(/Take care: .*iron/i);
    expect(event.component.getFirstPropertyValue('status')).toBe('CONFIRMED');
    const uid = event.uid;

    await g.coordinator.agent.post(`/api/sew-days/${made.id}/cancel`).expect(200);
    const after = await g.member.agent.get(`/api/sew-days/${made.id}/calendar.ics`).expect(200);
    const cancelled = new ICAL.Event(new ICAL.Component(ICAL.parse(after.text)).getFirstSubcomponent('vevent')!);
    expect(cancelled.uid).toBe(uid);
    expect(cancelled.sequence).toBe(event.sequence + 1);
    expect(cancelled.component.getFirstPropertyValue('status')).toBe('CANCELLED');

    await g.stranger.agent.get(`/api/sew-days/${made.id}/calendar.ics`).expect(404);
    const outsider = await signedInUser(app);
    await outsider.agent.get(`/api/sew-days/${made.id}/calendar.ics`).expect(404);
  });
});
