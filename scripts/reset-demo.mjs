// `npm run demo:reset`: drops the development database and seeds the demo practice afresh
// (for when the demo scenario has changed). Needs a prior build (npm start or npm run build).
import { apiEnvironment, app, pg, s3 } from './lib/config.mjs';
import { localJwtSecret, nodeScript } from './lib/bootstrap.mjs';
import { startServices } from './services.mjs';
import { ensureDatabase } from './lib/postgres.mjs';

try {
  await startServices();
  await ensureDatabase(pg.database, { fresh: true });
  const env = apiEnvironment({ database: pg.database, bucket: s3.bucket, jwtSecret: localJwtSecret(), port: app.port });
  await nodeScript('apps/api/dist/db/migrate.js', env);
  await nodeScript('apps/api/dist/seed/seed.js', env);
} catch (error) {
  console.error(`demo:reset failed: ${error.message}`);
  process.exit(1);
}
