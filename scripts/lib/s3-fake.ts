/**
 * s3rver, the local fake object store, as a child process on loopback: the S3 photo driver runs
 * against it in development and tests with no account and no network. Objects live in `directory`.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { createRequire } from 'node:module';

export interface S3FakeHandle {
  endpoint: string;
  port: number;
  bucket: string;
  /** Environment that points the app's S3 driver at this fake. */
  env: Record<string, string>;
  stop(): Promise<void>;
}

/** The fake's fixed keys (it accepts only these; they unlock nothing real). */
export const S3_FAKE_KEYS = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' } as const;

const s3rverPath = () => createRequire(import.meta.url).resolve('s3rver');

export async function startS3Fake(opts: { port: number; directory: string; buckets: readonly string[] }): Promise<S3FakeHandle> {
  const options = {
    address: '127.0.0.1',
    port: opts.port,
    directory: opts.directory,
    silent: true,
    vhostBuckets: false,
    configureBuckets: opts.buckets.map((name) => ({ name })),
  };
  const program = `const S3rver = require(${JSON.stringify(s3rverPath())});
new S3rver(${JSON.stringify(options)}).run().then(() => console.log('ready'), (e) => { console.error(e.message); process.exit(1); });
process.on('SIGTERM', () => process.exit(0));`;
  const child: ChildProcess = spawn(process.execPath, ['-e', program], { stdio: ['ignore', 'pipe', 'pipe'] });
  let stderr = '';
  child.stderr?.on('data', (chunk) => (stderr += String(chunk)));
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`the fake object store did not start: ${stderr}`)), 20_000);
    child.stdout?.on('data', (chunk) => {
      if (String(chunk).includes('ready')) {
        clearTimeout(timer);
        resolve();
      }
    });
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`the fake object store exited (${code}): ${stderr}`));
    });
  });
  const endpoint = `http://127.0.0.1:${opts.port}`;
  const bucket = opts.buckets[0] ?? 'blockpost-photos';
  return {
    endpoint,
    port: opts.port,
    bucket,
    env: {
      PHOTO_STORE: 's3',
      S3_ENDPOINT: endpoint,
      S3_REGION: 'us-east-1',
      S3_BUCKET: bucket,
      S3_ACCESS_KEY_ID: S3_FAKE_KEYS.accessKeyId,
      S3_SECRET_ACCESS_KEY: S3_FAKE_KEYS.secretAccessKey,
      S3_FORCE_PATH_STYLE: 'true',
    },
    stop: () =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null) return resolve();
        child.once('exit', () => resolve());
        child.kill('SIGTERM');
        setTimeout(() => child.kill('SIGKILL'), 3000).unref();
      }),
  };
}
