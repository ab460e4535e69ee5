/**
 * A private PostgreSQL cluster run from Debian's server binaries: used by `npm start` (a persistent
 * cluster under .data/) and by the tests (a throwaway cluster in a temporary folder).
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, chownSync, chmodSync, writeFileSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import pg from 'pg';

const isRoot = () => process.getuid?.() === 0;

/** Finds the newest /usr/lib/postgresql/<major>/bin; installs Debian's package when root and missing. */
export function ensurePostgresBinaries(log: (msg: string) => void = console.log): string {
  const found = findPgBin();
  if (found) return found;
  if (!isRoot()) {
    throw new Error(
      'PostgreSQL server binaries are missing. Install them with:\n' +
        '  sudo apt-get update && sudo apt-get install -y postgresql\n' +
        'or set DATABASE_URL to an existing server.',
    );
  }
  log('PostgreSQL is not installed: installing Debian’s postgresql package (this takes a minute)…');
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  run('apt-get', ['update', '-qq'], env);
  run('apt-get', ['install', '-y', '-qq', 'postgresql'], env);
  const after = findPgBin();
  if (!after) throw new Error('apt-get finished but no PostgreSQL server binaries were found in /usr/lib/postgresql.');
  return after;
}

function run(cmd: string, args: string[], env: NodeJS.ProcessEnv) {
  const result = spawnSync(cmd, args, { stdio: 'inherit', env });
  if (result.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed with exit code ${result.status}`);
}

function findPgBin(): string | null {
  const root = '/usr/lib/postgresql';
  if (!existsSync(root)) return null;
  const majors = readdirSync(root)
    .filter((d) => existsSync(join(root, d, 'bin', 'initdb')) && existsSync(join(root, d, 'bin', 'postgres')))
    .sort((a, b) => Number(b) - Number(a));
  return majors[0] ? join(root, majors[0], 'bin') : null;
}

export interface ClusterOptions {
  dataDir: string;
  socketDir: string;
  logFile: string;
  port: number;
  /** Durability off: only for throwaway test clusters. */
  fast?: boolean;
  /** Load pg_stat_statements (with planning time), to see where a benchmark's database time goes. */
  statementStats?: boolean;
}

/** initdb refuses root, so as root every cluster command runs as the `postgres` user. */
function asClusterOwner(bin: string, args: string[]) {
  const cmd = isRoot() ? 'runuser' : bin;
  const fullArgs = isRoot() ? ['-u', 'postgres', '--', bin, ...args] : args;
  return execFileSync(cmd, fullArgs, { stdio: ['ignore', 'pipe', 'pipe'], encoding: 'utf8' });
}

function ownedDir(path: string, mode: number) {
  mkdirSync(path, { recursive: true });
  if (isRoot()) {
    const uid = Number(execFileSync('id', ['-u', 'postgres'], { encoding: 'utf8' }).trim());
    const gid = Number(execFileSync('id', ['-g', 'postgres'], { encoding: 'utf8' }).trim());
    chownSync(path, uid, gid);
  }
  chmodSync(path, mode);
}

export function initCluster(pgBin: string, opts: ClusterOptions): boolean {
  if (existsSync(join(opts.dataDir, 'PG_VERSION'))) return false;
  ownedDir(opts.dataDir, 0o700);
  ownedDir(opts.socketDir, 0o775);
  if (!existsSync(opts.logFile)) writeFileSync(opts.logFile, '');
  if (isRoot()) execFileSync('chown', ['postgres:postgres', opts.logFile]);
  asClusterOwner(join(pgBin, 'initdb'), ['-D', opts.dataDir, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
  return true;
}

export function isClusterRunning(pgBin: string, dataDir: string): boolean {
  try {
    asClusterOwner(join(pgBin, 'pg_ctl'), ['-D', dataDir, 'status']);
    return true;
  } catch {
    return false;
  }
}

/** Starts the cluster; false when it was already running (and so is not ours to stop). */
export function startCluster(pgBin: string, opts: ClusterOptions): boolean {
  if (isClusterRunning(pgBin, opts.dataDir)) return false;
  ownedDir(opts.socketDir, 0o775);
  const settings = [
    '-c listen_addresses=127.0.0.1',
    `-p ${opts.port}`,
    `-k ${opts.socketDir}`,
    ...(opts.fast ? ['-c fsync=off', '-c synchronous_commit=off', '-c full_page_writes=off'] : []),
    '-c max_connections=200',
    ...(opts.statementStats ? ['-c shared_preload_libraries=pg_stat_statements', '-c pg_stat_statements.track_planning=on'] : []),
  ].join(' ');
  try {
    asClusterOwner(join(pgBin, 'pg_ctl'), ['-D', opts.dataDir, '-l', opts.logFile, '-w', '-t', '60', '-o', settings, 'start']);
  } catch (error) {
    const tail = existsSync(opts.logFile) ? readFileSync(opts.logFile, 'utf8').split('\n').slice(-15).join('\n') : '';
    throw new Error(`PostgreSQL did not start on port ${opts.port}.\n${tail}`, { cause: error });
  }
  return true;
}

export function stopCluster(pgBin: string, dataDir: string) {
  if (!isClusterRunning(pgBin, dataDir)) return;
  asClusterOwner(join(pgBin, 'pg_ctl'), ['-D', dataDir, '-m', 'fast', '-w', 'stop']);
}

export function clusterUrl(port: number, database: string) {
  return `postgres://postgres@127.0.0.1:${port}/${database}`;
}

/** Runs `work` on a connection of its own to `connectionString`, closed afterwards whatever happens. */
export async function withClient<T>(connectionString: string, work: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString });
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}

/** Creates the database if it is not there yet. */
export async function ensureDatabase(port: number, database: string, template?: string) {
  await withClient(clusterUrl(port, 'postgres'), async (client) => {
    const { rowCount } = await client.query('SELECT 1 FROM pg_database WHERE datname = $1', [database]);
    if (!rowCount) {
      const from = template ? ` TEMPLATE ${pg.escapeIdentifier(template)}` : '';
      await client.query(`CREATE DATABASE ${pg.escapeIdentifier(database)}${from}`);
    }
  });
}
