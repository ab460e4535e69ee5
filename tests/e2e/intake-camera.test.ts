/**
 * Scanning with the camera: Chromium's fake camera plays a picture of a printed label (a one-frame
 * Y4M video), and the intake view reads it (jsqr here; desktop Chromium on Linux has no
 * BarcodeDetector), takes the block in and opens its measuring card.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, expect, it } from 'vitest';
import supertest from 'supertest';
import QRCode from 'qrcode';
import sharp from 'sharp';
import { chromium, type BrowserContext } from 'playwright-core';
import { CHROMIUM } from '../helpers/browser';
import { startE2eServer } from '../helpers/e2e-server';
import { insertConfirmedAccount, PASSWORD, signIn as signInAgent, uniqueEmail } from '../helpers/factories';
import { swapBody } from '../api/swaps-support';
import type { RunningServer } from '../../server/index';
import type { LabelSheetDataDto } from '../../shared/schemas/intake';

const W = 640;
const H = 480;

let server: RunningServer;
let browser: BrowserContext;
let agent: ReturnType<typeof supertest.agent>;
let email: string;
let guildId: number;
let swapId: number;
let label: LabelSheetDataDto['labels'][number];

/** A 640 × 480 grey-scale video frame (YUV 4:2:0, neutral colour) of the QR code on white, as Y4M. */
async function labelVideo(reference: string): Promise<string> {
  const qr = await QRCode.toBuffer(reference, { errorCorrectionLevel: 'M', margin: 4, scale: 8, type: 'png' });
  const luma = await sharp({ create: { width: W, height: H, channels: 3, background: '#f4f1ea' } })
    .composite([{ input: qr, gravity: 'center' }])
    .greyscale()
    .raw()
    .toBuffer();
  const chroma = Buffer.alloc((W / 2) * (H / 2), 128);
  const file = join(mkdtempSync(join(tmpdir(), 'blockpost-camera-')), 'label.y4m');
  writeFileSync(
    file,
    Buffer.concat([
      Buffer.from(`YUV4MPEG2 W${W} H${H} F10:1 Ip A1:1 C420jpeg\nFRAME\n`),
      luma.subarray(0, W * H),
      chroma,
      chroma,
    ]),
  );
  return file;
}

beforeAll(async () => {
  server = await startE2eServer();
  agent = supertest.agent(server.url).set('X-Requested-With', 'blockpost');
  email = uniqueEmail('camera');
  await insertConfirmedAccount(server.deps.pool, { email, displayName: 'Perpetua Lindqvist' });
  await signInAgent(agent, email);
  guildId = (await agent.post('/api/guilds').send({ name: 'Hollow Oak Stitchers' }).expect(201)).body.id;
  swapId = (
    await agent
      .post(`/api/guilds/${guildId}/swaps`)
      .send(swapBody({ title: 'Churn Dash Exchange' }))
      .expect(201)
  ).body.id;
  await agent.post(`/api/swaps/${swapId}/transitions`).send({ to: 'signup' }).expect(200);
  await agent.post(`/api/swaps/${swapId}/signups`).send({ blocks: 2 }).expect(200);
  for (const to of ['sewing', 'collecting']) await agent.post(`/api/swaps/${swapId}/transitions`).send({ to }).expect(200);
  label = ((await agent.get(`/api/swaps/${swapId}/labels`).expect(200)).body as LabelSheetDataDto).labels[1]!;

  browser = await chromium.launchPersistentContext(mkdtempSync(join(tmpdir(), 'blockpost-chromium-')), {
    executablePath: CHROMIUM,
    headless: true,
    viewport: { width: 390, height: 844 },
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--use-fake-ui-for-media-stream',
      '--use-fake-device-for-media-stream',
      `--use-file-for-fake-video-capture=${await labelVideo(label.reference)}`,
    ],
  });
  await browser.grantPermissions(['camera'], { origin: server.url });
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

it('reads a label held up to the camera and opens that block’s measuring card', async () => {
  const page = await browser.newPage();
  await page.goto(`${server.url}/sign-in?next=${encodeURIComponent(`/guilds/${guildId}/swaps/${swapId}/intake`)}`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('heading', { name: 'Intake: Churn Dash Exchange' }).waitFor();

  await page.getByRole('button', { name: 'Start camera' }).click();
  await page.getByRole('heading', { name: 'Block 2 of 2 · Perpetua Lindqvist' }).waitFor({ timeout: 15_000 });
  await page.getByText('Reading codes on this device').waitFor();
  await expect.poll(async () => (await agent.get(`/api/blocks/${label.blockId}`)).body.state).toBe('received');

  // The label stays in view: it is not taken in again, and the card stays open for measuring.
  await page.waitForTimeout(1000);
  await page.keyboard.type('9 1/2');
  await page.keyboard.press('Tab');
  await page.keyboard.type('9 1/2');
  await page.keyboard.press('Enter');
  await page.getByTestId('verdict').getByText('True to size').waitFor();
  // "All synced" can already show before the save is queued, so wait for the stored row itself.
  await expect.poll(async () => (await agent.get(`/api/blocks/${label.blockId}/measurements`).expect(200)).body.length).toBe(1);
  await page.getByText('All synced').waitFor();
  await page.getByRole('button', { name: 'Stop camera' }).click();
  await page.getByRole('button', { name: 'Start camera' }).waitFor();
});
