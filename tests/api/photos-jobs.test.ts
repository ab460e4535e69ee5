/**
 * The job queue works the photo deletion queue: files left queued (the node that deleted the rows died
 * before removing them) are removed by the `photo-files` job on a node that runs jobs.
 */
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createTestDatabase, testConfig } from '../helpers/test-app';
import { startServer, type RunningServer } from '../../server/index';
import { queues, startBoss } from '../../server/jobs/queue';
import { newStoredName, storageOf } from '../../server/uploads/photo-store';
import { driverEnv, isStored } from './photos-support';

let node: RunningServer;
beforeAll(async () => {
  node = await startServer(
    testConfig(await createTestDatabase(), { PORT: '0', JOBS: 'true', JOBS_POLL_SECONDS: '0.5', ...driverEnv('s3') }),
  );
}, 60_000);
afterAll(() => node.close());

it('removes files left in the deletion queue when the photo-files job runs, and keeps unrecorded ones', async () => {
  const storage = storageOf(node.deps);
  const [queued, unrecorded] = [newStoredName('jpg'), newStoredName('jpg')];
  for (const name of [queued, unrecorded]) await storage.put(name, Buffer.from(`bytes of ${name}`));
  await node.deps.sequelize.query('INSERT INTO photo_file_deletions (file_name) VALUES (:queued)', { replacements: { queued } });

  const boss = await startBoss(node.deps.config, node.deps.logger, { schedule: false });
  try {
    await boss.send(queues.photoFiles, {});
    for (let i = 0; i < 100 && (await isStored(node, queued)); i++) await new Promise((r) => setTimeout(r, 100));
  } finally {
    await boss.stop({ graceful: false, wait: true });
  }
  expect(await isStored(node, queued)).toBe(false);
  expect(await isStored(node, unrecorded)).toBe(true);
  const [rows] = await node.deps.sequelize.query('SELECT file_name FROM photo_file_deletions');
  expect(rows).toEqual([]);
});
