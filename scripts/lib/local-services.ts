/**
 * The local services `npm start` and `npm run dev` need: a PostgreSQL cluster under .data/ on a fixed
 * loopback port (unless DATABASE_URL is set), maildev on loopback (unless SMTP_URL is set), and the fake
 * object store on loopback when photos go to a bucket (PHOTO_STORE=s3) and no S3_ENDPOINT names a real one.
 */
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { join, resolve } from 'node:path';
import { clusterUrl, ensureDatabase, ensurePostgresBinaries, initCluster, startCluster, stopCluster } from './postgres';
import { startMaildev, type MaildevHandle } from './maildev';
import { startPaymentsFake, type PaymentsFake } from './payments-fake';
import { startS3Fake, type S3FakeHandle } from './s3-fake';

export const repoRoot = resolve(import.meta.dirname, '..', '..');
export const dataDir = join(repoRoot, '.data');
const PG_PORT = Number(process.env.BLOCKPOST_PG_PORT ?? 54329);

export interface LocalServices {
  env: Record<string, string>;
  maildevUrl: string | null;
  stop(): Promise<void>;
}

/** A secret kept under .data/ so restarts keep it (sessions stay signed in, webhooks keep verifying). */
function localSecret(name: string, make: () => string) {
  const file = join(dataDir, name);
  if (!existsSync(file)) writeFileSync(file, make(), { mode: 0o600 });
  return readFileSync(file, 'utf8').trim();
}

const sessionSecret = () => localSecret('session-secret', () => randomBytes(32).toString('hex'));

/**
 * The database for local use: DATABASE_URL when set, else the cluster under .data/ (created and started
 * as needed). `stop` stops the cluster only if this call started it.
 */
export async function startLocalDatabase(log: (msg: string) => void = console.log): Promise<{ url: string; stop(): void }> {
  mkdirSync(dataDir, { recursive: true });
  if (process.env.DATABASE_URL) {
    log('Using the PostgreSQL server in DATABASE_URL.');
    return { url: process.env.DATABASE_URL, stop: () => {} };
  }
  const pgBin = ensurePostgresBinaries(log);
  const cluster = {
    dataDir: join(dataDir, 'pg'),
    socketDir: join(dataDir, 'pg-run'),
    logFile: join(dataDir, 'postgres.log'),
    port: PG_PORT,
  };
  if (initCluster(pgBin, cluster)) log(`Created a PostgreSQL cluster in ${cluster.dataDir}.`);
  const started = startCluster(pgBin, cluster);
  await ensureDatabase(PG_PORT, 'blockpost');
  log(`PostgreSQL is running on 127.0.0.1:${PG_PORT} (trust authentication: loopback development only).`);
  return { url: clusterUrl(PG_PORT, 'blockpost'), stop: () => (started ? stopCluster(pgBin, cluster.dataDir) : undefined) };
}

export async function startLocalServices(log: (msg: string) => void = console.log): Promise<LocalServices> {
  const database = await startLocalDatabase(log);
  const env: Record<string, string> = { DATABASE_URL: database.url };
  let maildev: MaildevHandle | null = null;

  if (process.env.SMTP_URL) {
    env.SMTP_URL = process.env.SMTP_URL;
  } else {
    const smtpPort = Number(process.env.MAILDEV_SMTP_PORT ?? 1025);
    const webPort = Number(process.env.MAILDEV_WEB_PORT ?? 1080);
    try {
      maildev = await startMaildev({ smtpPort, webPort, mailDir: join(dataDir, 'mail') });
    } catch (error) {
      database.stop();
      throw new Error(`maildev could not start on ports ${smtpPort}/${webPort}: ${(error as Error).message}`, { cause: error });
    }
    env.SMTP_URL = `smtp://127.0.0.1:${smtpPort}`;
  }
  env.SESSION_SECRET = process.env.SESSION_SECRET ?? sessionSecret();

  // Photos in a bucket with no bucket named: the fake object store on loopback, objects under .data/s3.
  let s3: S3FakeHandle | null = null;
  if (process.env.PHOTO_STORE === 's3' && !process.env.S3_ENDPOINT) {
    const port = Number(process.env.S3_FAKE_PORT ?? 4569);
    try {
      s3 = await startS3Fake({ port, directory: join(dataDir, 's3'), buckets: [process.env.S3_BUCKET ?? 'blockpost-photos'] });
    } catch (error) {
      await maildev?.stop();
      database.stop();
      throw new Error(`the fake object store could not start on port ${port}: ${(error as Error).message}`, { cause: error });
    }
    Object.assign(env, s3.env);
    log(`Photos go to the fake object store at ${s3.endpoint} (bucket "${s3.bucket}", files under .data/s3).`);
  }

  // Payments: with no key of the real service, the local fake stands in for it (it moves no money).
  let payments: PaymentsFake | null = null;
  if (!process.env.STRIPE_SECRET_KEY) {
    const port = Number(process.env.PAYMENTS_FAKE_PORT ?? 12111);
    const appUrl = (process.env.PUBLIC_URL ?? `http://127.0.0.1:${process.env.PORT ?? 3000}`).replace(/\/$/, '');
    const secret = localSecret('payments-webhook-secret', () => `whsec_${randomBytes(24).toString('hex')}`);
    try {
      payments = await startPaymentsFake({ port, endpoints: [{ url: `${appUrl}/api/payments/webhook`, secret }], log });
    } catch (error) {
      await s3?.stop();
      await maildev?.stop();
      database.stop();
      throw new Error(`the local payments fake could not start on port ${port}: ${(error as Error).message}`, { cause: error });
    }
    Object.assign(env, {
      STRIPE_SECRET_KEY: 'sk_test_blockpost_local',
      STRIPE_WEBHOOK_SECRET: secret,
      STRIPE_API_HOST: '127.0.0.1',
      STRIPE_API_PORT: String(port),
      STRIPE_API_PROTOCOL: 'http',
    });
    log(`Payments go to the local fake at ${payments.url} (a test checkout page; no money moves).`);
  }

  return {
    env,
    maildevUrl: maildev ? `http://127.0.0.1:${maildev.webPort}` : null,
    async stop() {
      await payments?.stop();
      await s3?.stop();
      await maildev?.stop();
      database.stop();
    },
  };
}
