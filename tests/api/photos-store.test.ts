/**
 * storePhotos without HTTP, as chat and the demo seed call it: owners, transactions, clean-up, and the
 * recorded sweeps (pending uploads, the deletion queue), against both photo store drivers.
 */
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { Photo } from '../../server/db/models';
import {
  deletePhotos,
  newStoredName,
  preparePhotosQueued,
  stagePhotos,
  storageOf,
  storePhotos,
} from '../../server/uploads/photo-store';
import { PENDING_GRACE_MS, sweepPendingUploads, workDeletionQueue } from '../../server/uploads/photo-ledger';
import { driverEnv, isStored, photoDrivers, storedNames } from './photos-support';
import { elfExecutable, picture } from '../fixtures/photos';
import { addBlock, chatMessage, photoRowCount, swapWithBlock } from '../fixtures/photo-blocks';

describe.each(photoDrivers)('with the %s photo store', (driver) => {
  let app: TestApp;
  let roles: Awaited<ReturnType<typeof guildWithRoles>>;
  let blockId: number;
  let swapId: number;

  beforeAll(async () => {
    app = await createTestApp(driverEnv(driver));
    roles = await guildWithRoles(app);
    ({ blockId, swapId } = await swapWithBlock(app, roles.guildId, roles.member.id));
  });
  afterAll(() => app.close());

  const photoFiles = async (name: string) => [{ originalname: name, buffer: await picture('jpeg', 900, 600) }];

  describe('storePhotos', () => {
    it('stores a chat-message photo with no block, one row and two files', async () => {
      const chatMessageId = await chatMessage(app, roles.guildId, swapId, roles.member.id);
      const [row] = await storePhotos(app.deps, {
        files: await photoFiles('chat.jpg'),
        guildId: roles.guildId,
        uploadedBy: roles.member.id,
        owner: { chatMessageId },
      });
      expect(row).toMatchObject({ blockId: null, chatMessageId, width: 900, height: 600, mime: 'image/jpeg' });
      expect(await storedNames(app)).toEqual([row!.fileName, row!.thumbFileName].sort());
      await deletePhotos(app.deps, [row!]);
      expect(await storedNames(app)).toEqual([]);
    });

    it('removes its files when the caller’s transaction rolls back', async () => {
      const failure = new Error('the chat message could not be saved');
      await expect(
        app.deps.sequelize.transaction(async (transaction) => {
          await storePhotos(app.deps, {
            files: await photoFiles('rolled-back.jpg'),
            guildId: roles.guildId,
            uploadedBy: roles.member.id,
            owner: { blockId },
            transaction,
          });
          expect(await storedNames(app)).toHaveLength(2); // written, awaiting the commit
          throw failure;
        }),
      ).rejects.toBe(failure);
      expect(await storedNames(app)).toEqual([]);
      expect(await photoRowCount(app)).toBe(0);
    });

    it('keeps its files when the caller’s transaction commits', async () => {
      const rows = await app.deps.sequelize.transaction(async (transaction) =>
        storePhotos(app.deps, {
          files: await photoFiles('kept.jpg'),
          guildId: roles.guildId,
          uploadedBy: roles.member.id,
          owner: { blockId },
          transaction,
        }),
      );
      expect(rows).toHaveLength(1);
      expect(await storedNames(app)).toHaveLength(2);
      expect(await photoRowCount(app)).toBe(1);
      await deletePhotos(app.deps, rows);
    });

    it('undoes only its own savepoint when its insert fails inside the caller’s transaction', async () => {
      const stored = await app.deps.sequelize.transaction(async (transaction) => {
        // A guild that does not exist fails the foreign key after the files were written.
        await expect(
          storePhotos(app.deps, {
            files: await photoFiles('bad-guild.jpg'),
            guildId: 987654,
            uploadedBy: roles.member.id,
            owner: { blockId },
            transaction,
          }),
        ).rejects.toThrow(/foreign key/);
        expect(await storedNames(app)).toEqual([]);
        // The caller's transaction is still usable afterwards.
        return storePhotos(app.deps, {
          files: await photoFiles('good.jpg'),
          guildId: roles.guildId,
          uploadedBy: roles.member.id,
          owner: { blockId },
          transaction,
        });
      });
      expect(await storedNames(app)).toHaveLength(2);
      await deletePhotos(app.deps, stored);
      expect(await storedNames(app)).toEqual([]);
    });

    it('writes nothing for a refused file and removes written files when the insert fails', async () => {
      await expect(
        storePhotos(app.deps, {
          files: [{ originalname: 'tool.jpg', buffer: elfExecutable() }],
          guildId: roles.guildId,
          uploadedBy: roles.member.id,
          owner: { blockId },
        }),
      ).rejects.toThrow(/“tool\.jpg” is not a photo/);
      expect(await storedNames(app)).toEqual([]);
      // A guild that does not exist fails the foreign key after the files were written.
      await expect(
        storePhotos(app.deps, {
          files: await photoFiles('orphan.jpg'),
          guildId: 987654,
          uploadedBy: roles.member.id,
          owner: { blockId },
        }),
      ).rejects.toThrow();
      expect(await storedNames(app)).toEqual([]);
      expect(await photoRowCount(app)).toBe(0);
    });

    it('has the database refuse a photo with two owners or none', async () => {
      const base = {
        guildId: roles.guildId,
        uploadedById: roles.member.id,
        fileName: newStoredName('jpg'),
        thumbFileName: newStoredName('jpg'),
        mime: 'image/jpeg' as const,
        width: 10,
        height: 10,
        thumbWidth: 10,
        thumbHeight: 10,
        bytes: 10,
        originalBytes: 10,
      };
      await expect(Photo.create({ ...base, blockId: null, chatMessageId: null })).rejects.toThrow(/photos_one_owner_check/);
      await expect(Photo.create({ ...base, blockId, chatMessageId: 1 })).rejects.toThrow(/photos_one_owner_check/);
    });
  });

  describe('the recorded sweeps', () => {
    const ledger = () => ({ sequelize: app.deps.sequelize, storage: storageOf(app.deps) });
    const count = async (table: string) =>
      Number(
        (await app.deps.sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM ${table}`, { type: QueryTypes.SELECT }))[0]!.n,
      );

    it('removes an uncommitted upload’s files only after the grace period, and never a file it has no record of', async () => {
      const [kept] = await storePhotos(app.deps, {
        files: await photoFiles('kept.jpg'),
        guildId: roles.guildId,
        uploadedBy: roles.member.id,
        owner: { blockId },
      });
      // Written but never committed: what a crash between the write and the commit leaves.
      const [abandoned] = await stagePhotos(app.deps, await preparePhotosQueued(app.deps, await photoFiles('crashed.jpg')));
      // A file this database never recorded (another install's, sharing the store).
      const foreign = newStoredName('jpg');
      await storageOf(app.deps).put(foreign, Buffer.from('another install’s photo'));
      expect(await count('photo_uploads_pending')).toBe(2);

      expect(await sweepPendingUploads(ledger())).toEqual([]);
      expect(await isStored(app, abandoned!.fileName)).toBe(true);

      await app.deps.sequelize.query(`UPDATE photo_uploads_pending SET created_at = now() - make_interval(secs => :s)`, {
        replacements: { s: PENDING_GRACE_MS / 1000 + 60 },
      });
      const removed = await sweepPendingUploads(ledger());
      expect(removed.sort()).toEqual([abandoned!.fileName, abandoned!.thumbFileName].sort());
      expect(await storedNames(app)).toEqual([kept!.fileName, kept!.thumbFileName, foreign].sort());
      expect(await count('photo_uploads_pending')).toBe(0);
      await deletePhotos(app.deps, [kept!]);
      await storageOf(app.deps).remove(foreign);
    });

    it('queues the files of photos removed by a cascade in the same transaction; the queue removes them', async () => {
      const doomedBlock = await addBlock(app, swapId, roles.member.id);
      const [doomed] = await storePhotos(app.deps, {
        files: await photoFiles('doomed.jpg'),
        guildId: roles.guildId,
        uploadedBy: roles.member.id,
        owner: { blockId: doomedBlock },
      });
      const [kept] = await storePhotos(app.deps, {
        files: await photoFiles('kept.jpg'),
        guildId: roles.guildId,
        uploadedBy: roles.member.id,
        owner: { blockId },
      });
      const queued = () =>
        app.deps.sequelize.query<{ file_name: string }>('SELECT file_name FROM photo_file_deletions ORDER BY file_name', {
          type: QueryTypes.SELECT,
        });

      // The block goes, and its photo rows with it (ON DELETE CASCADE), in a transaction that rolls back first…
      await app.deps.sequelize
        .transaction(async (transaction) => {
          await app.deps.sequelize.query('DELETE FROM blocks WHERE id = :id', { replacements: { id: doomedBlock }, transaction });
          throw new Error('changed my mind');
        })
        .catch(() => undefined);
      expect(await queued()).toEqual([]);
      // …and then for real.
      await app.deps.sequelize.query('DELETE FROM blocks WHERE id = :id', { replacements: { id: doomedBlock } });
      expect((await queued()).map((r) => r.file_name)).toEqual([doomed!.fileName, doomed!.thumbFileName].sort());
      expect(await isStored(app, doomed!.fileName)).toBe(true);

      expect((await workDeletionQueue(ledger())).sort()).toEqual([doomed!.fileName, doomed!.thumbFileName].sort());
      expect(await storedNames(app)).toEqual([kept!.fileName, kept!.thumbFileName].sort());
      expect(await queued()).toEqual([]);
      await deletePhotos(app.deps, [kept!]);
    });

    it('keeps a file a photo row still names, whatever the queue says', async () => {
      const [kept] = await storePhotos(app.deps, {
        files: await photoFiles('kept.jpg'),
        guildId: roles.guildId,
        uploadedBy: roles.member.id,
        owner: { blockId },
      });
      await app.deps.sequelize.query('INSERT INTO photo_file_deletions (file_name) VALUES (:name)', {
        replacements: { name: kept!.fileName },
      });
      expect(await workDeletionQueue(ledger())).toEqual([]);
      expect(await isStored(app, kept!.fileName)).toBe(true);
      expect(await count('photo_file_deletions')).toBe(0);
      await deletePhotos(app.deps, [kept!]);
    });
  });
});
