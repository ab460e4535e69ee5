/**
 * Moving an install's photos from its folder to a bucket: the script copies and verifies every file the
 * database names, leaves the folder as it was, and the app restarted on the bucket serves the same bytes.
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import supertest from 'supertest';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createTestApp, testConfig, type TestApp } from '../helpers/test-app';
import { guildWithRoles, PASSWORD } from '../helpers/factories';
import { startServer, type RunningServer } from '../../server/index';
import { picture } from '../fixtures/photos';
import { swapWithBlock } from '../fixtures/photo-blocks';
import { driverEnv } from './photos-support';

let app: TestApp;
let onBucket: RunningServer | null = null;
const bucketEnv = driverEnv('s3');

beforeAll(async () => {
  app = await createTestApp();
});
afterAll(async () => {
  await onBucket?.close();
  await app.close();
});

function move() {
  return execFileSync(process.execPath, ['node_modules/tsx/dist/cli.mjs', 'scripts/photos-to-bucket.ts'], {
    env: {
      ...process.env,
      DATABASE_URL: app.databaseUrl,
      UPLOAD_DIR: app.deps.config.UPLOAD_DIR,
      ...bucketEnv,
      PHOTO_STORE: 'local',
    },
    encoding: 'utf8',
  });
}

it('copies and verifies every photo, keeps the folder, and the app switched to the bucket serves the same bytes', async () => {
  const roles = await guildWithRoles(app);
  const { blockId } = await swapWithBlock(app, roles.guildId, roles.member.id);
  const upload = await roles.member.agent
    .post(`/api/blocks/${blockId}/photos`)
    .attach('photos', await picture('jpeg', 1200, 900), 'one.jpg')
    .attach('photos', await picture('png', 700, 700), 'two.png')
    .expect(201);
  const [first] = upload.body.photos as { id: number }[];
  const local = await roles.member.agent.get(`/api/photos/${first!.id}`).buffer(true).expect(200);

  const output = move();
  expect(output).toMatch(/4 photo files named by the database: 4 copied and verified, 0 already in the bucket/);
  expect(output).toMatch(/PHOTO_STORE=s3/);
  expect(output).toMatch(new RegExp(`S3_PREFIX=${bucketEnv.S3_PREFIX}`));
  // Run again (as after stopping the app): nothing left to copy.
  expect(move()).toMatch(/4 photo files named by the database: 0 copied and verified, 4 already in the bucket/);

  // The folder is untouched.
  const { rows } = await app.deps.pool.query<{ file_name: string }>('SELECT file_name FROM photos WHERE id = $1', [first!.id]);
  expect(readFileSync(join(app.deps.config.UPLOAD_DIR, 'photos', rows[0]!.file_name)).equals(local.body as Buffer)).toBe(true);

  // Switch: the same database, now with the bucket and an empty folder of its own.
  onBucket = await startServer(testConfig(app.databaseUrl, { PORT: '0', ...bucketEnv }));
  const agent = supertest.agent(onBucket.url).set('X-Requested-With', 'blockpost');
  await agent.post('/api/auth/login').send({ email: roles.member.email, password: PASSWORD }).expect(200);
  const fromBucket = await agent.get(`/api/photos/${first!.id}`).buffer(true).expect(200);
  expect(Buffer.compare(fromBucket.body as Buffer, local.body as Buffer)).toBe(0);
});
