/**
 * The photo store at start-up and in the background:
 * - before anything else, the store's owner marker is checked (or written on first use); a store that
 *   belongs to another install stops the start with a message saying how to proceed;
 * - the recorded sweeps run once at start (pending uploads past the grace period, queued deletions);
 * - on nodes that run jobs, a job does the same every 15 minutes.
 * Nothing here lists the store to find files to delete.
 */
import type { FeatureStartup } from '../features';
import { queues, startBoss } from '../jobs/queue';
import type { AppDeps } from '../deps';
import { runPhotoSweeps } from './photo-ledger';
import { storageOf } from './photo-store';
import { claimPhotoStore } from './store-identity';

export const PHOTO_SWEEP_CRON = '*/15 * * * *';

async function sweep(deps: AppDeps) {
  try {
    const { abandoned, deleted } = await runPhotoSweeps({ sequelize: deps.sequelize, storage: storageOf(deps) });
    if (abandoned.length || deleted.length) {
      deps.logger.info({ abandoned: abandoned.length, deleted: deleted.length }, 'removed photo files the database recorded for removal');
    }
  } catch (err) {
    deps.logger.warn({ err }, 'the photo file sweep failed; its records stay and it runs again later');
  }
}

export const photoStoreFeature: FeatureStartup = async ({ deps }) => {
  const storage = storageOf(deps);
  const { install, claimed } = await claimPhotoStore(deps.sequelize, storage);
  if (claimed) deps.logger.info({ install, store: storage.description }, 'photo store marked as this install’s');
  void sweep(deps);
  if (!deps.config.JOBS) return { name: 'photo-store', close: async () => undefined };

  const boss = await startBoss(deps.config, deps.logger);
  await boss.work(queues.photoFiles, { batchSize: 1, pollingIntervalSeconds: deps.config.JOBS_POLL_SECONDS }, () => sweep(deps));
  await boss.schedule(queues.photoFiles, PHOTO_SWEEP_CRON, {}, { tz: 'UTC' });
  return { name: 'photo-store', close: () => boss.stop({ graceful: true, wait: true, timeout: 10_000 }) };
};
