/**
 * Servers and load generators for the benchmarks, each in its own Node process, so no load generator
 * shares an event loop with the server it measures. TypeScript entry points run through tsx's loader.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

export const repoRoot = fileURLToPath(new URL('../..', import.meta.url));

export interface NodeProcess {
  name: string;
  pid: number;
  url: string;
  /** Resident set size now and at its peak, in MiB (Linux /proc). */
  memory(): { rssMiB: number; peakMiB: number } | null;
  /** SIGTERM and wait for the exit (a CPU profile, when asked for, is written then). */
  stop(): Promise<void>;
}

/** Starts `script` (a path from the repository root) with `env`, and waits until `readyPath` answers 2xx. */
export async function startNodeServer(opts: {
  name: string;
  script: string;
  env: Record<string, string>;
  port: number;
  readyPath: string;
  nodeArgs?: string[];
  /** the tree the script is taken from; this repository's unless given */
  root?: string;
}): Promise<NodeProcess> {
  const child = spawn(process.execPath, [...(opts.nodeArgs ?? []), '--import', 'tsx', opts.script], {
    cwd: opts.root ?? repoRoot,
    env: { ...process.env, ...opts.env, PORT: String(opts.port) },
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
  const url = `http://127.0.0.1:${opts.port}`;
  const deadline = Date.now() + 60_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`${opts.name} exited with code ${child.exitCode} before it was ready`);
    const ok = await fetch(url + opts.readyPath).then(
      (r) => r.ok,
      () => false,
    );
    if (ok) break;
    if (Date.now() > deadline) {
      child.kill('SIGKILL');
      throw new Error(`${opts.name} did not answer ${opts.readyPath} within 60 s`);
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  return {
    name: opts.name,
    pid: child.pid!,
    url,
    memory: () => memoryOf(child),
    async stop() {
      if (child.exitCode !== null) return;
      child.kill('SIGTERM');
      const timer = setTimeout(() => child.kill('SIGKILL'), 15_000);
      await exited;
      clearTimeout(timer);
    },
  };
}

function memoryOf(child: ChildProcess) {
  try {
    const status = readFileSync(`/proc/${child.pid}/status`, 'utf8');
    const kib = (key: string) => Number(new RegExp(`^${key}:\\s+(\\d+) kB`, 'm').exec(status)?.[1] ?? NaN);
    return { rssMiB: Math.round(kib('VmRSS') / 102.4) / 10, peakMiB: Math.round(kib('VmHWM') / 102.4) / 10 };
  } catch {
    return null;
  }
}

/** Runs a TypeScript script in a fresh Node process with one JSON argument; resolves with the JSON it prints last. */
export function runNodeScript<T>(script: string, arg: unknown): Promise<T> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', script, JSON.stringify(arg)], {
      cwd: repoRoot,
      stdio: ['ignore', 'pipe', 'inherit'],
    });
    let out = '';
    child.stdout.setEncoding('utf8').on('data', (chunk: string) => (out += chunk));
    child.once('error', reject);
    child.once('exit', (code) => {
      if (code !== 0) return reject(new Error(`${script} exited with code ${code}`));
      try {
        resolve(JSON.parse(out.trim().split('\n').at(-1) ?? '') as T);
      } catch (error) {
        reject(new Error(`${script} printed no JSON result: ${(error as Error).message}`));
      }
    });
  });
}

const TICKS_PER_SECOND = 100;

function statFields(pid: number): string[] | null {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
    // The command name may hold spaces: the fields start after its closing bracket.
    return stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  } catch {
    return null;
  }
}

/** CPU seconds (user + system, every thread) a process has used so far; with `reaped`, its waited-for children's too. */
export function cpuSeconds(pid: number, reaped = false): number {
  const f = statFields(pid);
  if (!f) return 0;
  // Fields 14–17 of /proc/<pid>/stat (utime, stime, cutime, cstime) are the 12th–15th after the name.
  const ticks = Number(f[11]) + Number(f[12]) + (reaped ? Number(f[13]) + Number(f[14]) : 0);
  return ticks / TICKS_PER_SECOND;
}

/**
 * CPU seconds used so far by the PostgreSQL cluster listening on `port`: the postmaster, its live
 * backends and the backends that have already exited.
 */
export function clusterCpuSeconds(port: number): number {
  const pids = readdirSync('/proc')
    .filter((d) => /^\d+$/.test(d))
    .map(Number);
  const postmaster = pids.find((pid) => {
    try {
      const args = readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0');
      return args[0]?.endsWith('postgres') && args.includes('-p') && args[args.indexOf('-p') + 1] === String(port);
    } catch {
      return false;
    }
  });
  if (postmaster === undefined) return 0;
  let total = cpuSeconds(postmaster, true);
  for (const pid of pids) if (statFields(pid)?.[1] === String(postmaster)) total += cpuSeconds(pid);
  return total;
}
