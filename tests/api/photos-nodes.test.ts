/**
 * Several app nodes share one bucket: two nodes with different local upload folders and one fake
 * object store. A photo uploaded through one node is served by the other, and removed for both.
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import supertest from 'supertest';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createTestDatabase, testConfig, type TestApp } from '../helpers/test-app';
import { insertConfirmedAccount, PASSWORD, signIn, uniqueEmail } from '../helpers/factories';
import { startServer, type RunningServer } from '../../server/index';
import { picture } from '../fixtures/photos';
import { filesUnder, swapWithBlock } from '../fixtures/photo-blocks';
import { driverEnv, storedNames } from './photos-support';

let nodes: RunningServer[] = [];
const folders = [mkdtempSync(join(tmpdir(), 'blockpost-node-a-')), mkdtempSync(join(tmpdir(), 'blockpost-node-b-'))];

beforeAll(async () => {
  const databaseUrl = await createTestDatabase();
  const bucket = driverEnv('s3'); // one bucket and prefix for both nodes
  for (const folder of folders)
    nodes.push(await startServer(testConfig(databaseUrl, { PORT: '0', UPLOAD_DIR: folder, ...bucket })));
}, 60_000);
afterAll(async () => {
  for (const node of nodes) await node.close();
  nodes = [];
});

const agentOn = async (node: RunningServer, email: string) => {
  const agent = supertest.agent(node.url).set('X-Requested-With', 'blockpost');
  await agent.post('/api/auth/login').send({ email, password: PASSWORD }).expect(200);
  return agent;
};

it('serves a photo uploaded through one node from the other, and removing it on one removes it for both', async () => {
  const [first, second] = nodes as [RunningServer, RunningServer];
  const email = uniqueEmail('node');
  const onFirst = supertest.agent(first.url).set('X-Requested-With', 'blockpost');
  const userId = await insertConfirmedAccount(first.deps.pool, { email, displayName: 'Nell Nodes' });
  await signIn(onFirst, email);
  const guild = await onFirst.post('/api/guilds').send({ name: 'Two Node Quilters' }).expect(201);
  const { blockId } = await swapWithBlock({ deps: first.deps } as TestApp, guild.body.id, userId);

  const sent = await picture('jpeg', 1600, 1200);
  const upload = await onFirst.post(`/api/blocks/${blockId}/photos`).attach('photos', sent, 'on-node-a.jpg').expect(201);
  const photoId = upload.body.photos[0].id as number;

  const onSecond = await agentOn(second, email);
  const fromSecond = await onSecond.get(`/api/photos/${photoId}`).buffer(true).expect(200);
  const fromFirst = await onFirst.get(`/api/photos/${photoId}`).buffer(true).expect(200);
  expect(fromSecond.headers['content-type']).toBe('image/jpeg');
  expect(Buffer.compare(fromSecond.body as Buffer, fromFirst.body as Buffer)).toBe(0);
  expect((fromSecond.body as Buffer).length).toBe(upload.body.photos[0].bytes);
  await onSecond.get(`/api/photos/${photoId}?size=thumb`).expect(200);

  // The files are in the bucket, not on either node's disk.
  expect(await storedNames(first)).toHaveLength(2);
  for (const folder of folders) expect(filesUnder(folder)).toEqual([]);

  await onSecond.delete(`/api/photos/${photoId}`).expect(204);
  await onFirst.get(`/api/photos/${photoId}`).expect(404);
  expect(await storedNames(first)).toEqual([]);
});
