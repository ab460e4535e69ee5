/**
 * The owner marker of a photo store, on both drivers: written on first use, accepted for the same
 * install, refused (with a message saying how to proceed) for another install or an unreadable marker.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { storageOf } from '../../server/uploads/photo-store';
import { claimPhotoStore, installId, PhotoStoreOwnedElsewhereError } from '../../server/uploads/store-identity';
import { photoStorage } from '../../server/uploads/storage';
import { driverEnv, photoDrivers } from './photos-support';

describe.each(photoDrivers)('with the %s photo store', (driver) => {
  let app: TestApp;
  beforeAll(async () => {
    app = await createTestApp(driverEnv(driver));
  });
  afterAll(() => app.close());

  it('marks a new store with this install’s identity, then accepts it on every later start', async () => {
    const storage = storageOf(app.deps);
    expect(await storage.readMarker()).toBeNull();
    const first = await claimPhotoStore(app.deps.sequelize, storage);
    expect(first.claimed).toBe(true);
    expect(first.install).toBe(await installId(app.deps.sequelize));
    expect(JSON.parse((await storage.readMarker())!)).toMatchObject({ format: 1, install: first.install });
    expect(await claimPhotoStore(app.deps.sequelize, storage)).toEqual({ install: first.install, claimed: false });
  });

  it('refuses a store marked by another install and leaves its marker alone', async () => {
    const other =
      driver === 'local'
        ? photoStorage({ UPLOAD_DIR: `${app.deps.config.UPLOAD_DIR}-other` })
        : photoStorage({ ...app.deps.config, ...driverEnv('s3') });
    const marker = JSON.stringify({ format: 1, install: randomUUID(), claimedAt: '2026-11-02T09:00:00.000Z' });
    await other.writeMarker(marker);
    const refusal = await claimPhotoStore(app.deps.sequelize, other).catch((error: unknown) => error);
    expect(refusal).toBeInstanceOf(PhotoStoreOwnedElsewhereError);
    expect((refusal as Error).message).toMatch(/belongs to another Blockpost install \(install [\w-]+, first used 2026-11-02\)/);
    expect((refusal as Error).message).toMatch(
      /Nothing was changed\. To go on, point UPLOAD_DIR \(or S3_BUCKET \/ S3_PREFIX for a bucket\)/,
    );
    expect(await other.readMarker()).toBe(marker);
  });

  it('refuses a store whose marker cannot be read', async () => {
    const other =
      driver === 'local'
        ? photoStorage({ UPLOAD_DIR: `${app.deps.config.UPLOAD_DIR}-garbled` })
        : photoStorage({ ...app.deps.config, ...driverEnv('s3') });
    await other.writeMarker('not json');
    await expect(claimPhotoStore(app.deps.sequelize, other)).rejects.toThrow(
      /has an owner marker it cannot read\. Nothing was changed/,
    );
  });
});
