import { afterAll, beforeAll, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import type { Point } from '@shared/quilt';
import { launchBrowser } from '../helpers/browser';
import { startE2eServer } from '../helpers/e2e-server';
import { seriousViolations } from '../helpers/axe';
import type { RunningServer } from '../../server/index';
import { liveGuild, type Person } from '../live/live-helpers';
import { collectingSwap } from '../live/swap-setup';
import { rectangle, scene, scenePhoto } from '../fixtures/photo-measure-scene';

let server: RunningServer;
let laptop: BrowserContext;
let phone: BrowserContext;

// A 9⅛″ × 9½″ block inside a 12″ square of the mat's grid, photographed at an angle: ⅜″ short of 9½″.
const photo = scene({ referenceSize: 12, block: rectangle(1.25, 1.25, 9.125, 9.5, 2), camera: { target: [6, 6] } });

async function signedInPage(context: BrowserContext, person: Person): Promise<Page> {
  const [name, value] = person.cookie.split('=') as [string, string];
  await context.addCookies([{ name, value, url: server.url }]);
  return context.newPage();
}

async function uploadPhoto(person: Person, blockId: number): Promise<number> {
  const form = new FormData();
  form.append('photos', new Blob([new Uint8Array(await scenePhoto(photo, 'jpeg'))], { type: 'image/jpeg' }), 'on-the-mat.jpg');
  const res = await fetch(`${server.url}/api/blocks/${blockId}/photos`, {
    method: 'POST',
    headers: { cookie: person.cookie, 'x-requested-with': 'blockpost' },
    body: form,
  });
  expect(res.status).toBe(201);
  return ((await res.json()) as { photos: { id: number }[] }).photos[0]!.id;
}

/** Clicks a point given in photo pixels on the photo as shown. */
async function clickPhoto(page: Page, [x, y]: Point) {
  const box = (await page.getByRole('img', { name: /on the cutting mat/ }).boundingBox())!;
  await page.mouse.click(box.x + (x * box.width) / photo.width, box.y + (y * box.height) / photo.height);
}

beforeAll(async () => {
  server = await startE2eServer();
  laptop = await launchBrowser();
  phone = await launchBrowser({ viewport: { width: 360, height: 780 } });
});
afterAll(async () => {
  await laptop?.close();
  await phone?.close();
  await server?.close();
});

it('marks the eight corners on a photo, shows the estimate and verdict, saves it and lists it; the board shows it', async () => {
  const g = await liveGuild(server.url);
  const { swapId, blockIds } = await collectingSwap(g.coordinator, g.guildId, [g.member, g.coordinator], 1);
  const blockId = blockIds.get(g.member.id)![0]!;
  const photoId = await uploadPhoto(g.member, blockId);

  // The maker finds the link beside the photo on the swap page.
  const page = await signedInPage(laptop, g.member);
  const cspErrors: string[] = [];
  page.on(
    'console',
    (m) => m.type() === 'error' && /Content.Security.Policy|Refused to/i.test(m.text()) && cspErrors.push(m.text()),
  );
  await page.goto(`${server.url}/guilds/${g.guildId}/swaps/${swapId}`);
  await page.getByRole('link', { name: /Measure from this photo/ }).click();
  await page.getByRole('heading', { name: 'Measure block 1 from its photo' }).waitFor();
  expect(page.url()).toBe(`${server.url}/guilds/${g.guildId}/swaps/${swapId}/blocks/${blockId}/photos/${photoId}/measure`);
  await page.getByRole('img', { name: /on the cutting mat/ }).evaluate((img: HTMLImageElement) => img.decode());

  await page.getByLabel('Size of the reference square').fill('12″');
  await page.getByText('Next: tap the reference top-left corner (0 of 8 placed).').waitFor();
  for (const p of photo.image.reference) await clickPhoto(page, p);
  await page.getByText('Next: tap the block top-left corner (4 of 8 placed).').waitFor();
  for (const p of photo.image.block) await clickPhoto(page, p);
  await page.getByText('All eight corners are placed.').waitFor();

  const estimate = page.locator('section', { has: page.getByRole('heading', { name: 'Estimate', exact: true }) });
  await estimate.getByText('Photo estimate: likely runs short').waitFor();
  expect(await estimate.locator('dd').first().textContent()).toMatch(/^9⅛″ \(−⅜″ against 9½″\)/);
  await estimate.getByText(/Expected error/).waitFor();
  // The marks, handles and magnifier work under the app's own CSP (no inline styles), and pass axe.
  expect(await seriousViolations(page)).toEqual([]);
  expect(cspErrors).toEqual([]);

  // Keyboard: a focused handle moves a pixel per arrow press, ten with Shift.
  const handle = page.getByRole('button', { name: /^B1: block top-left, at / });
  const before = (await handle.getAttribute('aria-label'))!.match(/at (\d+), (\d+)/)!.map(Number);
  await handle.focus();
  await page.keyboard.press('Shift+ArrowRight');
  await page.keyboard.press('ArrowDown');
  const after = (await handle.getAttribute('aria-label'))!.match(/at (\d+), (\d+)/)!.map(Number);
  expect([after[1]! - before[1]!, after[2]! - before[2]!]).toEqual([10, 1]);
  await page.locator('figure figcaption', { hasText: 'block top-left' }).waitFor();

  // Dragging puts it back, with the magnifier showing while the mouse is down.
  const box = (await page.getByRole('img', { name: /on the cutting mat/ }).boundingBox())!;
  const shown = (x: number, y: number) =>
    [box.x + (x * box.width) / photo.width, box.y + (y * box.height) / photo.height] as const;
  const [fx, fy] = shown(after[1]!, after[2]!);
  const [tx, ty] = shown(...photo.image.block[0]);
  await page.mouse.move(fx, fy);
  await page.mouse.down();
  await page.mouse.move(tx, ty, { steps: 5 });
  await page.locator('figure canvas').waitFor();
  await page.mouse.up();
  await expect.poll(() => page.locator('figure canvas').count()).toBe(0);
  await estimate.getByText('Photo estimate: likely runs short').waitFor();

  // The coordinator watches the swap's board on a phone meanwhile.
  const board = await signedInPage(phone, g.coordinator);
  await board.goto(`${server.url}/guilds/${g.guildId}/swaps/${swapId}/board`);
  await board.getByText('Live: changes appear by themselves.').waitFor();
  await board.evaluate(() => ((window as unknown as { stayedOpen: boolean }).stayedOpen = true));
  // The board's camera mark: the drawn camera and the estimate's word.
  const cameraMark = board.locator('li span', { has: board.locator('svg'), hasText: 'likely short' });
  expect(await cameraMark.count()).toBe(0);

  await page.getByRole('button', { name: 'Save this estimate' }).click();
  await page.getByText('✓ Saved.').waitFor();
  const saved = page.getByRole('list', { name: 'Saved photo estimates, newest first' }).getByRole('listitem');
  await expect.poll(() => saved.count()).toBe(1);
  expect(await saved.first().textContent()).toMatch(
    /Photo estimate: likely runs short.*9⅛″ × 9½″.*by Milo Member, against a 12″ reference square on this photo/,
  );

  // The coordinator's open board, on a phone, took the estimate in live, with its own camera mark.
  await board
    .getByTitle(/^Block 1: .*photo estimate likely short/)
    .first()
    .waitFor({ timeout: 5000 });
  await cameraMark.first().waitFor();
  expect(await board.evaluate(() => (window as unknown as { stayedOpen?: boolean }).stayedOpen)).toBe(true);
});

it('marks by touch on a 360 px phone: tap to place, drag a handle with a finger, no sideways scrolling', async () => {
  const g = await liveGuild(server.url);
  const { swapId, blockIds } = await collectingSwap(g.coordinator, g.guildId, [g.member], 1);
  const blockId = blockIds.get(g.member.id)![0]!;
  const photoId = await uploadPhoto(g.member, blockId);
  const page = await signedInPage(phone, g.coordinator);
  await page.goto(`${server.url}/guilds/${g.guildId}/swaps/${swapId}/blocks/${blockId}/photos/${photoId}/measure`);
  const img = page.getByRole('img', { name: /on the cutting mat/ });
  await img.evaluate((el: HTMLImageElement) => el.decode());
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(360);

  // A finger, through the browser's touch input (pointer events of type "touch").
  const cdp = await page.context().newCDPSession(page);
  await cdp.send('Emulation.setTouchEmulationEnabled', { enabled: true, maxTouchPoints: 1 });
  const touch = (type: 'touchStart' | 'touchMove' | 'touchEnd', x = 0, y = 0) =>
    cdp.send('Input.dispatchTouchEvent', { type, touchPoints: type === 'touchEnd' ? [] : [{ x, y }] });
  const box = (await img.boundingBox())!;
  const onScreen = ([x, y]: Point) => [box.x + (x * box.width) / photo.width, box.y + (y * box.height) / photo.height] as const;

  const [ax, ay] = onScreen(photo.image.reference[0]);
  await touch('touchStart', ax, ay);
  await touch('touchEnd');
  await page.getByText('Next: tap the reference top-right corner (1 of 8 placed).').waitFor();
  const handle = page.getByRole('button', { name: /^R1: reference top-left, at / });
  const placed = (await handle.getAttribute('aria-label'))!
    .match(/at (\d+), (\d+)/)!
    .slice(1)
    .map(Number);
  photo.image.reference[0].forEach((v, i) => expect(Math.abs(placed[i]! - v)).toBeLessThanOrEqual(5));

  // Drag the mark 40 px right with the finger: it follows, and the magnifier shows meanwhile.
  await touch('touchStart', ax, ay);
  for (let k = 1; k <= 4; k += 1) await touch('touchMove', ax + 10 * k, ay);
  await page.locator('figure canvas').waitFor();
  await touch('touchEnd');
  await expect.poll(() => page.locator('figure canvas').count()).toBe(0);
  const moved = (await handle.getAttribute('aria-label'))!
    .match(/at (\d+), (\d+)/)!
    .slice(1)
    .map(Number);
  expect(Math.round(((moved[0]! - placed[0]!) * box.width) / photo.width)).toBe(40);
  await page.getByText('Next: tap the reference top-right corner (1 of 8 placed).').waitFor();

  await page.getByRole('button', { name: 'Place the rest for me to adjust' }).click();
  await page.getByText('All eight corners are placed.').waitFor();
  expect(await page.getByRole('button', { name: /^[RB][1-4]: (reference|block) / }).count()).toBe(8);
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(360);
});
