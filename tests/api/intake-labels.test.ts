import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import jsQR from 'jsqr';
import QRCode from 'qrcode';
import sharp from 'sharp';
import type { LabelSheetDataDto } from '../../shared/schemas/intake';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { guildWithRoles } from '../helpers/factories';
import { QR_OPTIONS } from '../../server/intake/qr';
import { sewingSwap, type Roles } from './swaps-support';

let app: TestApp;
let roles: Roles;
let swapId: number;

beforeAll(async () => {
  app = await createTestApp();
  roles = await guildWithRoles(app);
  const { swap } = await sewingSwap(app, roles, { pledges: [4, 2, 3] });
  swapId = swap.id;
});
afterAll(() => app.close());

/** Decodes a PNG or SVG image with jsqr from sharp's raw RGBA pixels. */
async function decode(image: Buffer): Promise<string | null> {
  const { data, info } = await sharp(image, { density: 300 })
    .flatten({ background: '#ffffff' })
    .ensureAlpha()
    .raw()
    .toBuffer({ resolveWithObject: true });
  return jsQR(new Uint8ClampedArray(data.buffer, data.byteOffset, data.length), info.width, info.height)?.data ?? null;
}

const labelsOf = async (agent: Roles['member']['agent'], query = '') =>
  (await agent.get(`/api/swaps/${swapId}/labels${query}`).expect(200)).body as LabelSheetDataDto;

describe('label sheet data', () => {
  it('gives a member one label per pledged block, numbered “n of 4”', async () => {
    const sheet = await labelsOf(roles.member.agent);
    expect(sheet.swap).toMatchObject({
      id: swapId,
      title: 'Harvest Stripes',
      guildName: expect.stringMatching(/Lantern Street Quilters/),
    });
    expect(sheet.labels).toHaveLength(4);
    expect(sheet.labels.map((l) => `${l.ordinal} of ${l.of}`)).toEqual(['1 of 4', '2 of 4', '3 of 4', '4 of 4']);
    expect(new Set(sheet.labels.map((l) => l.makerName))).toEqual(new Set([sheet.labels[0]!.makerName]));
    expect(sheet.labels.every((l) => l.qr.startsWith('data:image/svg+xml;base64,'))).toBe(true);
  });

  it('gives officers anyone’s labels, or all nine', async () => {
    expect((await labelsOf(roles.coordinator.agent, '?maker=all')).labels).toHaveLength(9);
    expect((await labelsOf(roles.admin.agent, `?maker=${roles.member.id}`)).labels).toHaveLength(4);
    expect((await labelsOf(roles.coordinator.agent)).labels).toHaveLength(2);
  });

  it('refuses a member asking for someone else’s labels, and strangers', async () => {
    const all = await roles.member.agent.get(`/api/swaps/${swapId}/labels?maker=all`).expect(403);
    expect(all.body.error.message).toMatch(/own blocks/);
    await roles.member.agent.get(`/api/swaps/${swapId}/labels?maker=${roles.coordinator.id}`).expect(403);
    await roles.stranger.agent.get(`/api/swaps/${swapId}/labels`).expect(404);
    const bad = await roles.member.agent.get(`/api/swaps/${swapId}/labels?maker=everyone`).expect(400);
    expect(bad.body.error.fields).toHaveProperty('maker');
  });

  it('says nothing is to print for a member who pledged nothing', async () => {
    expect((await labelsOf(roles.admin.agent)).labels).toEqual([]);
  });
});

describe('QR payloads decode back', () => {
  it('the served SVG, rasterised, decodes to the label’s reference', async () => {
    const sheet = await labelsOf(roles.member.agent);
    for (const label of sheet.labels) {
      const svg = Buffer.from(label.qr.slice('data:image/svg+xml;base64,'.length), 'base64');
      expect(await decode(svg)).toBe(label.reference);
    }
  });

  it('a PNG from qrcode.toBuffer with the same options decodes to the reference', async () => {
    const [label] = (await labelsOf(roles.member.agent)).labels;
    const png = await QRCode.toBuffer(label!.reference, { ...QR_OPTIONS, type: 'png', scale: 4 });
    expect(await decode(png)).toBe(label!.reference);
    // The decoded text resolves to the same block.
    const res = await roles.coordinator.agent
      .post('/api/intake/resolve')
      .send({ swapId, reference: await decode(png) })
      .expect(200);
    expect(res.body.block).toMatchObject({ id: label!.blockId, shortCode: label!.shortCode });
  });
});
