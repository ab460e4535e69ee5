/**
 * Hostile and broken uploads: each is refused with a message naming the file, and nothing reaches
 * the upload folder (or anywhere else), the photos table or the block's state.
 */
import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles, joinGuild } from '../helpers/factories';
import { heicReadable } from '../../server/uploads/photo-pipeline';
import {
  elfExecutable,
  heicHeader,
  htmlPolyglot,
  oversizedFile,
  picture,
  pixelBombPng,
  svgWithScript,
  windowsExecutable,
} from '../fixtures/photos';
import { blockState, filesUnder, photoRowCount, swapWithBlock } from '../fixtures/photo-blocks';

let app: TestApp;
let roles: Awaited<ReturnType<typeof guildWithRoles>>;
let blockId: number;
let uploadDir: string;
let jpeg: Buffer;

beforeAll(async () => {
  app = await createTestApp();
  uploadDir = app.deps.config.UPLOAD_DIR;
  roles = await guildWithRoles(app);
  ({ blockId } = await swapWithBlock(app, roles.guildId, roles.member.id));
  jpeg = await picture('jpeg');
});
afterAll(() => app.close());

type Part = { name: string; bytes: Buffer; field?: string; type?: string };

function upload(parts: Part[]) {
  let req = roles.member.agent.post(`/api/blocks/${blockId}/photos`);
  for (const p of parts)
    req = req.attach(p.field ?? 'photos', p.bytes, { filename: p.name, contentType: p.type ?? 'image/jpeg' });
  return req;
}

async function expectRefused(parts: Part[], status: number, message: RegExp) {
  const res = await upload(parts);
  expect(res.status).toBe(status);
  expect(res.headers['content-type']).toMatch(/application\/json/);
  expect(res.body.error.message).toMatch(message);
  expect(JSON.stringify(res.body)).not.toMatch(/node_modules|at .*\.ts|stack/i);
  expect(filesUnder(uploadDir)).toEqual([]);
  expect(await photoRowCount(app)).toBe(0);
  expect(await blockState(app, blockId)).toBe('pledged');
  return res.body.error as { code: string; message: string; fields?: Record<string, string> };
}

describe('refused uploads leave nothing behind', () => {
  it('a Linux program renamed notes.jpg', async () => {
    const error = await expectRefused(
      [{ name: 'notes.jpg', bytes: elfExecutable() }],
      415,
      /^“notes\.jpg” is not a photo\. Upload JPEG, PNG/,
    );
    expect(error.fields).toEqual({ photos: error.message });
  });

  it('a Windows program renamed notes.exe.jpg', async () => {
    await expectRefused([{ name: 'notes.exe.jpg', bytes: windowsExecutable() }], 415, /^“notes\.exe\.jpg” is not a photo/);
  });

  it('an SVG carrying a script, even when it claims to be a JPEG', async () => {
    await expectRefused(
      [{ name: 'pattern.svg', bytes: svgWithScript(), type: 'image/svg+xml' }],
      415,
      /^“pattern\.svg” is a drawing \(SVG\), not a photo/,
    );
    await expectRefused([{ name: 'pattern.jpg', bytes: svgWithScript() }], 415, /^“pattern\.jpg” is a drawing \(SVG\)/);
  });

  it('JPEG magic bytes wrapped around an HTML page', async () => {
    await expectRefused(
      [{ name: 'invite.jpg', bytes: htmlPolyglot() }],
      415,
      /^“invite\.jpg” starts like a JPEG picture but cannot be read/,
    );
  });

  it('a picture whose header claims 400 megapixels', async () => {
    await expectRefused(
      [{ name: 'bomb.png', bytes: pixelBombPng(), type: 'image/png' }],
      413,
      /^“bomb\.png” is 20000 × 20000 pixels/,
    );
  });

  it('a file over 15 MB', async () => {
    await expectRefused([{ name: 'whole-quilt.jpg', bytes: oversizedFile() }], 413, /^“whole-quilt\.jpg” is larger than 15 MB/);
  });

  it('an empty file', async () => {
    await expectRefused([{ name: 'empty.jpg', bytes: Buffer.alloc(0) }], 400, /^“empty\.jpg” is empty \(0 bytes\)/);
  });

  it('names that climb out of the folder, and nothing lands where they point', async () => {
    // Built by hand: HTTP client libraries trim such names to their last part before sending.
    for (const name of ['../../escape.jpg', '..\\..\\escape.jpg', '/tmp/escape.jpg', 'C:\\Users\\me\\escape.jpg']) {
      const { body, contentType } = rawMultipart(name, jpeg);
      const res = await roles.member.agent.post(`/api/blocks/${blockId}/photos`).set('Content-Type', contentType).send(body);
      expect(res.status).toBe(400);
      expect(res.body.error.message).toBe(
        `The file name “${name}” contains folder parts (“/”, “\\” or “..”) or hidden characters. Rename the file and choose it again.`,
      );
      expect(filesUnder(uploadDir)).toEqual([]);
    }
    for (const dir of [dirname(uploadDir), dirname(dirname(uploadDir)), '/tmp'])
      expect(existsSync(join(dir, 'escape.jpg'))).toBe(false);
    expect(await photoRowCount(app)).toBe(0);
  });

  it('more than ten files at once', async () => {
    const parts = Array.from({ length: 11 }, (_, i) => ({ name: `block-${i + 1}.jpg`, bytes: jpeg }));
    await expectRefused(parts, 400, /^Send at most 10 photos at a time/);
  });

  it('a file in another field, or no file at all', async () => {
    await expectRefused([{ name: 'a.jpg', bytes: jpeg, field: 'avatar' }], 400, /sent in the “photos” field, not “avatar”/);
    const none = await roles.member.agent.post(`/api/blocks/${blockId}/photos`).field('note', 'hello');
    expect(none.status).toBe(400);
    expect(none.body.error.message).toMatch(/Choose at least one photo/);
    const json = await roles.member.agent.post(`/api/blocks/${blockId}/photos`).send({ photos: 'x' });
    expect(json.status).toBe(400);
    expect(json.body.error.code).toBe('not_multipart');
    expect(filesUnder(uploadDir)).toEqual([]);
  });

  it('a batch with one bad file among good ones, naming it', async () => {
    const error = await expectRefused(
      [
        { name: 'first.jpg', bytes: jpeg },
        { name: 'sneaky.jpg', bytes: elfExecutable() },
        { name: 'third.jpg', bytes: jpeg },
      ],
      415,
      /^“sneaky\.jpg” is not a photo\..*None of the 3 photos were saved/,
    );
    expect(error.code).toBe('not_a_photo');
  });

  it('HEIC where this server cannot read it, with advice', async () => {
    if (heicReadable()) return; // this build reads HEIC; the header-only file is then merely unreadable
    await expectRefused(
      [{ name: 'IMG_0042.HEIC', bytes: heicHeader(), type: 'image/heic' }],
      415,
      /^“IMG_0042\.HEIC” is a HEIC photo, which this server cannot read\. Send it as JPEG/,
    );
  });

  it('refuses strangers, other members and signed-out callers before reading the body', async () => {
    const otherMember = (await joinGuild(app, roles.guildId, 'member')).agent;
    // Someone from another guild gets the 404 of a block that does not exist; another member gets 403.
    for (const [agent, status] of [
      [roles.stranger.agent, 404],
      [otherMember, 403],
    ] as const) {
      const res = await agent.post(`/api/blocks/${blockId}/photos`).attach('photos', jpeg, 'ok.jpg');
      expect(res.status).toBe(status);
    }
    const anonymous = await (
      await import('supertest')
    )
      .default(app.app)
      .post(`/api/blocks/${blockId}/photos`)
      .set('X-Requested-With', 'blockpost')
      .attach('photos', jpeg, 'ok.jpg');
    expect(anonymous.status).toBe(401);
    expect(filesUnder(uploadDir)).toEqual([]);
  });

  it('still takes a real photo for the same block afterwards (the refusals were about the files)', async () => {
    const res = await upload([{ name: 'real.jpg', bytes: jpeg }]).expect(201);
    expect(res.body.photos).toHaveLength(1);
    expect(filesUnder(uploadDir)).toHaveLength(2);
    expect(filesUnder(uploadDir).every((f) => /^photos\/[\w-]{22}\.jpg$/.test(f))).toBe(true);
  });
});

function rawMultipart(filename: string, bytes: Buffer) {
  const boundary = '----blockpost-test-boundary';
  const head = `--${boundary}\r\nContent-Disposition: form-data; name="photos"; filename="${filename}"\r\nContent-Type: image/jpeg\r\n\r\n`;
  const body = Buffer.concat([Buffer.from(head, 'utf8'), bytes, Buffer.from(`\r\n--${boundary}--\r\n`)]);
  return { body, contentType: `multipart/form-data; boundary=${boundary}` };
}
