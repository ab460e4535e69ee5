import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { Photo } from '../../server/db/models';
import { demoBlockSvg, demoDesigns, seedDemoPhotos } from '../../server/seed/photos';
import { addBlock, swapWithBlock } from '../fixtures/photo-blocks';
import { driverEnv, photoDrivers, storedNames } from './photos-support';

describe.each(photoDrivers)('with the %s photo store', (driver) => {
  let app: TestApp;
  beforeAll(async () => {
    app = await createTestApp(driverEnv(driver));
  });
  afterAll(() => app.close());

  describe('demo block photos', () => {
    it('draws the same picture for the same block and different ones for different blocks', () => {
      expect(demoBlockSvg('pinwheel', 7)).toBe(demoBlockSvg('pinwheel', 7));
      expect(demoBlockSvg('pinwheel', 7)).not.toBe(demoBlockSvg('pinwheel', 8));
      expect(new Set(demoDesigns.map((d) => demoBlockSvg(d, 1))).size).toBe(demoDesigns.length);
    });

    it('stores one re-encoded photo per block through the upload pipeline, credited to the maker', async () => {
      const roles = await guildWithRoles(app);
      const { swapId, blockId } = await swapWithBlock(app, roles.guildId, roles.member.id, { blockState: 'sewn' });
      const second = await addBlock(app, swapId, roles.coordinator.id, 'handed_in');
      const blocks = [
        { id: blockId, guildId: roles.guildId, makerId: roles.member.id },
        { id: second, guildId: roles.guildId, makerId: roles.coordinator.id },
      ];
      expect(await seedDemoPhotos(app.deps.sequelize, app.deps.config, blocks)).toBe(2);

      const rows = await Photo.findAll({ order: [['id', 'ASC']] });
      expect(rows.map((r) => [r.blockId, r.uploadedById, r.width, r.height, r.mime])).toEqual([
        [blockId, roles.member.id, 1600, 1200, 'image/jpeg'],
        [second, roles.coordinator.id, 1600, 1200, 'image/jpeg'],
      ]);
      expect(await storedNames(app)).toEqual(rows.flatMap((r) => [r.fileName, r.thumbFileName]).sort());

      // Members see it like any uploaded photo.
      const res = await roles.member.agent
        .get(`/api/photos/${rows[0]!.id}?size=thumb`)
        .buffer(true)
        .parse((r, cb) => {
          const chunks: Buffer[] = [];
          r.on('data', (c: Buffer) => chunks.push(c));
          r.on('end', () => cb(null, Buffer.concat(chunks)));
        })
        .expect(200);
      const meta = await sharp(res.body as Buffer).metadata();
      expect([meta.format, meta.width, meta.height, meta.exif]).toEqual(['jpeg', 480, 360, undefined]);
    });
  });
});
