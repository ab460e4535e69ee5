/**
 * `npm test`: builds the client (the browser suite serves it), makes sure Debian's Chromium is there,
 * runs every vitest project (unit, reference, API, live, browser) — each suite starts and stops its own
 * PostgreSQL and maildev — and prints one closing line "N passed, N failed".
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const root = new URL('..', import.meta.url).pathname;
const extraArgs = process.argv.slice(2);

function ensureChromium() {
  if (existsSync('/usr/bin/chromium')) return;
  if (process.getuid?.() !== 0) {
    console.error('Browser tests need Debian’s Chromium: sudo apt-get install -y chromium');
    process.exit(1);
  }
  console.log('[test] Installing Debian’s chromium for the browser tests…');
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  for (const args of [
    ['update', '-qq'],
    ['install', '-y', '-qq', 'chromium'],
  ]) {
    const r = spawnSync('apt-get', args, { stdio: 'inherit', env });
    if (r.status !== 0) process.exit(r.status ?? 1);
  }
}

ensureChromium();
console.log('[test] Building the client…');
const build = spawnSync(process.execPath, ['node_modules/vite/bin/vite.js', 'build', '--logLevel', 'warn'], {
  cwd: root,
  stdio: 'inherit',
});
if (build.status !== 0) process.exit(build.status ?? 1);

const report = join(mkdtempSync(join(tmpdir(), 'blockpost-report-')), 'vitest.json');
const run = spawnSync(
  process.execPath,
  ['node_modules/vitest/vitest.mjs', 'run', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`, ...extraArgs],
  { cwd: root, stdio: 'inherit', env: { ...process.env, NODE_ENV: 'test' } },
);

let passed = 0;
let failed = 0;
let skipped = 0;
if (existsSync(report)) {
  const json = JSON.parse(readFileSync(report, 'utf8')) as {
    numPassedTests: number;
    numFailedTests: number;
    numPendingTests: number;
    numTodoTests: number;
  };
  passed = json.numPassedTests;
  failed = json.numFailedTests;
  skipped = json.numPendingTests + json.numTodoTests;
}
const code = run.status ?? 1;
if (code !== 0 && failed === 0) failed = 1; // a suite that crashed before its tests counts as a failure
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`);
process.exit(code);
