import type { FeatureStartup } from '../features';
import { sweepOrphanPhotoFiles } from './photo-files';

const SIX_HOURS = 6 * 60 * 60 * 1000;

/**
 * Removes photo files no row names (left by a crash mid-upload, or by rows removed with their block
 * or guild) at start-up and every six hours. Failures are logged and never stop the server.
 */
export const photoSweepFeature: FeatureStartup = async ({ deps }) => {
  const run = async () => {
    try {
      const { removed } = await sweepOrphanPhotoFiles(deps.sequelize, deps.config.UPLOAD_DIR);
      if (removed.length) deps.logger.info({ removed: removed.length }, 'removed photo files without a photo row');
    } catch (err) {
      deps.logger.warn({ err }, 'the photo file sweep failed; it runs again later');
    }
  };
  void run();
  const timer = setInterval(() => void run(), SIX_HOURS);
  timer.unref();
  return { name: 'photo-sweep', close: async () => clearInterval(timer) };
};
