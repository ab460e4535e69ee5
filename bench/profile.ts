/**
 * Where the time went in a `node --cpu-prof` profile: self time by package (or by folder of this
 * repository), self time by function, inclusive time of this repository's own functions (the
 * function and everything it called), largest first, and the socket writes (`writev`) by the package
 * that made them. A sampled `writev` is wall time on the thread, not only its CPU: on loopback the
 * kernel runs the receiving side in the sender's call, and a process woken by the write (PostgreSQL's
 * backend) can take the core from the sender while it is still in the call.
 * `npx tsx bench/profile.ts file.cpuprofile [rows]`.
 */
import { readFileSync } from 'node:fs';

interface ProfileNode {
  id: number;
  callFrame: { functionName: string; url: string; lineNumber: number };
  children?: number[];
}
interface Profile {
  nodes: ProfileNode[];
  samples: number[];
  timeDeltas: number[];
}
type Rows = { name: string; ms: number; share: string }[];

const shortUrl = (url: string) =>
  url
    .replace(/^file:\/\//, '')
    .replace(/^.*node_modules\//, '')
    .replace(/^.*\/(server|shared|bench)\//, '$1/');

/** The npm package a script belongs to (`@scope/name` or `name`), if any. */
const packageOf = (url: string) => /node_modules\/((?:@[^/]+\/)?[^/]+)/.exec(url)?.[1];

function placeOf(url: string, fn: string) {
  if (!url) return fn.startsWith('(') ? fn : '(native)';
  const pkg = packageOf(url);
  if (pkg) return pkg;
  if (url.startsWith('node:')) return url.split('/')[0]!;
  const own = /\/(server|shared|bench)\/([^/]+)/.exec(url);
  return own ? `${own[1]}/${own[2]}` : url;
}

/** Self time per place and per function, inclusive time per own function; idle and GC are kept apart. */
export function summarise(profile: Profile, rows = 25) {
  const parent = new Map<number, number>();
  const byId = new Map(profile.nodes.map((n) => [n.id, n]));
  for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id);
  const self = { place: new Map<string, number>(), fn: new Map<string, number>(), own: new Map<string, number>() };
  const add = (m: Map<string, number>, k: string, us: number) => m.set(k, (m.get(k) ?? 0) + us);
  const writes = new Map<string, number>();
  let idle = 0;
  let busy = 0;
  profile.samples.forEach((id, i) => {
    const us = profile.timeDeltas[i] ?? 0;
    const node = byId.get(id)!;
    const { functionName, url, lineNumber } = node.callFrame;
    if (functionName === '(idle)' || functionName === '(program)') {
      idle += functionName === '(idle)' ? us : 0;
      if (functionName === '(idle)') return;
    }
    busy += us;
    add(self.place, placeOf(url, functionName), us);
    add(self.fn, `${functionName || '(anonymous)'} ${shortUrl(url)}:${lineNumber + 1}`, us);
    if (functionName === 'writev') add(writes, writerOf(id, byId, parent), us);
    const seen = new Set<string>();
    for (let at: number | undefined = id; at !== undefined; at = parent.get(at)) {
      const f = byId.get(at)!.callFrame;
      if (!/\/(?:server|shared)\//.test(f.url) || f.url.includes('node_modules')) continue;
      const key = `${f.functionName || '(anonymous)'} ${shortUrl(f.url)}:${f.lineNumber + 1}`;
      if (!seen.has(key)) add(self.own, key, us);
      seen.add(key);
    }
  });
  const top = (m: Map<string, number>): Rows =>
    [...m.entries()]
      .sort((a, b) => b[1] - a[1])
      .slice(0, rows)
      .map(([name, us]) => ({ name, ms: Math.round(us / 1000), share: `${((us / busy) * 100).toFixed(1)} %` }));
  return {
    busyMs: Math.round(busy / 1000),
    idleMs: Math.round(idle / 1000),
    byPlace: top(self.place),
    byFunction: top(self.fn),
    ownInclusive: top(self.own),
    writes: top(writes),
  };
}

/** The nearest caller of a write that is a package (the socket libraries aside) or Node's HTTP server. */
function writerOf(id: number, byId: Map<number, ProfileNode>, parent: Map<number, number>): string {
  for (let at: number | undefined = id; at !== undefined; at = parent.get(at)) {
    const { url } = byId.get(at)!.callFrame;
    const pkg = packageOf(url);
    if (pkg && pkg !== 'ws') return pkg;
    if (/^node:_http_/.test(url)) return 'node:http';
  }
  return '(elsewhere)';
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const file = process.argv[2];
  if (!file) throw new Error('Usage: npx tsx bench/profile.ts <file.cpuprofile> [rows]');
  const s = summarise(JSON.parse(readFileSync(file, 'utf8')) as Profile, Number(process.argv[3] ?? 25));
  console.log(`busy ${s.busyMs} ms, idle ${s.idleMs} ms (shares are of busy time)`);
  console.log('Self time by package or folder:');
  console.table(s.byPlace);
  console.log('Self time by function:');
  console.table(s.byFunction);
  console.log("This repository's functions, inclusive of what they called:");
  console.table(s.ownInclusive);
  console.log('Socket writes (writev) by the package that made them:');
  console.table(s.writes);
}
