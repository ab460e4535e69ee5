import { z } from 'zod';

const configSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  DATABASE_URL: z.string().url({ message: 'DATABASE_URL must be a postgres:// URL' }),
  SESSION_SECRET: z.string().min(16, 'SESSION_SECRET must be at least 16 characters'),
  SMTP_URL: z.string().default('smtp://127.0.0.1:1025'),
  MAIL_FROM: z.string().default('Blockpost <no-reply@blockpost.local>'),
  PUBLIC_URL: z.string().url().default('http://127.0.0.1:3000'),
  UPLOAD_DIR: z.string().default('uploads'),
  /** Format of stored photos and thumbnails. */
  PHOTO_FORMAT: z.enum(['jpeg', 'webp']).default('jpeg'),
  /**
   * Where photo files live: `local` (UPLOAD_DIR/photos, the default) or `s3` (an S3-compatible bucket).
   * With `s3` and no S3_ENDPOINT, `npm start` runs a local fake object store under .data/.
   */
  PHOTO_STORE: z.enum(['local', 's3']).default('local'),
  /** The object store's URL (self-hosted or a fake); leave unset for AWS itself. */
  S3_ENDPOINT: z.string().url().max(2048).optional(),
  S3_REGION: z.string().max(64).default('us-east-1'),
  S3_BUCKET: z.string().max(63).default('blockpost-photos'),
  /** Keys of the object store; unset means the SDK's usual chain (environment, instance role). */
  S3_ACCESS_KEY_ID: z.string().max(256).optional(),
  S3_SECRET_ACCESS_KEY: z.string().max(256).optional(),
  /** Bucket in the path (`host/bucket/key`), as most self-hosted stores need. */
  S3_FORCE_PATH_STYLE: z
    .enum(['true', 'false'])
    .default('false')
    .transform((v) => v === 'true'),
  /** Key prefix inside the bucket, so several installs can share one bucket without sharing keys. */
  S3_PREFIX: z
    .string()
    .max(200)
    .regex(/^(?:[\w.-]+\/)*$/, 'S3_PREFIX is folder names ending in “/”, or empty')
    .default(''),
  /** Photos being re-encoded or waiting for it, across uploads, before new uploads get 503; 0 picks a default. */
  PHOTO_QUEUE_LIMIT: z.coerce.number().int().min(0).max(1000).default(0),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  TRUST_PROXY: z
    .enum(['true', 'false'])
    .default('false')
    .transform((v) => v === 'true'),
  /**
   * Payments through the hosted service's SDK. With no secret key, payments are switched off. `npm start`
   * and the tests point the SDK at the local fake (host, port, protocol); real keys with no host use
   * the real service.
   */
  STRIPE_SECRET_KEY: z.string().max(255).optional(),
  STRIPE_WEBHOOK_SECRET: z.string().max(255).optional(),
  STRIPE_API_HOST: z.string().max(255).optional(),
  STRIPE_API_PORT: z.coerce.number().int().min(1).max(65535).optional(),
  STRIPE_API_PROTOCOL: z.enum(['http', 'https']).optional(),
  /** Folder of the built client (defaults to dist/); lets parallel test runs each use their own build. */
  CLIENT_DIR: z.string().max(4096).optional(),
  /** Serve the built client from dist/ (off in dev, where Vite serves it). */
  SERVE_CLIENT: z
    .enum(['true', 'false'])
    .default('true')
    .transform((v) => v === 'true'),
  /** Sign-in attempts per 15 minutes per address and IP. */
  LOGIN_RATE_LIMIT: z.coerce.number().int().positive().default(10),
  /** Failed sign-ins per 15 minutes per IP across every address (password spraying). */
  LOGIN_IP_RATE_LIMIT: z.coerce.number().int().positive().default(50),
  /** Registration attempts per hour per IP. */
  REGISTER_RATE_LIMIT: z.coerce.number().int().positive().default(20),
  /** Invitations per inviter, and per guild, in 24 hours. */
  INVITES_PER_INVITER_DAY: z.coerce.number().int().positive().default(20),
  INVITES_PER_GUILD_DAY: z.coerce.number().int().positive().default(50),
  /** Run the background job worker in this process. */
  JOBS: z
    .enum(['true', 'false'])
    .default('true')
    .transform((v) => v === 'true'),
  /** Cron (UTC) for the sweep that sends deadline reminders and re-queues stalled mail. */
  MAIL_SWEEP_CRON: z.string().default('*/10 * * * *'),
  /** Cron (UTC) for the coordinators' weekly digest. */
  MAIL_DIGEST_CRON: z.string().default('0 7 * * 1'),
  /**
   * Seconds to wait after a pledge changes or a block is received or measured, so one message covers
   * a burst of changes (six blocks measured in a row make one receipt notice).
   */
  MAIL_BATCH_DELAY_SECONDS: z.coerce.number().int().min(0).max(86_400).default(120),
  /** Delivery attempts after the first before a message is marked failed (backoff doubles each time). */
  MAIL_RETRY_LIMIT: z.coerce.number().int().min(0).max(20).default(5),
  /** First retry delay in seconds. */
  MAIL_RETRY_DELAY_SECONDS: z.coerce.number().int().min(1).max(3600).default(30),
  /** How often an idle job worker looks for new jobs. */
  JOBS_POLL_SECONDS: z.coerce.number().min(0.5).max(60).default(2),
});

export type Config = z.infer<typeof configSchema>;

/** Reads and validates the environment once; the only place that touches process.env. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = configSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n');
    throw new Error(`Blockpost configuration is invalid:\n${lines}`);
  }
  return parsed.data;
}
