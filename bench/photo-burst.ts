/**
 * A burst of large photos beside everyone else: 12 uploads of 4 photos of 10000 × 10000 px arrive at
 * once while another client asks for /api/health 20 times a second. The app runs in its own process
 * (as production starts it); the burst and the health requests come from another. Reported: health
 * latency with no burst, and while the burst runs, beside each other; how long the burst took to be
 * stored; and how many uploads were asked to come back later (503 + Retry-After, then sent again).
 * Run alone with `npx tsx bench/photo-burst.ts`.
 */
import { existsSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp from 'sharp';
import { startThrowawayCluster } from '../scripts/lib/throwaway-cluster';
import { startAppProcess } from './lib/app';
import { cpuSeconds, runNodeScript } from './lib/processes';
import { quantile, round } from './lib/stats';
import { newAccount, seedSwap, signIn } from './lib/seed';
import type { PhotoBurstLoad, PhotoBurstResult } from './photo-burst-load';

type Row = Record<string, string | number>;

export async function runPhotoBurstBench(opts: { uploads?: number; photosEach?: number; side?: number } = {}): Promise<Row[]> {
  const uploads = opts.uploads ?? 12;
  const photosEach = opts.photosEach ?? 4;
  const side = opts.side ?? 10_000;
  const cluster = await startThrowawayCluster('blockpost-photo-bench-');
  let app: Awaited<ReturnType<typeof startAppProcess>> | null = null;
  try {
    // A camera-sized JPEG (a textured colour, ~5 MB: under the 15 MB limit), made once and kept.
    const photoFile = join(tmpdir(), `blockpost-bench-photo-${side}.jpg`);
    if (!existsSync(photoFile)) {
      const texture = { type: 'gaussian' as const, mean: 128, sigma: 4 };
      const data = await sharp({ create: { width: side, height: side, channels: 3, background: '#B5462F', noise: texture } })
        .jpeg({ quality: 80 })
        .toBuffer();
      writeFileSync(photoFile, data);
    }

    const databaseUrl = await cluster.database('photoburst');
    app = await startAppProcess(databaseUrl);
    const coordinator = await newAccount(app.url, databaseUrl, 'photo-burst-coordinator@example.test', 'Photo Burst Coordinator');
    const guild = await coordinator.api<{ id: number }>('POST', '/guilds', { name: 'Photo Burst Bee' });
    const swap = await seedSwap(databaseUrl, coordinator, guild.id, { members: uploads, blocksEach: 2, tag: 'photos' });
    const cookies: string[] = [];
    for (let i = 0; i < uploads; i++) cookies.push((await signIn(app.url, 'photo-burst-coordinator@example.test')).cookie);

    const cpuBefore = cpuSeconds(app.pid);
    const load: PhotoBurstLoad = {
      url: app.url,
      cookies,
      blockIds: swap.measuredBlockIds.slice(0, uploads),
      photoFile,
      photosEach,
      quietSeconds: 5,
      healthRate: 20,
    };
    const result = await runNodeScript<PhotoBurstResult>('bench/photo-burst-load.ts', load);
    const cpu = cpuSeconds(app.pid) - cpuBefore;
    const ms = (xs: number[], q: number) => round(quantile(xs, q), 1);
    const p95Quiet = quantile(result.quiet, 0.95);
    const p95During = quantile(result.during, 0.95);
    return [
      {
        measure: 'health, no burst',
        samples: result.quiet.length,
        p50_ms: ms(result.quiet, 0.5),
        p95_ms: ms(result.quiet, 0.95),
        max_ms: ms(result.quiet, 1),
      },
      {
        measure: `health, during ${uploads} uploads × ${photosEach} photos of ${side} × ${side} px`,
        samples: result.during.length,
        p50_ms: ms(result.during, 0.5),
        p95_ms: ms(result.during, 0.95),
        max_ms: ms(result.during, 1),
      },
      { measure: 'health p95 during ÷ no burst', value: round(p95During / p95Quiet, 1) },
      {
        measure: 'burst: photos stored',
        value: `${result.stored} of ${uploads * photosEach} in ${round(result.burstSeconds, 1)} s`,
      },
      {
        measure: 'burst: 503 busy answers (each resent after Retry-After)',
        value: `${result.busyAnswers}${result.firstBusyAfterMs === null ? '' : ` (first after ${result.firstBusyAfterMs} ms)`}`,
      },
      { measure: 'burst: other errors', value: result.otherErrors },
      { measure: 'app CPU seconds during the run', value: round(cpu, 1) },
    ];
  } finally {
    await app?.stop();
    cluster.stop();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  console.table(await runPhotoBurstBench());
  process.exit(0);
}
