/**
 * Every page reachable from the navigation, for each demo role, on two phone sizes: nothing scrolls
 * sideways, the console stays quiet (no warning, no error), and axe-core — target size included —
 * finds nothing. Pages are found by following the links a person could tap, one page per kind of URL.
 */
import { mkdirSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { launchBrowser } from '../helpers/browser';
import { startE2eServer } from '../helpers/e2e-server';
import type { RunningServer } from '../../server/index';
import { seedDemoIfEmpty, DEMO_SIGN_INS } from '../../server/seed/demo';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';

const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
/** Set PHONE_SHOTS=/some/folder to keep a screenshot of every page visited (for looking, not asserting). */
const shots = process.env.PHONE_SHOTS;

let server: RunningServer;
beforeAll(async () => {
  server = await startE2eServer();
  await seedDemoIfEmpty(server.deps.sequelize, { ...server.deps.config, NODE_ENV: 'development' });
  if (shots) mkdirSync(shots, { recursive: true });
});
afterAll(async () => {
  await server?.close();
});

/** One URL per kind of page: ids become ":id", so the crawl visits each screen once, not every swap. */
const kindOf = (path: string) => path.replace(/\/\d+(?=\/|$)/g, '/:id');

/** Links a person could follow from here, inside the app, skipping downloads and sign-out. */
async function linksOn(page: Page, origin: string): Promise<string[]> {
  const hrefs = await page.$$eval('a[href]', (as) =>
    as
      .filter((a) => !a.hasAttribute('download') && a.getAttribute('target') !== '_blank')
      .map((a) => (a as HTMLAnchorElement).href),
  );
  return hrefs
    .filter((h) => h.startsWith(origin))
    .map((h) => new URL(h).pathname + new URL(h).search)
    .filter((p) => !p.startsWith('/api/') && !p.includes('/labels') && !p.startsWith('/unsubscribe'));
}

async function axeFindings(page: Page) {
  await page.evaluate(axeSource);
  return page.evaluate(async () => {
    const axe = (
      window as unknown as {
        axe: { run(ctx: Document, opts: object): Promise<{ violations: { id: string; nodes: { target: string[] }[] }[] }> };
      }
    ).axe;
    const result = await axe.run(document, {
      runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'] },
      rules: { 'target-size': { enabled: true } },
    });
    return result.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
  });
}

/** Buttons, fields and stand-alone links smaller than 44 × 44 px (links inside a sentence are exempt). */
async function smallTargets(page: Page) {
  return page.$$eval(
    'main button, main input:not([type=hidden]), main select, main textarea, header button, header a, nav a, main a[class*="min-h"]',
    (els) =>
      els
        .filter((el) => {
          const r = el.getBoundingClientRect();
          if (r.width === 0 && r.height === 0) return false; // not shown
          const style = getComputedStyle(el);
          if (style.visibility === 'hidden' || el.closest('[hidden], .sr-only')) return false;
          if ((el as HTMLInputElement).type === 'radio' || (el as HTMLInputElement).type === 'checkbox') {
            const label = el.closest('label');
            if (label) {
              const lr = label.getBoundingClientRect();
              return lr.height < 43.5;
            }
          }
          return r.height < 43.5 || r.width < 43.5;
        })
        .map(
          (el) =>
            `${el.tagName.toLowerCase()} “${(el.textContent || (el as HTMLInputElement).name || el.getAttribute('aria-label') || '').trim().slice(0, 30)}”`,
        ),
  );
}

async function visit(page: Page, url: string, console: string[]) {
  console.length = 0;
  await page.goto(url);
  await page.waitForLoadState('networkidle');
  await page.locator('main h1, main h2').first().waitFor();
  await page.waitForTimeout(150);
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
  return { overflow, console: [...console] };
}

const sizes = [
  { width: 360, height: 740 },
  { width: 390, height: 844 },
];

for (const size of sizes) {
  describe(`${size.width} × ${size.height}`, () => {
    let browser: BrowserContext;
    beforeAll(async () => {
      browser = await launchBrowser({ viewport: size });
    });
    afterAll(async () => {
      await browser?.close();
    });

    it('signed-out pages fit, stay quiet and pass axe', async () => {
      const page = await browser.newPage();
      const messages: string[] = [];
      page.on('console', (m) => {
        if (m.type() === 'error' || m.type() === 'warning') messages.push(`${m.type()}: ${m.text()}`);
      });
      const problems: Record<string, unknown> = {};
      for (const path of ['/', '/sign-in', '/register', '/forgot-password']) {
        const seen = await visit(page, `${server.url}${path}`, messages);
        const axe = await axeFindings(page);
        const small = await smallTargets(page);
        if (shots) await page.screenshot({ path: `${shots}/${size.width}-out${path.replaceAll('/', '_')}.png`, fullPage: true });
        if (seen.overflow > 0 || seen.console.length || axe.length || small.length) problems[path] = { ...seen, axe, small };
      }
      expect(problems).toEqual({});
      await page.close();
    });

    for (const who of DEMO_SIGN_INS.emails) {
      it(
        `as ${who}, every page reachable from the navigation fits, stays quiet and passes axe`,
        { timeout: 600_000 },
        async () => {
          await browser.clearCookies();
          const page = await browser.newPage();
          const messages: string[] = [];
          page.on('console', (m) => {
            if (m.type() === 'error' || m.type() === 'warning') messages.push(`${m.type()}: ${m.text()}`);
          });
          page.on('pageerror', (e) => messages.push(`pageerror: ${e.message}`));
          await page.goto(`${server.url}/sign-in`);
          await page.getByLabel('E-mail').fill(who);
          await page.getByLabel('Password').fill(DEMO_SIGN_INS.password);
          await page.getByRole('button', { name: 'Sign in' }).click();
          await page.waitForURL('**/guilds');

          const origin = new URL(server.url).origin;
          const queue = ['/guilds'];
          // Swaps in different states show different pages (intake, return, board), so a few swaps are opened.
          const visits = new Map<string, number>([[kindOf('/guilds'), 1]]);
          const allowed = (kind: string) => (kind.endsWith('/swaps/:id') ? 6 : 1);
          const problems: Record<string, unknown> = {};
          let visited = 0;
          while (queue.length && visited < 90) {
            const path = queue.shift()!;
            visited++;
            const seen = await visit(page, `${origin}${path}`, messages);
            const axe = await axeFindings(page);
            const small = await smallTargets(page);
            if (shots)
              await page.screenshot({
                path: `${shots}/${size.width}-${who.split('@')[0]}${kindOf(path).replaceAll('/', '_').replaceAll(':', '')}.png`,
                fullPage: true,
              });
            if (seen.overflow > 0 || seen.console.length || axe.length || small.length) problems[path] = { ...seen, axe, small };
            for (const next of await linksOn(page, origin)) {
              const kind = kindOf(next.split('?')[0]!);
              const times = visits.get(kind) ?? 0;
              if (times < allowed(kind) && !queue.includes(next)) {
                visits.set(kind, times + 1);
                queue.push(next);
              }
            }
          }
          expect(visited).toBeGreaterThan(10);
          expect(problems).toEqual({});
          await page.close();
        },
      );
    }
  });
}
