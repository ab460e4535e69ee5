/**
 * Fault test: the server is killed (SIGKILL) in the middle of a batch of measurements and uploads,
 * then restarted. Every acknowledged write is there, nothing is half-written, and after the orphan
 * sweep no stored file lacks its row.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import sharp from 'sharp';
import supertest from 'supertest';
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import { createTestDatabase } from '../helpers/test-app';
import { insertConfirmedAccount, signIn } from '../helpers/factories';
import { freePort } from '../../scripts/lib/ports';
import { createSequelize } from '../../server/db/sequelize';
import { sweepPendingUploads } from '../../server/uploads/photo-ledger';
import { photoStorage } from '../../server/uploads/storage';

const DAY = 86_400_000;
let databaseUrl: string;
let uploadDir: string;
let port: number;
let child: ChildProcess | null = null;
let db: pg.Client;

async function startChild() {
  // Node itself runs the server (tsx as a loader): tsx's command-line wrapper would take the SIGKILL
  // and leave the real server running.
  child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    env: {
      ...process.env,
      NODE_ENV: 'test',
      DATABASE_URL: databaseUrl,
      SESSION_SECRET: 'crash-test-secret-123',
      PORT: String(port),
      UPLOAD_DIR: uploadDir,
      LOG_LEVEL: 'silent',
      JOBS: 'false',
      SERVE_CLIENT: 'false',
      SMTP_URL: inject('smtpUrl'),
      LOGIN_RATE_LIMIT: '1000',
    },
    stdio: 'ignore',
  });
  for (let i = 0; i < 150; i++) {
    const ok = await fetch(`http://127.0.0.1:${port}/api/health`).then(
      (r) => r.ok,
      () => false,
    );
    if (ok) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error('the server did not come up');
}

const url = () => `http://127.0.0.1:${port}`;
const agent = () => supertest.agent(url()).set('X-Requested-With', 'blockpost');

beforeAll(async () => {
  databaseUrl = await createTestDatabase();
  uploadDir = mkdtempSync(join(tmpdir(), 'blockpost-crash-uploads-'));
  port = await freePort();
  db = new pg.Client({ connectionString: databaseUrl });
  await db.connect();
  await startChild();
}, 60_000);

afterAll(async () => {
  child?.kill('SIGKILL');
  await db?.end();
});

async function register(name: string) {
  const email = `${name.toLowerCase().replace(/\W/g, '')}-${port}@example.test`;
  const id = await insertConfirmedAccount(db, { email, displayName: name });
  return { agent: await signIn(agent(), email), id };
}

it('keeps every acknowledged measurement and photo across a SIGKILL, with nothing half-written', async () => {
  const coordinator = await register('Greta Coordinator');
  const guild = await coordinator.agent.post('/api/guilds').send({ name: 'Crashproof Quilters' }).expect(201);
  const makers = [await register('Maker One'), await register('Maker Two'), await register('Maker Three')];
  for (const m of makers)
    await db.query(
      `INSERT INTO memberships (user_id, guild_id, role, created_at, updated_at) VALUES ($1, $2, 'member', now(), now())`,
      [m.id, guild.body.id],
    );
  const swap = await coordinator.agent
    .post(`/api/guilds/${guild.body.id}/swaps`)
    .send({
      title: 'Sturdy Squares',
      block: { kind: 'grid', columns: [3.5, 3.5, 3.5], rows: [3.5, 3.5, 3.5], seam: 0.25 },
      tolerance: '1/8',
      squareness: '1/4',
      colourRules: [],
      quota: { min: 1, max: 6 },
      signupClosesAt: new Date(Date.now() + 10 * DAY).toISOString(),
      dueAt: new Date(Date.now() + 40 * DAY).toISOString(),
      mode: 'return',
    })
    .expect(201);
  const swapId = swap.body.id as number;
  await coordinator.agent.post(`/api/swaps/${swapId}/transitions`).send({ to: 'signup' }).expect(200);
  for (const m of makers) await m.agent.post(`/api/swaps/${swapId}/signups`).send({ blocks: 6 }).expect(200);
  await coordinator.agent.post(`/api/swaps/${swapId}/transitions`).send({ to: 'sewing' }).expect(200);
  const { rows: blocks } = await db.query<{ id: number; maker_id: number }>(
    'SELECT id, maker_id FROM blocks WHERE swap_id = $1 ORDER BY id',
    [swapId],
  );
  // Half the blocks get photos from their makers, the other half are received and measured.
  const toPhoto = blocks.filter((_, i) => i % 2 === 0);
  const toMeasure = blocks.filter((_, i) => i % 2 === 1);
  for (const b of toMeasure) await coordinator.agent.post(`/api/blocks/${b.id}/received`).send({}).expect(200);
  const jpeg = await sharp({ create: { width: 900, height: 900, channels: 3, background: '#2F4B7C' } })
    .jpeg()
    .toBuffer();

  const acknowledgedMeasurements: number[] = [];
  const acknowledgedPhotos: number[] = [];
  let killed = false;
  const killAfter = 8;
  const maybeKill = () => {
    if (!killed && acknowledgedMeasurements.length + acknowledgedPhotos.length >= killAfter) {
      killed = true;
      child!.kill('SIGKILL');
    }
  };
  const work = [
    ...toMeasure.flatMap((b) =>
      [0, 1].map((n) => async () => {
        const res = await coordinator.agent
          .post(`/api/blocks/${b.id}/measurements`)
          .send({ width: n ? '9 1/2' : '9 3/8', height: '9 1/2' });
        if (res.status === 201) acknowledgedMeasurements.push(res.body.id as number);
      }),
    ),
    ...toPhoto.map((b) => async () => {
      const maker = makers.find((m) => m.id === b.maker_id)!;
      const res = await maker.agent
        .post(`/api/blocks/${b.id}/photos`)
        .attach('photos', jpeg, 'block.jpg')
        .attach('photos', jpeg, 'back.jpg');
      if (res.status === 201) acknowledgedPhotos.push(...(res.body.photos as { id: number }[]).map((p) => p.id));
    }),
  ];
  // Three requests in flight at a time, so the kill lands in the middle of some of them.
  let next = 0;
  await Promise.all(
    [0, 1, 2].map(async () => {
      while (next < work.length && !killed) {
        await work[next++]!().catch(() => undefined);
        maybeKill();
      }
    }),
  );
  expect(killed).toBe(true);
  expect(acknowledgedMeasurements.length + acknowledgedPhotos.length).toBeGreaterThanOrEqual(killAfter);

  const dead = child!;
  if (dead.exitCode === null && dead.signalCode === null) await new Promise((r) => dead.once('exit', r));
  // The server is really gone: nothing answers on its port until the restart.
  expect(
    await fetch(`${url()}/api/health`).then(
      () => 'answered',
      () => 'refused',
    ),
  ).toBe('refused');
  await startChild();

  // Every acknowledged write is there.
  const measurements = await db.query<{ id: number; block_id: number }>('SELECT id, block_id FROM measurements');
  expect(measurements.rows.map((r) => r.id)).toEqual(expect.arrayContaining(acknowledgedMeasurements));
  const photos = await db.query<{ id: number; file_name: string; thumb_file_name: string }>(
    'SELECT id, file_name, thumb_file_name FROM photos',
  );
  expect(photos.rows.map((r) => r.id)).toEqual(expect.arrayContaining(acknowledgedPhotos));

  // Nothing half-written: a measured block carries its latest ruler verdict; a block with photos is sewn.
  const inconsistent = await db.query(
    `SELECT b.id FROM blocks b
       JOIN LATERAL (SELECT verdict FROM measurements m WHERE m.block_id = b.id AND m.source = 'ruler' ORDER BY m.created_at DESC, m.id DESC LIMIT 1) last ON true
      WHERE b.state <> 'measured' OR b.verdict IS DISTINCT FROM last.verdict`,
  );
  expect(inconsistent.rows).toEqual([]);
  const pledgedWithPhotos = await db.query(
    `SELECT DISTINCT b.id FROM blocks b JOIN photos p ON p.block_id = b.id WHERE b.state = 'pledged'`,
  );
  expect(pledgedWithPhotos.rows).toEqual([]);

  // Every stored photo has both files; once the uploads cut off by the kill are past their grace
  // period (0 here), the recorded sweep leaves no file without its row and no half-written file.
  const files = () => readdirSync(join(uploadDir, 'photos')).filter((f) => f !== '.blockpost-store.json');
  const names = photos.rows.flatMap((r) => [r.file_name, r.thumb_file_name]);
  for (const name of names) expect(existsSync(join(uploadDir, 'photos', name)), name).toBe(true);
  const sequelize = createSequelize(databaseUrl);
  await sweepPendingUploads({ sequelize, storage: photoStorage({ UPLOAD_DIR: uploadDir }) }, 0);
  await sequelize.close();
  expect(files().sort()).toEqual([...new Set(names)].sort());
}, 120_000);
