/**
 * storePhotos without HTTP, as chat and the demo seed call it: owners, transactions, clean-up.
 */
import { utimesSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { Photo } from '../../server/db/models';
import { deletePhotos, storePhotos } from '../../server/uploads/photo-store';
import { newStoredName, photoDir, sweepOrphanPhotoFiles } from '../../server/uploads/photo-files';
import { elfExecutable, picture } from '../fixtures/photos';
import { chatMessage, filesUnder, photoRowCount, swapWithBlock } from '../fixtures/photo-blocks';

let app: TestApp;
let roles: Awaited<ReturnType<typeof guildWithRoles>>;
let blockId: number;
let swapId: number;
let uploadDir: string;

beforeAll(async () => {
  app = await createTestApp();
  uploadDir = app.deps.config.UPLOAD_DIR;
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
    expect(filesUnder(uploadDir)).toEqual([`photos/${row!.fileName}`, `photos/${row!.thumbFileName}`].sort());
    await deletePhotos(app.deps, [row!]);
    expect(filesUnder(uploadDir)).toEqual([]);
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
        expect(filesUnder(uploadDir)).toHaveLength(2); // written, awaiting the commit
        throw failure;
      }),
    ).rejects.toBe(failure);
    expect(filesUnder(uploadDir)).toEqual([]);
    expect(await photoRowCount(app)).toBe(0);
  });

  it('keeps its files when the caller’s transaction commits', async () => {
    const rows = await app.deps.sequelize.transaction(async (transaction) =>
      storePhotos(app.deps, { files: await photoFiles('kept.jpg'), guildId: roles.guildId, uploadedBy: roles.member.id, owner: { blockId }, transaction }),
    );
    expect(rows).toHaveLength(1);
    expect(filesUnder(uploadDir)).toHaveLength(2);
    expect(await photoRowCount(app)).toBe(1);
    await deletePhotos(app.deps, rows);
  });

  it('undoes only its own savepoint when its insert fails inside the caller’s transaction', async () => {
    const stored = await app.deps.sequelize.transaction(async (transaction) => {
      // A guild that does not exist fails the foreign key after the files were written.
      await expect(
        storePhotos(app.deps, { files: await photoFiles('bad-guild.jpg'), guildId: 987654, uploadedBy: roles.member.id, owner: { blockId }, transaction }),
      ).rejects.toThrow(/foreign key/);
      expect(filesUnder(uploadDir)).toEqual([]);
      // The caller's transaction is still usable afterwards.
      return storePhotos(app.deps, { files: await photoFiles('good.jpg'), guildId: roles.guildId, uploadedBy: roles.member.id, owner: { blockId }, transaction });
    });
    expect(filesUnder(uploadDir)).toHaveLength(2);
    await deletePhotos(app.deps, stored);
    expect(filesUnder(uploadDir)).toEqual([]);
  });

  it('writes nothing for a refused file and removes written files when the insert fails', async () => {
    await expect(
      storePhotos(app.deps, { files: [{ originalname: 'tool.jpg', buffer: elfExecutable() }], guildId: roles.guildId, uploadedBy: roles.member.id, owner: { blockId } }),
    ).rejects.toThrow(/“tool\.jpg” is not a photo/);
    expect(filesUnder(uploadDir)).toEqual([]);
    // A guild that does not exist fails the foreign key after the files were written.
    await expect(
      storePhotos(app.deps, { files: await photoFiles('orphan.jpg'), guildId: 987654, uploadedBy: roles.member.id, owner: { blockId } }),
    ).rejects.toThrow();
    expect(filesUnder(uploadDir)).toEqual([]);
    expect(await photoRowCount(app)).toBe(0);
  });

  it('has the database refuse a photo with two owners or none', async () => {
    const base = {
      guildId: roles.guildId, uploadedById: roles.member.id, fileName: newStoredName('jpg'), thumbFileName: newStoredName('jpg'),
      mime: 'image/jpeg' as const, width: 10, height: 10, thumbWidth: 10, thumbHeight: 10, bytes: 10, originalBytes: 10,
    };
    await expect(Photo.create({ ...base, blockId: null, chatMessageId: null })).rejects.toThrow(/photos_one_owner_check/);
    await expect(Photo.create({ ...base, blockId, chatMessageId: 1 })).rejects.toThrow(/photos_one_owner_check/);
  });
});

describe('the orphan sweep', () => {
  it('removes old files no row names and partial writes, and keeps named and recent ones', async () => {
    const [kept] = await storePhotos(app.deps, { files: await photoFiles('kept.jpg'), guildId: roles.guildId, uploadedBy: roles.member.id, owner: { blockId } });
    const dir = photoDir(uploadDir);
    const orphan = newStoredName('jpg');
    const fresh = newStoredName('webp');
    for (const name of [orphan, fresh, '.partial-0123abcd']) writeFileSync(join(dir, name), 'x');
    const old = new Date(Date.now() - 2 * 60 * 60 * 1000);
    for (const name of [orphan, '.partial-0123abcd', kept!.fileName, kept!.thumbFileName]) utimesSync(join(dir, name), old, old);

    const { removed } = await sweepOrphanPhotoFiles(app.deps.sequelize, uploadDir);
    expect(removed.sort()).toEqual([orphan, '.partial-0123abcd'].sort());
    expect(filesUnder(uploadDir)).toEqual([`photos/${kept!.fileName}`, `photos/${kept!.thumbFileName}`, `photos/${fresh}`].sort());
  });
});
