/**
 * Photos are re-encoded in a small bounded queue, outside every database transaction and lock: a
 * person waiting there holds no row, and a full queue answers 503 with Retry-After before the body
 * is read, saving nothing.
 */
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { photoQueue } from '../../server/uploads/photo-queue';
import { picture } from '../fixtures/photos';
import { chatMessage, photoRowCount, swapWithBlock } from '../fixtures/photo-blocks';
import { storedNames } from './photos-support';

let app: TestApp;
let roles: Awaited<ReturnType<typeof guildWithRoles>>;
let blockId: number;
let swapId: number;

beforeAll(async () => {
  app = await createTestApp({ PHOTO_QUEUE_LIMIT: '10' });
  roles = await guildWithRoles(app);
  ({ blockId, swapId } = await swapWithBlock(app, roles.guildId, roles.member.id));
});
afterAll(() => app.close());

/** Occupies the queue with `slots` one-photo batches (or one batch of `photos`) until released. */
function holdQueue(opts: { slots?: number; photos?: number }) {
  const queue = photoQueue(app.deps.config);
  let release!: () => void;
  const gate = new Promise<void>((resolve) => (release = resolve));
  const held = opts.photos
    ? [queue.runBatch(Array.from({ length: opts.photos }, () => () => gate))]
    : Array.from({ length: opts.slots ?? queue.concurrency }, () => queue.runBatch([() => gate]));
  return {
    queue,
    release: async () => {
      release();
      await Promise.all(held);
    },
  };
}

it('answers 503 with Retry-After and a clear message when the queue is full, saving nothing', async () => {
  const { queue, release } = holdQueue({ photos: 10 });
  expect(queue.load).toBe(10);
  const res = await roles.member.agent
    .post(`/api/blocks/${blockId}/photos`)
    .attach('photos', await picture('jpeg', 800, 600), 'block.jpg')
    .expect(503);
  expect(res.body.error.code).toBe('photos_busy');
  expect(res.body.error.message).toMatch(
    /busy preparing other people’s photos\. Nothing was saved; please send your photos again in \d+ seconds/,
  );
  expect(Number(res.headers['retry-after'])).toBeGreaterThanOrEqual(1);
  expect(await photoRowCount(app)).toBe(0);
  expect(await storedNames(app)).toEqual([]);

  await release();
  expect(queue.load).toBe(0);
  await roles.member.agent
    .post(`/api/blocks/${blockId}/photos`)
    .attach('photos', await picture('jpeg', 800, 600), 'block.jpg')
    .expect(201);
  expect(await photoRowCount(app)).toBe(1);
});

it('holds no lock on the block while an upload waits for its turn to be encoded', async () => {
  const { queue, release } = holdQueue({});
  const upload = roles.member.agent
    .post(`/api/blocks/${blockId}/photos`)
    .attach('photos', await picture('png', 900, 900), 'waiting.png')
    .then((r) => r);
  // Wait until the upload is admitted and waiting in the queue.
  for (let i = 0; i < 100 && queue.load <= queue.concurrency; i++) await new Promise((r) => setTimeout(r, 50));
  expect(queue.load).toBe(queue.concurrency + 1);

  // Another request can lock the block row at once: the waiting upload holds no transaction.
  await app.deps.sequelize.transaction(async (transaction) => {
    const [rows] = await app.deps.sequelize.query('SELECT id FROM blocks WHERE id = :blockId FOR UPDATE NOWAIT', {
      replacements: { blockId },
      transaction,
    });
    expect(rows).toHaveLength(1);
  });
  const idle = await app.deps.sequelize.query<{ pid: number }>(
    `SELECT pid FROM pg_stat_activity WHERE datname = current_database() AND state LIKE 'idle in transaction%'`,
    { type: QueryTypes.SELECT },
  );
  expect(idle).toEqual([]);

  await release();
  const res = await upload;
  expect(res.status).toBe(201);
  expect(res.body.photos).toHaveLength(1);
});

it('holds no transaction or chat lock while a chat photo waits for its turn to be encoded', async () => {
  const { queue, release } = holdQueue({});
  const [room] = await app.deps.sequelize.query<{ room_id: number }>('SELECT room_id FROM chat_messages WHERE id = :id', {
    replacements: { id: await chatMessage(app, roles.guildId, swapId, roles.member.id) },
    type: QueryTypes.SELECT,
  });
  const post = roles.member.agent
    .post(`/api/chat/rooms/${room!.room_id}/messages`)
    .field('body', 'Mine is done')
    .attach('photos', await picture('jpeg', 900, 600), 'mine.jpg')
    .then((r) => r);
  for (let i = 0; i < 100 && queue.load <= queue.concurrency; i++) await new Promise((r) => setTimeout(r, 50));
  expect(queue.load).toBe(queue.concurrency + 1);

  const locks = await app.deps.sequelize.query<{ pid: number }>(
    `SELECT l.pid FROM pg_locks l JOIN pg_stat_activity a ON a.pid = l.pid
      WHERE a.datname = current_database() AND (l.locktype = 'advisory' OR a.state LIKE 'idle in transaction%')`,
    { type: QueryTypes.SELECT },
  );
  expect(locks).toEqual([]);

  await release();
  const res = await post;
  expect(res.status).toBe(201);
  expect(res.body.photos).toHaveLength(1);
});
