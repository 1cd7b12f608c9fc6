import { z } from 'zod';
import { IMPORT_DEFAULT_MAX_BYTES } from '@torquetrail/contracts';

/**
 * The API's configuration, parsed from the environment once at start. The defaults point at
 * the loopback services that `npm start` runs; a missing or malformed key stops the start
 * with a message naming it.
 */
const EnvSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  DATABASE_URL: z.url(),
  S3_ENDPOINT: z.url(),
  S3_REGION: z.string().default('us-east-1'),
  S3_ACCESS_KEY_ID: z.string().min(1),
  S3_SECRET_ACCESS_KEY: z.string().min(1),
  S3_BUCKET: z.string().min(3),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535),
  MAIL_FROM: z.string().default('Torquetrail <no-reply@torquetrail.local>'),
  JWT_SECRET: z.string().min(32, { error: 'JWT_SECRET must be at least 32 characters' }),
  /** Session length in seconds. */
  SESSION_TTL_S: z.coerce
    .number()
    .int()
    .positive()
    .default(8 * 3600),
  /** Absolute session length: sign in again this many seconds after signing in, however active (OWASP ASVS 3.3.2). */
  SESSION_ABSOLUTE_S: z.coerce
    .number()
    .int()
    .positive()
    .default(12 * 3600),
  /** A session token older than this is replaced on the next request (sliding up to the absolute length). */
  SESSION_RENEW_AFTER_S: z.coerce.number().int().positive().default(300),
  /** Tests only: an idle sign-out period in seconds replacing every practice's setting (refused in production). */
  SESSION_IDLE_OVERRIDE_S: z.coerce.number().int().min(4).optional(),
  /**
   * The app's public address for links in e-mails (invitations, password resets), e.g.
   * https://ledger.example.org. Required in production: a link built from a request's Host
   * header could be pointed at another site by whoever asks for the mail.
   */
  APP_URL: z.url().optional(),
  /** Send the session cookie over HTTPS only; defaults to on in production, off on loopback development. */
  COOKIE_SECURE: z.enum(['true', 'false']).optional(),
  /** Sign-in attempts allowed per e-mail and address per minute. */
  SIGN_IN_LIMIT_PER_MINUTE: z.coerce.number().int().positive().default(10),
  /** Sign-in attempts allowed per address (whatever the e-mail) per minute. */
  SIGN_IN_ADDRESS_LIMIT_PER_MINUTE: z.coerce.number().int().positive().default(60),
  /** Reminder e-mails: first retry delay (seconds, doubled each retry) and how many retries. */
  REMINDER_RETRY_DELAY_S: z.coerce.number().int().min(1).default(60),
  REMINDER_RETRY_LIMIT: z.coerce.number().int().min(0).max(20).default(8),
  /** When the daily reminder scan runs (cron, UTC). */
  REMINDER_SCAN_CRON: z.string().default('0 6 * * *'),
  /**
   * Which proxies in front of the API to believe about the client's address and protocol
   * (X-Forwarded-For/-Proto): Express's "trust proxy" setting — off by default; e.g. `1` (one
   * load balancer), `loopback`, or a list of addresses/CIDRs. See docs/security.md.
   */
  TRUST_PROXY: z
    .string()
    .default('false')
    .transform((v): boolean | number | string =>
      v === 'true' ? true : v === 'false' || v === '' ? false : /^\d+$/.test(v) ? Number(v) : v,
    ),
  /** Origins besides the app's own allowed to send state-changing requests (comma-separated), e.g. a separate web host. */
  EXTRA_ORIGINS: z
    .string()
    .default('')
    .transform((v) =>
      v
        .split(',')
        .map((o) => o.trim())
        .filter(Boolean),
    ),
  /** Largest legacy import file accepted, bytes (413 above it, before it is read; docs/import.md). */
  IMPORT_MAX_BYTES: z.coerce.number().int().positive().default(IMPORT_DEFAULT_MAX_BYTES),
  /** Largest radiograph accepted, bytes (413 above it, before anything is stored). */
  RADIOGRAPH_MAX_BYTES: z.coerce
    .number()
    .int()
    .positive()
    .default(100 * 1024 * 1024),
  /** Largest scan file (STL, PLY, OBJ) accepted, bytes (413 above it, before anything is stored). */
  SCAN_FILE_MAX_BYTES: z.coerce
    .number()
    .int()
    .positive()
    .default(50 * 1024 * 1024),
  /** Radiograph bytes one user may upload per day (UTC), bytes (429 above it). */
  RADIOGRAPH_DAILY_QUOTA_BYTES: z.coerce
    .number()
    .int()
    .positive()
    .default(2 * 1024 * 1024 * 1024),
  /**
   * Uploads (radiographs, scan files) and radiograph preview jobs streaming at once in one API
   * process; the others wait for a slot (storage/stream-slots.ts). Each takes about 5–15 MB (scripts/bench-radiograph-upload.mjs).
   */
  RADIOGRAPH_STREAM_SLOTS: z.coerce.number().int().min(1).max(64).default(2),
  /**
   * Largest image (Rows × Columns) the preview job decodes; above it the radiograph is kept and
   * measured but its preview is unavailable ("image too large"). The decoder's memory does not grow
   * with the image, its time does.
   */
  RADIOGRAPH_PREVIEW_MAX_PIXELS: z.coerce
    .number()
    .int()
    .positive()
    .default(100 * 1000 * 1000),
  /** Preview job: first retry delay (seconds, doubled each retry) and how many retries before unavailable. */
  RADIOGRAPH_PREVIEW_RETRY_DELAY_S: z.coerce.number().int().min(1).default(5),
  RADIOGRAPH_PREVIEW_RETRY_LIMIT: z.coerce.number().int().min(0).max(20).default(4),
  /** pino log level; `info` logs start-up and refused requests, `debug` every request. */
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  /** The built web app to serve from the same origin; unset in API-only tests. */
  WEB_DIST: z.string().optional(),
});

export type Env = Omit<z.infer<typeof EnvSchema>, 'COOKIE_SECURE'> & { COOKIE_SECURE: boolean };

export class ConfigError extends Error {}

export function parseEnv(source: NodeJS.ProcessEnv = process.env): Env {
  const result = EnvSchema.safeParse(source);
  if (!result.success) {
    const problems = result.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n');
    throw new ConfigError(`The API's environment is incomplete:\n${problems}`);
  }
  const { COOKIE_SECURE, ...rest } = result.data;
  if (rest.NODE_ENV === 'production' && !rest.APP_URL)
    throw new ConfigError("The API's environment is incomplete:\n  APP_URL: required in production (links in e-mails)");
  if (rest.NODE_ENV === 'production' && rest.SESSION_IDLE_OVERRIDE_S !== undefined)
    throw new ConfigError(
      "The API's environment is wrong:\n  SESSION_IDLE_OVERRIDE_S: for tests only, not in production",
    );
  return {
    ...rest,
    COOKIE_SECURE: COOKIE_SECURE === undefined ? rest.NODE_ENV === 'production' : COOKIE_SECURE === 'true',
  };
}

/** Nest injection token for the parsed environment. */
export const ENV = Symbol('ENV');
