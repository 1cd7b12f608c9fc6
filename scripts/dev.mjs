// `npm run dev`: the services, the API rebuilt and restarted on change, and Vite's dev server
// (with /api proxied to the API) on http://127.0.0.1:5173.
import { spawn } from 'node:child_process';
import path from 'node:path';
import { API_NODE_OPTIONS, apiEnvironment, app, pg, repoRoot, s3 } from './lib/config.mjs';
import { buildAll, ensureDependencies, localJwtSecret, nodeScript, migrateDatabase } from './lib/bootstrap.mjs';

await ensureDependencies();
const { startServices } = await import('./services.mjs');
const { ensureDatabase } = await import('./lib/postgres.mjs');
await startServices();
await ensureDatabase(pg.database);
await buildAll();
const env = {
  ...process.env,
  ...apiEnvironment({ database: pg.database, bucket: s3.bucket, jwtSecret: localJwtSecret(), port: app.port }),
  NODE_ENV: 'development',
  WEB_DIST: '',
};
await migrateDatabase(pg.database, env);
await nodeScript('apps/api/dist/seed/seed.js', env);

const children = [
  spawn(
    process.execPath,
    [
      path.join(repoRoot, 'node_modules/typescript/bin/tsc'),
      '-p',
      'apps/api/tsconfig.build.json',
      '--watch',
      '--preserveWatchOutput',
    ],
    { cwd: repoRoot, stdio: 'inherit' },
  ),
  spawn(process.execPath, [...API_NODE_OPTIONS, '--watch-path=apps/api/dist', 'apps/api/dist/main.js'], {
    cwd: repoRoot,
    env,
    stdio: 'inherit',
  }),
  spawn('npm', ['run', 'dev', '-w', 'apps/web'], {
    cwd: repoRoot,
    env: { ...process.env, API_PORT: String(app.port) },
    stdio: 'inherit',
  }),
];
const stop = () => children.forEach((c) => c.kill('SIGTERM'));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
console.log('\nDevelopment: web on http://127.0.0.1:5173/ (API on port ' + app.port + ', proxied under /api)\n');
