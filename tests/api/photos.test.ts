import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import sharp from 'sharp';
import exifReader from 'exif-reader';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles, joinGuild } from '../helpers/factories';
import { Membership, Photo } from '../../server/db/models';
import type { DomainEventName } from '../../server/events';
import { driverEnv, isStored, photoDrivers, storedNames } from './photos-support';
import { jpegWithGps, picture, TEST_GPS } from '../fixtures/photos';
import { addBlock, blockState, swapWithBlock } from '../fixtures/photo-blocks';

describe.each(photoDrivers)('with the %s photo store', (driver) => {
  let app: TestApp;
  let roles: Awaited<ReturnType<typeof guildWithRoles>>;
  let swapId: number;
  let blockId: number;
  let ids: number[] = [];
  const events: { name: DomainEventName; payload: Record<string, unknown> }[] = [];

  beforeAll(async () => {
    app = await createTestApp(driverEnv(driver));
    roles = await guildWithRoles(app);
    ({ swapId, blockId } = await swapWithBlock(app, roles.guildId, roles.member.id));
    app.deps.events.onAny((name, payload) => {
      events.push({ name, payload: payload as Record<string, unknown> });
    });
  });
  afterAll(() => app.close());

  const binary = (res: supertest.Response, cb: (err: Error | null, body: Buffer) => void) => {
    const chunks: Buffer[] = [];
    res.on('data', (c: Buffer) => chunks.push(c));
    res.on('end', () => cb(null, Buffer.concat(chunks)));
  };

  function getPhoto(agent: ReturnType<TestApp['agent']>, url: string) {
    return agent.get(url).buffer(true).parse(binary);
  }

  describe('uploading block photos', () => {
    it('takes JPEG, PNG and WebP in one batch, re-encodes them, and marks the pledged block sewn', async () => {
      const res = await roles.member.agent
        .post(`/api/blocks/${blockId}/photos`)
        .attach('photos', await jpegWithGps(3200, 2400), { filename: 'garden table.jpg', contentType: 'image/jpeg' })
        .attach('photos', await picture('png', 1000, 1000), { filename: 'block.png', contentType: 'image/png' })
        .attach('photos', await picture('webp', 640, 480), { filename: 'detail.webp', contentType: 'image/webp' })
        .expect(201);
      expect(res.body.block).toEqual({ id: blockId, state: 'sewn' });
      expect(res.body.photos).toHaveLength(3);
      const [first] = res.body.photos;
      expect(first).toMatchObject({
        blockId,
        guildId: roles.guildId,
        chatMessageId: null,
        uploadedBy: { id: roles.member.id, displayName: expect.any(String) },
        mime: 'image/jpeg',
        width: 2400,
        height: 1800,
        thumbWidth: 480,
        thumbHeight: 360,
        url: `/api/photos/${first.id}`,
        thumbUrl: `/api/photos/${first.id}?size=thumb`,
      });
      ids = res.body.photos.map((p: { id: number }) => p.id);
      expect(await storedNames(app)).toHaveLength(6);
      expect(await blockState(app, blockId)).toBe('sewn');

      const names = events.map((e) => e.name);
      expect(names.filter((n) => n === 'photo.added')).toHaveLength(3);
      expect(events.find((e) => e.name === 'block.changed')?.payload).toMatchObject({
        blockId,
        swapId,
        from: 'pledged',
        to: 'sewn',
      });
      expect(events.find((e) => e.name === 'photo.added')?.payload).toMatchObject({
        swapId,
        guildId: roles.guildId,
        blockId,
        makerId: roles.member.id,
        actorId: roles.member.id,
        photoId: ids[0],
      });
    });

    it('serves the stored JPEG without the GPS position, with private caching and nosniff', async () => {
      // The upload really carried a position (checked on the fixture itself).
      const sent = exifReader((await sharp(await jpegWithGps()).metadata()).exif!);
      expect(sent.GPSInfo?.GPSLatitude).toEqual(TEST_GPS.latitude);

      const res = await getPhoto(roles.coordinator.agent, `/api/photos/${ids[0]}`).expect(200);
      expect(res.headers['content-type']).toBe('image/jpeg');
      expect(res.headers['x-content-type-options']).toBe('nosniff');
      expect(res.headers['cache-control']).toMatch(/^private\b/);
      const meta = await sharp(res.body as Buffer).metadata();
      expect([meta.format, meta.width, meta.height]).toEqual(['jpeg', 2400, 1800]);
      expect(meta.exif).toBeUndefined();
      expect(meta.xmp).toBeUndefined();

      const thumb = await getPhoto(roles.member.agent, `/api/photos/${ids[0]}?size=thumb`).expect(200);
      const thumbMeta = await sharp(thumb.body as Buffer).metadata();
      expect([thumbMeta.width, thumbMeta.height, thumbMeta.exif]).toEqual([480, 360, undefined]);
    });

    it('lists the block’s photos for any member of the guild, oldest first', async () => {
      const viewer = await joinGuild(app, roles.guildId, 'member');
      const res = await viewer.agent.get(`/api/blocks/${blockId}/photos`).expect(200);
      expect(res.body.map((p: { id: number }) => p.id)).toEqual(ids);
    });

    it('lets a coordinator add photos to a member’s block; a second upload leaves the state alone', async () => {
      const before = events.length;
      const res = await roles.coordinator.agent
        .post(`/api/blocks/${blockId}/photos`)
        .attach('photos', await picture('jpeg'), 'at-meeting.jpg')
        .expect(201);
      expect(res.body.block.state).toBe('sewn');
      expect(events.slice(before).map((e) => e.name)).toEqual(['photo.added']);
      ids.push(res.body.photos[0].id);
    });
  });

  describe('who sees a photo', () => {
    it('serves members of the guild, refuses strangers with 404 and signed-out callers with 401', async () => {
      const url = () => `/api/photos/${ids[0]}`;
      await getPhoto(roles.member.agent, url()).expect(200);
      await getPhoto(roles.admin.agent, url()).expect(200);
      const stranger = await roles.stranger.agent.get(url()).expect(404);
      expect(stranger.body.error.message).toBe('That photo does not exist, or it was removed.');
      await supertest(app.app).get(url()).expect(401);
      await roles.stranger.agent.get(`/api/blocks/${blockId}/photos`).expect(404);
      await supertest(app.app).get(`/api/blocks/${blockId}/photos`).expect(401);
    });

    it('stops serving a member once they leave the guild', async () => {
      const leaver = await joinGuild(app, roles.guildId, 'member');
      await getPhoto(leaver.agent, `/api/photos/${ids[0]}`).expect(200);
      await Membership.update({ status: 'removed' }, { where: { userId: leaver.id, guildId: roles.guildId } });
      await leaver.agent.get(`/api/photos/${ids[0]}`).expect(404);
    });

    it('answers bad ids and sizes with clear errors', async () => {
      await roles.member.agent.get('/api/photos/999999').expect(404);
      const bad = await roles.member.agent.get(`/api/photos/${ids[0]}?size=huge`).expect(400);
      expect(bad.body.error.message).toMatch(/“full” or “thumb”/);
      await roles.member.agent.get('/api/photos/not-a-number').expect(400);
      await roles.member.agent.post('/api/blocks/999999/photos').attach('photos', Buffer.from('x'), 'x.jpg').expect(404);
    });
  });

  describe('removing photos', () => {
    it('refuses other members; lets the uploader and a coordinator remove, files and all', async () => {
      const [own, second] = ids;
      const other = await joinGuild(app, roles.guildId, 'member');
      const refused = await other.agent.delete(`/api/photos/${own}`).expect(403);
      expect(refused.body.error.message).toMatch(/Only the person who posted this photo or a coordinator/);
      await roles.stranger.agent.delete(`/api/photos/${own}`).expect(404);

      const row = (await Photo.findByPk(own))!;
      expect(await isStored(app, row.fileName)).toBe(true);
      await roles.member.agent.delete(`/api/photos/${own}`).expect(204);
      expect(await isStored(app, row.fileName)).toBe(false);
      expect(await isStored(app, row.thumbFileName)).toBe(false);
      await roles.member.agent.get(`/api/photos/${own}`).expect(404);

      // The coordinator removes the maker's photo too.
      await roles.coordinator.agent.delete(`/api/photos/${second}`).expect(204);
    });

    it('uploads to another block of the same maker without touching the first', async () => {
      const second = await addBlock(app, swapId, roles.member.id);
      await roles.member.agent
        .post(`/api/blocks/${second}/photos`)
        .attach('photos', await picture('png'), 'second.png')
        .expect(201);
      expect(await blockState(app, second)).toBe('sewn');
      const list = await roles.member.agent.get(`/api/blocks/${second}/photos`).expect(200);
      expect(list.body).toHaveLength(1);
    });
  });
});
