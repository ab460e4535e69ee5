/**
 * The load generator, run in its own process by the API benchmark: one autocannon run against one
 * server, its options given as a JSON argument, its summary printed as one JSON line.
 */
import { randomUUID } from 'node:crypto';
import autocannon from 'autocannon';

export interface LoadOptions {
  url: string;
  connections: number;
  /** seconds */
  duration: number;
  /** a fixed overall rate in requests per second; otherwise as fast as the server answers */
  rate?: number;
  method?: 'GET' | 'POST';
  headers?: Record<string, string>;
  /** paths taken in turn, one per request */
  paths: string[];
  body?: string;
  /** give each request's JSON body a fresh `clientId`, as the app's own client does for a change */
  freshClientId?: boolean;
}

export interface LoadResult {
  rps: number;
  requests: number;
  p50: number;
  p97_5: number;
  p99: number;
  errors: number;
  non2xx: number;
}

export async function runLoad(opts: LoadOptions): Promise<LoadResult> {
  let next = 0;
  const result = await autocannon({
    url: opts.url,
    connections: opts.connections,
    duration: opts.duration,
    overallRate: opts.rate,
    headers: { 'content-type': 'application/json', ...opts.headers },
    requests: [
      {
        method: opts.method ?? 'GET',
        body: opts.body,
        setupRequest: (req) => ({
          ...req,
          path: opts.paths[next++ % opts.paths.length],
          ...(opts.freshClientId && opts.body
            ? { body: JSON.stringify({ ...(JSON.parse(opts.body) as object), clientId: randomUUID() }) }
            : {}),
        }),
      },
    ],
  });
  return {
    rps: result.requests.average,
    requests: result.requests.total,
    p50: result.latency.p50,
    p97_5: result.latency.p97_5,
    p99: result.latency.p99,
    errors: result.errors + result.timeouts,
    non2xx: result.non2xx,
  };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const result = await runLoad(JSON.parse(process.argv[2] ?? '{}') as LoadOptions);
  process.stdout.write(`${JSON.stringify(result)}\n`);
  process.exit(0);
}
