/**
 * `npm run dev`: the same local PostgreSQL and maildev as `npm start`, the API on :3001 restarted on
 * change (tsx watch), and Vite with hot reload on http://127.0.0.1:3000 proxying /api and /socket.io.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { loadConfig } from '../server/config';
import { createSequelize } from '../server/db/sequelize';
import { initModels } from '../server/db/models';
import { migrateUp } from '../server/db/migrator';
import { claimPhotoStore } from '../server/uploads/store-identity';
import { photoStorage } from '../server/uploads/storage';
import { seedDemoIfEmpty } from '../server/seed/demo';
import { repoRoot, startLocalServices } from './lib/local-services';

const services = await startLocalServices((m) => console.log(`[dev] ${m}`));
const env = { ...process.env, ...services.env, PORT: '3001', SERVE_CLIENT: 'false', API_PORT: '3001' };
const config = loadConfig(env);
const sequelize = createSequelize(config.DATABASE_URL);
initModels(sequelize);
await migrateUp(sequelize);
await claimPhotoStore(sequelize, photoStorage(config));
await seedDemoIfEmpty(sequelize, config);
await sequelize.close();

const children: ChildProcess[] = [
  spawn(process.execPath, ['node_modules/tsx/dist/cli.mjs', 'watch', '--clear-screen=false', 'server/index.ts'], {
    cwd: repoRoot,
    env,
    stdio: 'inherit',
  }),
  spawn(process.execPath, ['node_modules/vite/bin/vite.js'], { cwd: repoRoot, env, stdio: 'inherit' }),
];
console.log('[dev] Open http://127.0.0.1:3000 (hot reload); the API restarts when server/ or shared/ changes.');
if (services.maildevUrl) console.log(`[dev] Caught mail: ${services.maildevUrl}`);

let stopping = false;
async function stop() {
  if (stopping) return;
  stopping = true;
  for (const child of children) child.kill('SIGTERM');
  await Promise.all(children.map((c) => new Promise((r) => (c.exitCode !== null ? r(null) : c.once('exit', r)))));
  await services.stop();
  process.exit(0);
}
process.once('SIGINT', () => void stop());
process.once('SIGTERM', () => void stop());
for (const child of children) child.once('exit', () => void stop());
