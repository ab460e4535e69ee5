/**
 * The load side of the photo-burst benchmark, in its own process (the app runs in another): health
 * requests at a steady pace, first alone for `quietSeconds`, then beside a burst of photo uploads
 * (`uploads` requests of `photosEach` large JPEGs at once). An upload answered 503 is sent again
 * after its Retry-After, as the app's client does. Prints one JSON line.
 */
import { readFileSync } from 'node:fs';
import { performance } from 'node:perf_hooks';

export interface PhotoBurstLoad {
  url: string;
  /** one session cookie per uploader */
  cookies: string[];
  blockIds: number[];
  photoFile: string;
  photosEach: number;
  quietSeconds: number;
  /** health requests per second (one at a time, on a timer) */
  healthRate: number;
}

export interface PhotoBurstResult {
  quiet: number[];
  during: number[];
  burstSeconds: number;
  stored: number;
  busyAnswers: number;
  otherErrors: number;
  firstBusyAfterMs: number | null;
}

async function probeHealth(url: string, until: () => boolean, rate: number, into: number[]) {
  while (!until()) {
    const started = performance.now();
    const res = await fetch(`${url}/api/health`);
    await res.arrayBuffer();
    into.push(performance.now() - started);
    const wait = 1000 / rate - (performance.now() - started);
    if (wait > 0) await new Promise((r) => setTimeout(r, wait));
  }
}

async function upload(opts: PhotoBurstLoad, photo: Blob, i: number, result: PhotoBurstResult, startedAt: number) {
  for (;;) {
    const form = new FormData();
    for (let k = 0; k < opts.photosEach; k++) form.append('photos', photo, `burst-${i}-${k}.jpg`);
    const res = await fetch(`${opts.url}/api/blocks/${opts.blockIds[i]}/photos`, {
      method: 'POST',
      headers: { cookie: opts.cookies[i]!, 'x-requested-with': 'blockpost' },
      body: form,
    }).catch(() => null);
    await res?.arrayBuffer().catch(() => undefined);
    if (!res) {
      result.otherErrors += 1;
      return;
    }
    if (res.status === 201) {
      result.stored += opts.photosEach;
      return;
    }
    if (res.status !== 503) {
      result.otherErrors += 1;
      return;
    }
    result.busyAnswers += 1;
    result.firstBusyAfterMs ??= Math.round(performance.now() - startedAt);
    await new Promise((r) => setTimeout(r, Number(res.headers.get('retry-after') ?? 1) * 1000));
  }
}

export async function runPhotoBurstLoad(opts: PhotoBurstLoad): Promise<PhotoBurstResult> {
  const photo = new Blob([readFileSync(opts.photoFile)], { type: 'image/jpeg' });
  const result: PhotoBurstResult = {
    quiet: [],
    during: [],
    burstSeconds: 0,
    stored: 0,
    busyAnswers: 0,
    otherErrors: 0,
    firstBusyAfterMs: null,
  };
  const quietEnd = performance.now() + opts.quietSeconds * 1000;
  await probeHealth(opts.url, () => performance.now() >= quietEnd, opts.healthRate, result.quiet);

  let done = false;
  const started = performance.now();
  const probing = probeHealth(opts.url, () => done, opts.healthRate, result.during);
  await Promise.all(opts.blockIds.map((_, i) => upload(opts, photo, i, result, started)));
  result.burstSeconds = (performance.now() - started) / 1000;
  done = true;
  await probing;
  return result;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const result = await runPhotoBurstLoad(JSON.parse(process.argv[2] ?? '{}') as PhotoBurstLoad);
  process.stdout.write(`${JSON.stringify(result)}\n`);
  process.exit(0);
}
