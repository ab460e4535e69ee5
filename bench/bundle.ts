/**
 * Production bundle size: the initial load (entry JS + CSS and everything they import statically) and
 * each lazily loaded route chunk with its own static imports, gzip-compressed as a server would send them.
 */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';

interface ManifestChunk {
  file: string;
  src?: string;
  isEntry?: boolean;
  isDynamicEntry?: boolean;
  imports?: string[];
  css?: string[];
}

export interface BundleRow {
  chunk: string;
  js_gzip_kB: number;
  css_gzip_kB: number;
  target?: string;
}

const root = new URL('..', import.meta.url).pathname;
const dist = join(root, 'dist');
const gz = (file: string) => gzipSync(readFileSync(join(dist, file)), { level: 9 }).length / 1024;

export function runBundleBench(opts: { build?: boolean } = {}): BundleRow[] {
  if (opts.build !== false) {
    const r = spawnSync(process.execPath, ['node_modules/vite/bin/vite.js', 'build', '--logLevel', 'error'], {
      cwd: root,
      stdio: 'inherit',
    });
    if (r.status !== 0) throw new Error('vite build failed');
  }
  const manifest = JSON.parse(readFileSync(join(dist, '.vite', 'manifest.json'), 'utf8')) as Record<string, ManifestChunk>;

  /** The chunk's files plus its static imports, minus what `exclude` already loaded. */
  const closure = (key: string, exclude: Set<string>, seen = new Set<string>()) => {
    if (seen.has(key) || exclude.has(key)) return seen;
    seen.add(key);
    for (const dep of manifest[key]?.imports ?? []) closure(dep, exclude, seen);
    return seen;
  };
  const size = (keys: Set<string>) => {
    let js = 0;
    let css = 0;
    for (const key of keys) {
      js += gz(manifest[key]!.file);
      for (const c of manifest[key]!.css ?? []) css += gz(c);
    }
    return { js, css };
  };

  const entryKey = Object.keys(manifest).find((k) => manifest[k]!.isEntry)!;
  const initial = closure(entryKey, new Set());
  const rows: BundleRow[] = [];
  const first = size(initial);
  rows.push({ chunk: 'initial (entry)', js_gzip_kB: round(first.js), css_gzip_kB: round(first.css), target: '< 200 kB JS' });
  for (const key of Object.keys(manifest)
    .filter((k) => manifest[k]!.isDynamicEntry)
    .sort()) {
    const own = size(closure(key, initial));
    rows.push({ chunk: key.replace(/^src\//, ''), js_gzip_kB: round(own.js), css_gzip_kB: round(own.css) });
  }
  return rows;
}

const round = (n: number) => Math.round(n * 10) / 10;

if (import.meta.url === `file://${process.argv[1]}`) {
  console.table(runBundleBench());
}
