/** The job queue as a feature start-up: runs in every node started with JOBS=true. */
import type { FeatureStartup } from '../features';
import { startMailJobs } from './mail-jobs';

export const mailJobsFeature: FeatureStartup = async ({ deps }) => {
  if (!deps.config.JOBS) return { name: 'mail-jobs', close: async () => undefined };
  const jobs = await startMailJobs(deps);
  deps.logger.info('mail job worker started');
  return { name: 'mail-jobs', close: () => jobs.close() };
};
