/** Fault test: PostgreSQL stops while the app runs, then comes back; the app recovers without a restart. */
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, expect, it } from 'vitest';
import supertest from 'supertest';
import {
  clusterUrl,
  ensureDatabase,
  ensurePostgresBinaries,
  initCluster,
  startCluster,
  stopCluster,
  type ClusterOptions,
} from '../../scripts/lib/postgres';
import { freePort } from '../../scripts/lib/ports';
import { startServer, type RunningServer } from '../../server/index';
import { testConfig } from '../helpers/test-app';
import { insertConfirmedAccount, signIn, uniqueEmail } from '../helpers/factories';

let pgBin: string;
let cluster: ClusterOptions;
let root: string;
let server: RunningServer;

beforeAll(async () => {
  pgBin = ensurePostgresBinaries();
  root = mkdtempSync(join(tmpdir(), 'blockpost-outage-'));
  chmodSync(root, 0o755);
  cluster = {
    dataDir: join(root, 'data'),
    socketDir: join(root, 'run'),
    logFile: join(root, 'pg.log'),
    port: await freePort(),
    fast: true,
  };
  initCluster(pgBin, cluster);
  startCluster(pgBin, cluster);
  await ensureDatabase(cluster.port, 'outage');
  server = await startServer(testConfig(clusterUrl(cluster.port, 'outage'), { PORT: '0' }));
}, 60_000);

afterAll(async () => {
  await server?.close().catch(() => {});
  stopCluster(pgBin, cluster.dataDir);
  rmSync(root, { recursive: true, force: true });
});

it('answers 503 with a clear message while the database is down and recovers when it returns', async () => {
  const agent = supertest.agent(server.url).set('X-Requested-With', 'blockpost');
  const email = uniqueEmail('outage');
  await insertConfirmedAccount(server.deps.pool, { email, displayName: 'Iris Vantongeren' });
  await signIn(agent, email);
  await agent.get('/api/me').expect(200);

  stopCluster(pgBin, cluster.dataDir);
  const health = await agent.get('/api/health');
  expect(health.status).toBe(503);
  expect(health.body).toEqual({ ok: false, db: 'down' });
  const me = await agent.get('/api/me');
  expect(me.status).toBe(503);
  expect(me.body.error.message).toMatch(/database is not reachable/);
  const guilds = await agent.post('/api/guilds').send({ name: 'During The Outage' });
  expect(guilds.status).toBe(503);
  expect(JSON.stringify(guilds.body)).not.toMatch(/ECONNREFUSED|at \w+ \(/);

  startCluster(pgBin, cluster);
  let recovered = 0;
  for (let i = 0; i < 50 && recovered !== 200; i++) {
    recovered = (await agent.get('/api/health')).status;
    if (recovered !== 200) await new Promise((r) => setTimeout(r, 200));
  }
  expect(recovered).toBe(200);
  await agent.get('/api/me').expect(200); // the session survived in PostgreSQL
  await agent.post('/api/guilds').send({ name: 'After The Outage' }).expect(201);
});
