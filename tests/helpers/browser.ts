/** Debian's Chromium driven by playwright-core, with the launch options this machine needs. */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext } from 'playwright-core';

export const CHROMIUM = '/usr/bin/chromium';

export async function launchBrowser(opts: { viewport?: { width: number; height: number } } = {}): Promise<BrowserContext> {
  // --user-data-dir in args is refused by playwright; a persistent context gets a fresh folder instead.
  return chromium.launchPersistentContext(mkdtempSync(join(tmpdir(), 'blockpost-chromium-')), {
    executablePath: CHROMIUM,
    headless: true,
    viewport: opts.viewport ?? { width: 1280, height: 900 },
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

/** A new page in `context` carrying a session cookie ("name=value") for `url`. */
export async function pageWithSession(context: BrowserContext, cookie: string, url: string) {
  const [name, value] = cookie.split('=') as [string, string];
  await context.addCookies([{ name, value, url }]);
  return context.newPage();
}
