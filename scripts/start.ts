/**
 * `npm start`: PostgreSQL (installed from Debian if missing), migrations, the demo guild on an empty
 * database, maildev, a fresh client build, and the app on http://127.0.0.1:3000. Ctrl-C stops it all.
 */
import { spawnSync } from 'node:child_process';
import { loadConfig } from '../server/config';
import { createSequelize } from '../server/db/sequelize';
import { initModels } from '../server/db/models';
import { migrateUp } from '../server/db/migrator';
import { claimPhotoStore } from '../server/uploads/store-identity';
import { photoStorage } from '../server/uploads/storage';
import { seedDemoIfEmpty, DEMO_SIGN_INS } from '../server/seed/demo';
import { startServer } from '../server/index';
import { repoRoot, startLocalServices } from './lib/local-services';

const started = Date.now();
const log = (msg: string) => console.log(`[blockpost] ${msg}`);

const services = await startLocalServices(log);
let stopping = false;
async function stopAll(code: number) {
  if (stopping) return;
  stopping = true;
  log('Stopping…');
  await running?.close().catch(() => {});
  await services.stop().catch((e: unknown) => console.error(e));
  log('Stopped.');
  process.exit(code);
}
process.once('SIGINT', () => void stopAll(0));
process.once('SIGTERM', () => void stopAll(0));

let running: Awaited<ReturnType<typeof startServer>> | null = null;
try {
  const config = loadConfig({ ...process.env, ...services.env });
  const sequelize = createSequelize(config.DATABASE_URL);
  initModels(sequelize);
  await migrateUp(sequelize);
  // The photo store's owner check comes before the demo seed writes any photo into it.
  await claimPhotoStore(sequelize, photoStorage(config));
  if (config.NODE_ENV !== 'production') {
    const seeded = await seedDemoIfEmpty(sequelize, config);
    if (seeded) log('Seeded the demo guild.');
  }
  await sequelize.close();

  log('Building the client…');
  const build = spawnSync(process.execPath, ['node_modules/vite/bin/vite.js', 'build', '--logLevel', 'warn'], {
    cwd: repoRoot,
    stdio: 'inherit',
  });
  if (build.status !== 0) throw new Error('The client build failed.');

  running = await startServer(config);
  log(`Blockpost is ready at ${running.url} (${((Date.now() - started) / 1000).toFixed(1)} s after start).`);
  if (services.maildevUrl) log(`Mail sent by the app is caught by maildev: ${services.maildevUrl}`);
  if (config.NODE_ENV !== 'production') {
    log(`Demo sign-ins (password "${DEMO_SIGN_INS.password}"): ${DEMO_SIGN_INS.emails.join(', ')}`);
  }
  log('Press Ctrl-C to stop the app, maildev and PostgreSQL.');
} catch (error) {
  console.error(`[blockpost] ${(error as Error).message}`);
  await stopAll(1);
}
