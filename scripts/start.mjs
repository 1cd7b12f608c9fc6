// `npm start`: installs what is missing, starts PostgreSQL, the S3 fake and the mail catcher on
// loopback, migrates, seeds the demo practice when the database is empty, builds and serves the
// app on http://127.0.0.1:3000 (PORT moves it), and prints the demo sign-ins.
import { spawn } from 'node:child_process';
import path from 'node:path';
import { API_NODE_OPTIONS, apiEnvironment, app, mail, pg, repoRoot, s3 } from './lib/config.mjs';
import { buildAll, ensureDependencies, localJwtSecret, nodeScript, migrateDatabase } from './lib/bootstrap.mjs';
import { portOpen } from './lib/proc.mjs';

async function main() {
  await ensureDependencies();
  const { startServices } = await import('./services.mjs');
  const { ensureDatabase } = await import('./lib/postgres.mjs');
  await startServices();
  await ensureDatabase(pg.database);
  await buildAll();
  const env = {
    ...apiEnvironment({ database: pg.database, bucket: s3.bucket, jwtSecret: localJwtSecret(), port: app.port }),
    NODE_ENV: 'development',
  };
  await migrateDatabase(pg.database, env);
  await nodeScript('apps/api/dist/seed/seed.js', env);
  if (await portOpen(app.port)) throw new Error(`port ${app.port} on 127.0.0.1 is taken; start with PORT=… npm start`);

  const api = spawn(process.execPath, [...API_NODE_OPTIONS, path.join(repoRoot, 'apps/api/dist/main.js')], {
    cwd: repoRoot,
    env: { ...process.env, ...env },
    stdio: 'inherit',
  });
  const stop = () => api.kill('SIGTERM');
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
  api.on('exit', (code) => process.exit(code ?? 0));

  while (!(await portOpen(app.port))) {
    if (api.exitCode !== null) return;
    await new Promise((r) => setTimeout(r, 200));
  }
  const { DEMO_SIGN_INS, DEMO_PASSWORD } = await import('../apps/api/dist/seed/demo-scenario.js');
  console.log(`
Torquetrail is running at http://127.0.0.1:${app.port}/
  API docs (development): http://127.0.0.1:${app.port}/api/docs
  Caught mail:            http://127.0.0.1:${mail.httpPort}/

Demo sign-ins (password for all: ${DEMO_PASSWORD}; demo only):
${DEMO_SIGN_INS.map((u) => `  ${u.role.padEnd(15)} ${u.email.padEnd(34)} ${u.name}, ${u.practice}`).join('\n')}

Stop with Ctrl+C; then \`npm run services:stop\` stops PostgreSQL, the S3 fake and the mail catcher.
`);
}

main().catch((error) => {
  console.error(`\nnpm start stopped: ${error.message}`);
  process.exit(1);
});
