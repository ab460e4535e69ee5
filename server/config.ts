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
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  TRUST_PROXY: z
    .enum(['true', 'false'])
    .default('false')
    .transform((v) => v === 'true'),
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
