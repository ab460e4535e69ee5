/** A PostgreSQL cluster in a temporary folder on a free loopback port, durability off: tests and benchmarks. */
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { clusterUrl, ensureDatabase, ensurePostgresBinaries, initCluster, startCluster, stopCluster } from './postgres';
import { freePort } from './ports';

export interface ThrowawayCluster {
  port: number;
  /** Creates (optionally from a template) and returns the URL of a database. */
  database(name: string, template?: string): Promise<string>;
  stop(): void;
}

export async function startThrowawayCluster(
  prefix = 'blockpost-pg-',
  opts: { statementStats?: boolean } = {},
): Promise<ThrowawayCluster> {
  const pgBin = ensurePostgresBinaries();
  const root = mkdtempSync(join(tmpdir(), prefix));
  chmodSync(root, 0o755); // the cluster runs as the postgres user, which must reach its folders
  const port = await freePort();
  const dataDir = join(root, 'data');
  initCluster(pgBin, { dataDir, socketDir: join(root, 'run'), logFile: join(root, 'postgres.log'), port });
  startCluster(pgBin, {
    dataDir,
    socketDir: join(root, 'run'),
    logFile: join(root, 'postgres.log'),
    port,
    fast: true,
    statementStats: opts.statementStats,
  });
  return {
    port,
    async database(name, template) {
      await ensureDatabase(port, name, template);
      return clusterUrl(port, name);
    },
    stop() {
      stopCluster(pgBin, dataDir);
      rmSync(root, { recursive: true, force: true });
    },
  };
}
