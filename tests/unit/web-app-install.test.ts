import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import sharp from 'sharp';

describe('installing the web app', () => {
  const root = new URL('../../public/', import.meta.url);
  const manifest = JSON.parse(readFileSync(new URL('manifest.webmanifest', root), 'utf8'));

  it('has a manifest a browser can install from', () => {
    expect(manifest).toMatchObject({ name: 'Blockpost', start_url: '/guilds', scope: '/', display: 'standalone' });
    // Chromium's installability check wants 192 px and 512 px icons.
    const sizes = manifest.icons.map((i: { sizes: string }) => i.sizes);
    expect(sizes).toEqual(expect.arrayContaining(['192x192', '512x512']));
    expect(manifest.icons.some((i: { purpose: string }) => i.purpose === 'maskable')).toBe(true);
  });

  it('points at icon files of the sizes it claims', async () => {
    for (const icon of manifest.icons.filter((i: { type: string }) => i.type === 'image/png')) {
      const meta = await sharp(readFileSync(new URL(`.${icon.src}`, root))).metadata();
      expect(`${meta.width}x${meta.height}`, icon.src).toBe(icon.sizes);
      expect(meta.format).toBe('png');
    }
  });

  it('keeps only the intake’s API answers in the service worker, never other /api data', () => {
    const sw = readFileSync(new URL('sw.js', root), 'utf8');
    const kept = /const API_FALLBACK = \[(.*)\];/.exec(sw)![1]!;
    const patterns = [...kept.matchAll(/\/(\^.*?\$)\//g)].map((m) => new RegExp(m[1]!.replace(/\\\\/g, '\\')));
    const matches = (path: string) => patterns.some((re) => re.test(path));
    expect(['/api/session', '/api/guilds/4', '/api/swaps/7/intake'].every(matches)).toBe(true);
    for (const path of [
      '/api/swaps/7/roster',
      '/api/swaps/7/labels',
      '/api/guilds/4/members',
      '/api/photos/3',
      '/api/swaps/7/export/roster.csv',
    ]) {
      expect(matches(path), path).toBe(false);
    }
  });
});
