/**
 * Photo files survive installs that share a store. Each install runs as its own server process
 * (models are bound per process). Two installs with different databases on one upload folder upload,
 * restart, run every sweep, and lose nothing; an install with another identity refuses to start there
 * and touches nothing.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { mkdtempSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import sharp from 'sharp';
import supertest from 'supertest';
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import { createTestDatabase } from '../helpers/test-app';
import { insertConfirmedAccount, PASSWORD, signIn } from '../helpers/factories';
import { clusterUrl, ensureDatabase } from '../../scripts/lib/postgres';
import { createSequelize } from '../../server/db/sequelize';
import { runPhotoSweeps } from '../../server/uploads/photo-ledger';
import { installId } from '../../server/uploads/store-identity';
import { photoStorage } from '../../server/uploads/storage';

interface Install {
  name: string;
  databaseUrl: string;
  child: ChildProcess | null;
  url: string;
}

const uploadDir = mkdtempSync(join(tmpdir(), 'blockpost-shared-uploads-'));
const children = new Set<ChildProcess>();
const photoFiles = () =>
  readdirSync(join(uploadDir, 'photos'))
    .filter((f) => !f.startsWith('.'))
    .sort();

function serverEnv(databaseUrl: string) {
  return {
    ...process.env,
    NODE_ENV: 'test',
    DATABASE_URL: databaseUrl,
    SESSION_SECRET: 'install-test-secret-1',
    PORT: '0',
    UPLOAD_DIR: uploadDir,
    LOG_LEVEL: 'silent',
    JOBS: 'false',
    SERVE_CLIENT: 'false',
    SMTP_URL: inject('smtpUrl'),
    LOGIN_RATE_LIMIT: '1000',
  };
}

/** Starts `server/index.ts`-equivalent in its own process; resolves with its URL, or rejects with what it printed. */
async function start(install: Install): Promise<void> {
  const code = `const { startServer } = await import('./server/index.ts');
    const { loadConfig } = await import('./server/config.ts');
    try {
      const running = await startServer(loadConfig(process.env));
      console.log('READY ' + running.url);
      process.on('SIGTERM', () => running.close().then(() => process.exit(0)));
    } catch (error) { console.error(error.message); process.exit(1); }`;
  const child = spawn(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', code], {
    env: serverEnv(install.databaseUrl),
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  children.add(child);
  let out = '';
  let err = '';
  child.stderr!.on('data', (c) => (err += String(c)));
  install.url = await new Promise<string>((resolve, reject) => {
    child.stdout!.on('data', (c) => {
      out += String(c);
      const ready = /READY (\S+)/.exec(out);
      if (ready) resolve(ready[1]!);
    });
    child.once('exit', (exitCode) => reject(Object.assign(new Error(err.trim()), { exitCode })));
  });
  install.child = child;
}

async function stop(install: Install) {
  const child = install.child!;
  await new Promise((resolve) => {
    child.once('exit', resolve);
    child.kill('SIGTERM');
  });
  children.delete(child);
  install.child = null;
}

/** A maker with a block in a swap of their own guild, through the install's API and database. */
async function makerWithBlock(install: Install) {
  const agent = supertest.agent(install.url).set('X-Requested-With', 'blockpost');
  const email = `maker-${randomBytes(4).toString('hex')}@example.test`;
  const db = new pg.Client({ connectionString: install.databaseUrl });
  await db.connect();
  try {
    const userId = await insertConfirmedAccount(db, { email, displayName: `Maker of ${install.name}` });
    await signIn(agent, email);
    const guild = await agent
      .post('/api/guilds')
      .send({ name: `${install.name} Quilters` })
      .expect(201);
    const swap = await db.query<{ id: number }>(
      `INSERT INTO swaps (guild_id, title, block_spec, seam, unfinished_width, unfinished_height, finished_width, finished_height,
         tolerance, squareness, quota_min, quota_max, signup_closes_at, due_at, state, created_at, updated_at)
       VALUES ($1, 'Shared folder swap', $2, 0.25, 9.5, 9.5, 9, 9, 0.125, 0.25, 1, 4, now() - interval '1 day', now() + interval '30 days', 'sewing', now(), now())
       RETURNING id`,
      [guild.body.id, JSON.stringify({ kind: 'custom', finished: { width: 9, height: 9 }, cutList: 'test' })],
    );
    const block = await db.query<{ id: number }>(
      `INSERT INTO blocks (swap_id, maker_id, sequence, state, created_at, updated_at) VALUES ($1, $2, 1, 'pledged', now(), now()) RETURNING id`,
      [swap.rows[0]!.id, userId],
    );
    return { agent, email, blockId: block.rows[0]!.id };
  } finally {
    await db.end();
  }
}

async function namesIn(databaseUrl: string): Promise<string[]> {
  const db = new pg.Client({ connectionString: databaseUrl });
  await db.connect();
  const { rows } = await db.query<{ f: string; t: string }>('SELECT file_name AS f, thumb_file_name AS t FROM photos');
  await db.end();
  return rows.flatMap((r) => [r.f, r.t]);
}

const installA: Install = { name: 'Alder', databaseUrl: '', child: null, url: '' };
const installB: Install = { name: 'Birch', databaseUrl: '', child: null, url: '' };

beforeAll(async () => {
  installA.databaseUrl = await createTestDatabase();
  // B is a second database made from A's (as a test restore or a staging copy is): it carries A's
  // install identity, so the store's owner check lets it in and only the recorded sweeps stand
  // between it and A's files.
  const a = createSequelize(installA.databaseUrl);
  await installId(a);
  await a.close();
  const nameB = `t_${randomBytes(6).toString('hex')}`;
  await ensureDatabase(inject('pgPort'), nameB, new URL(installA.databaseUrl).pathname.slice(1));
  installB.databaseUrl = clusterUrl(inject('pgPort'), nameB);
}, 60_000);

afterAll(() => {
  for (const child of children) child.kill('SIGKILL');
});

it('keeps every photo of two installs with different databases on one folder through uploads, restarts and every sweep', async () => {
  await start(installA);
  await start(installB);
  const jpeg = await sharp({ create: { width: 1200, height: 900, channels: 3, background: '#5F7A5A' } })
    .jpeg()
    .toBuffer();

  const uploaded: { install: Install; email: string; photoId: number }[] = [];
  for (const install of [installA, installB]) {
    const { agent, email, blockId } = await makerWithBlock(install);
    for (const name of ['front.jpg', 'back.jpg']) {
      const res = await agent.post(`/api/blocks/${blockId}/photos`).attach('photos', jpeg, name).expect(201);
      uploaded.push({ install, email, photoId: res.body.photos[0].id });
    }
  }
  const expected = [...(await namesIn(installA.databaseUrl)), ...(await namesIn(installB.databaseUrl))].sort();
  expect(expected).toHaveLength(8); // two photos of two files each, per install
  expect(photoFiles()).toEqual(expected);

  // Restart both: each start runs its sweeps.
  for (const install of [installA, installB]) await stop(install);
  for (const install of [installA, installB]) await start(install);
  // And every sweep once more by hand, with no grace period at all.
  for (const install of [installA, installB]) {
    const sequelize = createSequelize(install.databaseUrl);
    const result = await runPhotoSweeps({ sequelize, storage: photoStorage({ UPLOAD_DIR: uploadDir }) }, 0);
    await sequelize.close();
    expect(result).toEqual({ abandoned: [], deleted: [] });
  }
  expect(photoFiles()).toEqual(expected);

  // Each install still serves its own photos after the restart.
  for (const { install, email, photoId } of uploaded) {
    const agent = supertest.agent(install.url).set('X-Requested-With', 'blockpost');
    await agent.post('/api/auth/login').send({ email, password: PASSWORD }).expect(200);
    const res = await agent.get(`/api/photos/${photoId}`).buffer(true).expect(200);
    expect(res.headers['content-type']).toBe('image/jpeg');
  }
  for (const install of [installA, installB]) await stop(install);
}, 120_000);

it('refuses to start an install with another identity on that folder, saying how to proceed, and touches nothing', async () => {
  const before = photoFiles();
  const stranger: Install = { name: 'Cedar', databaseUrl: await createTestDatabase(), child: null, url: '' };
  const refusal = await start(stranger).then(
    () => null,
    (error: Error & { exitCode?: number }) => error,
  );
  expect(refusal?.exitCode).toBe(1);
  expect(refusal?.message).toMatch(
    /will not start: the photo store \(the folder .*photos\) belongs to another Blockpost install/,
  );
  expect(refusal?.message).toMatch(/Nothing was changed\. To go on, point UPLOAD_DIR .* at this install’s own photo store/);
  expect(photoFiles()).toEqual(before);
}, 60_000);
