// Starts and stops the three local services: PostgreSQL, the S3 fake and the mail catcher.
// `node scripts/services.mjs start|stop|status`. Starting twice finds them running; stopping
// uses the pid files in .local/run/ (and pg_ctl for PostgreSQL), never process names.
import fs from 'node:fs';
import path from 'node:path';
import { spawn } from 'node:child_process';
import { mail, repoRoot, runDir, s3 } from './lib/config.mjs';
import { isAlive, portOpen, readPid, waitForPort } from './lib/proc.mjs';
import { ServiceError, startPostgres, stopPostgres } from './lib/postgres.mjs';

const background = [
  {
    name: 's3',
    script: path.join(repoRoot, 'minio-local', 'start.mjs'),
    ports: [s3.port],
    // s3rver writes ListObjectsV2's continuation token (a listing of more than 1 000 keys) with DES,
    // which OpenSSL 3 keeps in its legacy provider: without it every such listing fails with a 500.
    nodeOptions: ['--openssl-legacy-provider'],
  },
  { name: 'mail', script: path.join(repoRoot, 'scripts', 'mail-catcher.mjs'), ports: [mail.smtpPort, mail.httpPort] },
];

async function startBackground({ name, script, ports, nodeOptions = [] }) {
  fs.mkdirSync(runDir, { recursive: true });
  const pidFile = path.join(runDir, `${name}.pid`);
  const pid = readPid(pidFile);
  if (isAlive(pid)) {
    console.log(`[${name}] already running (pid ${pid})`);
    return false;
  }
  for (const port of ports) {
    if (await portOpen(port)) {
      throw new ServiceError(
        `port ${port} on 127.0.0.1 is taken by another program, so the ${name} service cannot start`,
      );
    }
  }
  const log = fs.openSync(path.join(runDir, `${name}.log`), 'a');
  const child = spawn(process.execPath, [...nodeOptions, script], {
    detached: true,
    stdio: ['ignore', log, log],
    cwd: repoRoot,
  });
  child.unref();
  fs.writeFileSync(pidFile, String(child.pid));
  for (const port of ports) await waitForPort(port, { label: `the ${name} service (port ${port})` });
  console.log(`[${name}] started (pid ${child.pid}, log .local/run/${name}.log)`);
  return true;
}

function stopBackground({ name }) {
  const pidFile = path.join(runDir, `${name}.pid`);
  const pid = readPid(pidFile);
  if (isAlive(pid)) {
    process.kill(pid, 'SIGTERM');
    console.log(`[${name}] stopped (pid ${pid})`);
  } else {
    console.log(`[${name}] not running`);
  }
  fs.rmSync(pidFile, { force: true });
}

/** Starts what is not running; returns the names of the services this call started. */
export async function startServices() {
  const started = [];
  if (await startPostgres()) started.push('postgres');
  for (const service of background) if (await startBackground(service)) started.push(service.name);
  return started;
}

/**
 * Stops one background service (s3 or mail) and waits until its ports are closed; the fault
 * tests use it, with startService, to take a dependency away and bring it back.
 */
export async function stopService(name) {
  const service = background.find((s) => s.name === name);
  if (!service) throw new ServiceError(`no background service named ${name}`);
  stopBackground(service);
  for (const port of service.ports) await waitForPortClosed(port);
}

/** Starts one background service (s3 or mail) again, waiting until it listens. */
export async function startService(name) {
  const service = background.find((s) => s.name === name);
  if (!service) throw new ServiceError(`no background service named ${name}`);
  await startBackground(service);
}

async function waitForPortClosed(port, ms = 10_000) {
  const end = Date.now() + ms;
  while (await portOpen(port)) {
    if (Date.now() > end) throw new ServiceError(`port ${port} still open ${ms} ms after stopping its service`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

/** Stops the named services (all by default). */
export function stopServices(names = ['postgres', ...background.map((s) => s.name)]) {
  for (const service of background) if (names.includes(service.name)) stopBackground(service);
  if (names.includes('postgres')) stopPostgres();
}

const isMain = process.argv[1] && path.resolve(process.argv[1]) === path.resolve(new URL(import.meta.url).pathname);
if (isMain) {
  const command = process.argv[2];
  try {
    if (command === 'start') await startServices();
    else if (command === 'stop') stopServices();
    else {
      console.error('usage: node scripts/services.mjs start|stop');
      process.exit(2);
    }
  } catch (error) {
    console.error(`\nCould not ${command} the local services: ${error.message}`);
    process.exit(1);
  }
}
