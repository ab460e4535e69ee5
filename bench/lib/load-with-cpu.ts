/** A load run (bench/load.ts in its own process) with the CPU it cost the server and PostgreSQL. */
import type { LoadOptions, LoadResult } from '../load';
import { clusterCpuSeconds, cpuSeconds, runNodeScript } from './processes';

export type LoadWithCpu = LoadResult & { serverCpuMs: number; dbCpuMs: number };

/**
 * Runs the load against the server with process id `serverPid` and reads the CPU used by that process
 * and by every PostgreSQL process of the cluster on `clusterPort` during the run, per answered
 * request: unlike throughput, it hardly moves when other work on the machine takes turns on the cores.
 */
export async function loadWithCpu(serverPid: number, clusterPort: number, options: LoadOptions): Promise<LoadWithCpu> {
  const before = { server: cpuSeconds(serverPid), db: clusterCpuSeconds(clusterPort) };
  const result = await runNodeScript<LoadResult>('bench/load.ts', options);
  const perRequest = (sec: number) => (sec * 1000) / Math.max(1, result.requests);
  return {
    ...result,
    serverCpuMs: perRequest(cpuSeconds(serverPid) - before.server),
    dbCpuMs: perRequest(clusterCpuSeconds(clusterPort) - before.db),
  };
}
