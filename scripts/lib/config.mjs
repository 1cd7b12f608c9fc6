// Where the local services listen and keep their data. Everything binds to loopback only.
// Ports can be moved with environment variables when a default one is taken.
import { createHash } from 'node:crypto';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
export const localDir = path.join(repoRoot, '.local');
export const runDir = path.join(localDir, 'run');

// PORT may be 0 (any free port), as the test tiers set it for the in-process app.
const port = (name, fallback, lowest = 1) => {
  const value = process.env[name];
  if (value === undefined || value === '') return fallback;
  const n = Number(value);
  if (!Number.isInteger(n) || n < lowest || n > 65535) throw new Error(`${name} must be a port number, got "${value}"`);
  return n;
};

export const host = '127.0.0.1';

export const pg = {
  port: port('TT_PG_PORT', 54329),
  // The owner: creates the cluster, runs migrations, seeds and backs up. The API never gets it.
  user: 'torquetrail',
  // A local, loopback-only development cluster; the passwords only keep other local users out.
  password: process.env.TT_PG_PASSWORD ?? 'torquetrail-local',
  // The API's own role, made by migration 0014_app-role: no UPDATE or DELETE on the audit trail.
  appUser: 'torquetrail_app',
  appPassword: process.env.TT_PG_APP_PASSWORD ?? 'torquetrail-app-local',
  database: 'torquetrail',
  testDatabase: 'torquetrail_test',
};

export const s3 = {
  port: port('TT_S3_PORT', 9390),
  accessKeyId: 'S3RVER',
  secretAccessKey: 'S3RVER',
  bucket: 'torquetrail-files',
  testBucket: 'torquetrail-files-test',
  dataDir: path.join(localDir, 's3'),
};

export const mail = {
  smtpPort: port('TT_SMTP_PORT', 2525),
  httpPort: port('TT_MAIL_HTTP_PORT', 2580),
  dataDir: path.join(localDir, 'mail'),
};

export const app = { port: port('PORT', 3000, 0) };

function databaseUrl(database, user = pg.appUser, password = pg.appPassword) {
  return `postgres://${user}:${encodeURIComponent(password)}@${host}:${pg.port}/${database}`;
}

/**
 * The owner's connection, for what the API must not do itself: migrations, emptying the test
 * database, backup and restore. Scripts pass it as MIGRATION_DATABASE_URL, never to the API.
 */
export function ownerEnvironment(database) {
  return { MIGRATION_DATABASE_URL: databaseUrl(database, pg.user, pg.password) };
}

/**
 * Node options of the API process, wherever it is started (npm start, npm run dev, the benchmarks;
 * a deployment starts it the same way: docs/adr/0007-radiograph-upload-memory.md).
 * `--max-semi-space-size=8`: an 8 MB young generation (Node's default is up to 16). Small enough
 * that the socket and storage chunks a streamed upload or preview leaves behind are collected
 * long before V8's 64 MB external-memory trigger (5 parallel 50 MB uploads grew RSS by 31–40 MB),
 * large enough that a request's short-lived objects die young instead of being promoted: 9–32 %
 * less CPU per Site file request than the 1 MB young generation used before (ADR 0007, second
 * addendum).
 * `--heap-growing-percent=25` lets the old generation grow by a quarter over what survived its last
 * collection before the next one (V8 otherwise grows it by up to 4×): the 32-connection Site file
 * load peaks at 172–176 MB instead of ~290 MB (ADR 0007, first addendum).
 */
export const API_NODE_OPTIONS = ['--max-semi-space-size=8', '--heap-growing-percent=25'];

/** Environment for the API process, pointing at the loopback services. */
export function apiEnvironment({ database, bucket, jwtSecret, port: appPort }) {
  return {
    DATABASE_URL: databaseUrl(database),
    S3_ENDPOINT: `http://${host}:${s3.port}`,
    S3_REGION: 'us-east-1',
    S3_ACCESS_KEY_ID: s3.accessKeyId,
    S3_SECRET_ACCESS_KEY: s3.secretAccessKey,
    S3_BUCKET: bucket,
    SMTP_HOST: host,
    SMTP_PORT: String(mail.smtpPort),
    MAIL_FROM: 'Torquetrail <no-reply@torquetrail.local>',
    JWT_SECRET: jwtSecret,
    HOST: host,
    PORT: String(appPort),
    WEB_DIST: path.join(repoRoot, 'apps', 'web', 'dist'),
    // Local runs print warnings and errors only (JSON lines from pino); production defaults to info.
    LOG_LEVEL: process.env.LOG_LEVEL ?? 'warn',
    // glibc gives each thread that allocates (libuv's pool, libvips) an arena of its own, up to 8 per
    // core, and keeps what they freed: two arenas keep the API's RSS near what it uses (ADR 0007).
    MALLOC_ARENA_MAX: '2',
    // The SDK is pinned to the last line that supports Node 20 (see DEVELOPERS.md); its notice says so at every start.
    AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true',
  };
}

export const repoHash = createHash('sha256').update(repoRoot).digest('hex').slice(0, 10);
