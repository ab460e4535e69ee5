/** The app as production starts it (server/index.ts, NODE_ENV=production), in its own process for a benchmark. */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startMaildev } from '../../scripts/lib/maildev';
import { freePort } from '../../scripts/lib/ports';
import { startNodeServer, type NodeProcess } from './processes';

/**
 * Starts the app (from the tree at `root`, this one by default) against `databaseUrl` with its own
 * empty photo store. The job worker runs, as production runs it on every node (the mail that events
 * queue is part of a request's cost), and delivers to this app's own maildev; batched mail waits a day,
 * so none is composed during a run. Logging is at warn, so no answered request writes a log line.
 */
export async function startAppProcess(
  databaseUrl: string,
  opts: { profileDir?: string; root?: string; name?: string } = {},
): Promise<NodeProcess> {
  // Its own photo store: the app refuses one that belongs to another database.
  const uploads = mkdtempSync(join(tmpdir(), 'blockpost-bench-uploads-'));
  const maildev = await startMaildev({ smtpPort: await freePort(), webPort: await freePort() });
  const app = await startNodeServer({
    name: opts.name ?? 'app',
    script: 'server/index.ts',
    port: await freePort(),
    readyPath: '/api/health',
    nodeArgs: opts.profileDir ? ['--cpu-prof', `--cpu-prof-dir=${opts.profileDir}`] : [],
    root: opts.root,
    env: {
      NODE_ENV: 'production',
      DATABASE_URL: databaseUrl,
      SESSION_SECRET: 'bench-secret-bench-secret',
      HOST: '127.0.0.1',
      LOG_LEVEL: 'warn',
      SERVE_CLIENT: 'false',
      JOBS: 'true',
      SMTP_URL: `smtp://127.0.0.1:${maildev.smtpPort}`,
      // A measurement queues its maker's receipt as in production, but the receipt waits a day instead of
      // two minutes: composed within the run, the receipts of one scenario landed in a later one's runs
      // (the 600 × 6 roster read 59 % of bare Express with them and 79 % without).
      MAIL_BATCH_DELAY_SECONDS: '86400',
      UPLOAD_DIR: uploads,
      // The bench signs in many stations and viewers from one address.
      LOGIN_RATE_LIMIT: '100000',
      LOGIN_IP_RATE_LIMIT: '100000',
      REGISTER_RATE_LIMIT: '100000',
    },
  }).catch(async (error: unknown) => {
    await maildev.stop();
    rmSync(uploads, { recursive: true, force: true });
    throw error;
  });
  return {
    ...app,
    async stop() {
      await app.stop();
      await maildev.stop();
      rmSync(uploads, { recursive: true, force: true });
    },
  };
}
