import { afterAll, beforeAll, expect, it } from 'vitest';
import type { BrowserContext } from 'playwright-core';
import { launchBrowser } from '../helpers/browser';
import { startE2eServer } from '../helpers/e2e-server';
import { finishSignUp, mailJobsOn, PASSWORD, uniqueEmail } from '../helpers/factories';
import type { RunningServer } from '../../server/index';

let server: RunningServer;
let browser: BrowserContext;
beforeAll(async () => {
  server = await startE2eServer(mailJobsOn);
  browser = await launchBrowser({ viewport: { width: 390, height: 844 } });
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

it('works out the 4-3-2-1 strip block and a 6 × 7 quilt of 42 such blocks', async () => {
  const page = await browser.newPage();
  await page.goto(`${server.url}/register?next=/planner`);
  await page.getByLabel('Your name').fill('Agnes Whitcombe');
  const email = uniqueEmail('planner');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(PASSWORD);
  await page.getByRole('button', { name: 'Create account' }).click();
  await finishSignUp(page, email);
  await page.getByRole('heading', { name: 'Cutting planner' }).waitFor();

  // Strips cut 4", 3", 2", 1" with ¼" seams (common practice, no source): 8½" unfinished, 8" finished.
  await page.getByLabel('Column cut widths').fill('4, 3, 2, 1');
  await page.getByLabel('Row cut heights').fill('4, 3, 2, 1');
  expect(await page.getByTestId('unfinished-size').textContent()).toBe('8½″ × 8½″');
  await page.getByText('the strip set is 8½″ wide').first().waitFor();
  await expect.poll(() => page.getByRole('img', { name: /8″ × 8″ finished block/ }).count()).toBe(1);

  await page.getByLabel('Blocks in the quilt').fill('42');
  await page.getByLabel('Blocks across').fill('6');
  expect(await page.getByTestId('top-size').textContent()).toBe('48″ × 56″');

  // A bad entry says what is wrong and keeps the text.
  await page.getByLabel('Row cut heights').fill('4, 3, abc');
  await page.getByText(/Entry 3 \(“abc”\)/).waitFor();
  expect(await page.getByLabel('Row cut heights').inputValue()).toBe('4, 3, abc');

  // Safety cautions sit beside the cutting plan.
  await page.getByLabel('Row cut heights').fill('4, 3, 2, 1');
  await page
    .getByRole('complementary', { name: 'Safety cautions' })
    .getByText(/Close or cover the rotary cutter blade/)
    .waitFor();
});

it('shows sizes in millimetres when asked', async () => {
  const page = browser.pages().at(-1)!;
  await page.getByText('Millimetres').click();
  expect(await page.getByTestId('unfinished-size').textContent()).toBe('215.9 mm × 215.9 mm');
});
