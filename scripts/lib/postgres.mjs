// PostgreSQL from Debian's packages, as a private cluster of this checkout on 127.0.0.1.
// PostgreSQL refuses to run as root, so when the caller is root every server command runs as
// the `postgres` system user, which must own the data folder and be able to enter its parents.
import fs from 'node:fs';
import path from 'node:path';
import { capture, isRoot, portOpen, run } from './proc.mjs';
import { host, localDir, pg, repoHash } from './config.mjs';

export class ServiceError extends Error {}

/** Path of a PostgreSQL client or server program of the newest installed version (pg_dump, pg_restore …). */
export function pgProgram(name) {
  const bin = findBinDir();
  if (!bin)
    throw new ServiceError('PostgreSQL binaries are missing: run npm start once, or apt-get install postgresql');
  return path.join(bin, name);
}

function findBinDir() {
  const base = '/usr/lib/postgresql';
  if (!fs.existsSync(base)) return null;
  const versions = fs.readdirSync(base).filter((v) => fs.existsSync(path.join(base, v, 'bin', 'initdb')));
  versions.sort((a, b) => Number(b) - Number(a));
  return versions.length ? path.join(base, versions[0], 'bin') : null;
}

async function installServer() {
  if (!isRoot()) {
    throw new ServiceError(
      'PostgreSQL server binaries are missing (no /usr/lib/postgresql/*/bin/initdb). ' +
        'Install them with: sudo apt-get install -y postgresql',
    );
  }
  console.log('[postgres] server binaries missing: installing Debian package postgresql …');
  try {
    await run('apt-get', ['update', '-qq'], { env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
    await run('apt-get', ['install', '-y', '-qq', 'postgresql'], {
      env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
    });
  } catch (error) {
    throw new ServiceError(`apt-get could not install postgresql: ${error.message}`);
  }
}

/** Runs a server command as the right user (postgres when we are root). */
function asServerUser(bin, args) {
  return isRoot() ? capture('runuser', ['-u', 'postgres', '--', bin, ...args]) : capture(bin, args);
}

function canServerUserEnter(dir) {
  if (!isRoot()) return true;
  return capture('runuser', ['-u', 'postgres', '--', 'test', '-x', dir]).status === 0;
}

/**
 * The cluster lives in .local/pg of this checkout. When the postgres user cannot enter the
 * checkout (a 0700 parent, as mktemp -d makes), it moves to /var/tmp, and we say so.
 */
function clusterDir() {
  const preferred = path.join(localDir, 'pg');
  if (!isRoot()) return preferred;
  fs.mkdirSync(localDir, { recursive: true });
  if (canServerUserEnter(localDir)) return preferred;
  const fallback = path.join('/var/tmp', `torquetrail-pg-${repoHash}`);
  console.log(
    `[postgres] the postgres system user cannot enter ${localDir} (a parent folder is not enterable by others); ` +
      `keeping this checkout's cluster in ${fallback} instead`,
  );
  return fallback;
}

/** Starts the cluster; true when this call started it, false when it was already running. */
export async function startPostgres() {
  let bin = findBinDir();
  if (!bin) {
    await installServer();
    bin = findBinDir();
    if (!bin) throw new ServiceError('postgresql was installed but initdb is still missing');
  }
  const dir = clusterDir();
  const data = path.join(dir, 'data');
  const log = path.join(dir, 'server.log');
  fs.mkdirSync(dir, { recursive: true });
  if (isRoot()) capture('chown', ['postgres:postgres', dir]);

  if (!fs.existsSync(path.join(data, 'PG_VERSION'))) {
    console.log(`[postgres] creating cluster in ${data}`);
    const pwfile = path.join(dir, '.pw');
    fs.writeFileSync(pwfile, pg.password + '\n', { mode: 0o600 });
    if (isRoot()) capture('chown', ['postgres:postgres', pwfile]);
    const init = asServerUser(path.join(bin, 'initdb'), [
      '-D',
      data,
      '-U',
      pg.user,
      `--pwfile=${pwfile}`,
      '--auth=scram-sha-256',
      '-E',
      'UTF8',
      '--locale=C.UTF-8',
    ]);
    fs.rmSync(pwfile, { force: true });
    if (init.status !== 0) throw new ServiceError(`initdb failed:\n${init.stderr || init.stdout}`);
    fs.appendFileSync(
      path.join(data, 'postgresql.conf'),
      `\n# Torquetrail local cluster: loopback only, TCP only\nlisten_addresses = '${host}'\nport = ${pg.port}\nunix_socket_directories = ''\n`,
    );
  }

  const status = asServerUser(path.join(bin, 'pg_ctl'), ['status', '-D', data]);
  if (status.status === 0) {
    console.log(`[postgres] already running on ${host}:${pg.port}`);
    return false;
  }
  if (await portOpen(pg.port)) {
    throw new ServiceError(
      `port ${pg.port} on ${host} is taken by another program, so PostgreSQL cannot start there. ` +
        'Stop that program or choose another port with TT_PG_PORT=…',
    );
  }
  const start = asServerUser(path.join(bin, 'pg_ctl'), [
    'start',
    '-D',
    data,
    '-l',
    log,
    '-w',
    '-t',
    '60',
    '-o',
    `-p ${pg.port}`,
  ]);
  if (start.status !== 0) {
    let tail = '';
    try {
      tail = fs.readFileSync(log, 'utf8').split('\n').slice(-15).join('\n');
    } catch {
      /* no log yet */
    }
    throw new ServiceError(`PostgreSQL did not start (pg_ctl: ${start.stderr.trim() || start.stdout.trim()})\n${tail}`);
  }
  console.log(`[postgres] started on ${host}:${pg.port} (data ${data})`);
  return true;
}

export function stopPostgres() {
  const bin = findBinDir();
  if (!bin) return;
  const data = path.join(clusterDir(), 'data');
  if (!fs.existsSync(path.join(data, 'postmaster.pid'))) {
    console.log('[postgres] not running');
    return;
  }
  // pg_ctl stops the server by the pid in its postmaster.pid.
  const stop = asServerUser(path.join(bin, 'pg_ctl'), ['stop', '-D', data, '-m', 'fast', '-w']);
  console.log(stop.status === 0 ? '[postgres] stopped' : `[postgres] stop: ${stop.stderr.trim()}`);
}

/**
 * Lets the API's role (made by the migrations, without a login) sign in with this checkout's
 * local password. Run after migrating; a deployment sets its own password (docs/deployment.md).
 */
export async function ensureAppLogin() {
  const { default: pgClient } = await import('pg');
  const client = new pgClient.Client({
    host,
    port: pg.port,
    user: pg.user,
    password: pg.password,
    database: 'postgres',
  });
  await client.connect();
  try {
    const password = client.escapeLiteral(pg.appPassword);
    await client.query(`ALTER ROLE ${client.escapeIdentifier(pg.appUser)} WITH LOGIN PASSWORD ${password}`);
  } finally {
    await client.end();
  }
}

/** Creates a database when missing (and drops it first when `fresh`). */
export async function ensureDatabase(name, { fresh = false } = {}) {
  const { default: pgClient } = await import('pg');
  const client = new pgClient.Client({
    host,
    port: pg.port,
    user: pg.user,
    password: pg.password,
    database: 'postgres',
  });
  await client.connect();
  try {
    if (fresh) await client.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
    const found = await client.query('SELECT 1 FROM pg_database WHERE datname = $1', [name]);
    if (found.rowCount === 0) await client.query(`CREATE DATABASE "${name}"`);
  } finally {
    await client.end();
  }
}
