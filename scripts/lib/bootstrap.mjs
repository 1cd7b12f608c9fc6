// Set-up steps shared by `npm start` and `npm test`. Uses only Node's built-ins, because it
// runs before the dependencies are installed on a fresh clone.
import { createHash, randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { isRoot, run } from './proc.mjs';
import { localDir, ownerEnvironment, repoRoot } from './config.mjs';
import { ensureAppLogin } from './postgres.mjs';

const npm = process.platform === 'win32' ? 'npm.cmd' : 'npm';

/** `npm ci` in `dir` when its node_modules is missing or older than its package-lock.json's content. */
async function ensureInstalled(dir) {
  const lock = path.join(dir, 'package-lock.json');
  const stamp = path.join(dir, 'node_modules', '.torquetrail-lock-hash');
  const hash = createHash('sha256').update(fs.readFileSync(lock)).digest('hex');
  if (fs.existsSync(stamp) && fs.readFileSync(stamp, 'utf8') === hash) return;
  console.log(`[setup] installing dependencies (npm ci in ${path.relative(repoRoot, dir) || '.'}) …`);
  await run(npm, ['ci', '--no-audit', '--no-fund'], { cwd: dir });
  fs.writeFileSync(stamp, hash);
}

/** The workspaces' dependencies. */
export function ensureDependencies() {
  return ensureInstalled(repoRoot);
}

/**
 * dependency-cruiser parses TypeScript with the TypeScript 5 API, which the workspace's native
 * TypeScript 7 no longer has, so it lives in its own small install (docs/adr/0005). Returns its binary.
 */
export async function ensureBoundaryTool() {
  const dir = path.join(repoRoot, 'tools', 'boundaries');
  await ensureInstalled(dir);
  return path.join(dir, 'node_modules', '.bin', 'depcruise');
}

/** Debian's chromium for the browser tests, installed with apt-get when missing. */
export async function ensureChromium() {
  const binary = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
  if (fs.existsSync(binary)) return binary;
  if (!isRoot()) throw new Error(`${binary} is missing: install Debian's chromium (sudo apt-get install -y chromium)`);
  console.log('[setup] installing Debian package chromium for the browser tests …');
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  await run('apt-get', ['update', '-qq'], { env });
  await run('apt-get', ['install', '-y', '-qq', 'chromium'], { env });
  return binary;
}

/** Builds the packages, the API and the web app (tsc type-checks on the way). */
export async function buildAll() {
  console.log('[setup] building packages, API and web app …');
  await run(npm, ['run', 'build', '--silent'], { cwd: repoRoot });
}

/** Type-checks every workspace, tests included (the builds leave test files out). */
export async function typecheckAll() {
  console.log('[setup] type-checking every workspace, tests included …');
  await run(npm, ['run', 'typecheck', '--silent'], { cwd: repoRoot });
}

/** The session-signing secret of this checkout's local app, made once and kept in .local/. */
export function localJwtSecret() {
  const file = path.join(localDir, 'jwt-secret');
  if (!fs.existsSync(file)) {
    fs.mkdirSync(localDir, { recursive: true });
    fs.writeFileSync(file, randomBytes(48).toString('base64url'), { mode: 0o600 });
  }
  return fs.readFileSync(file, 'utf8').trim();
}

export function nodeScript(script, env) {
  return run(process.execPath, [path.join(repoRoot, script)], { cwd: repoRoot, env: { ...process.env, ...env } });
}

/**
 * Migrates `database` as the owner (the production migrator, apps/api/dist/db/migrate.js), then
 * lets the API's role sign in locally. `env` is the API's environment for that database.
 */
export async function migrateDatabase(database, env) {
  await nodeScript('apps/api/dist/db/migrate.js', { ...env, ...ownerEnvironment(database) });
  await ensureAppLogin();
}
