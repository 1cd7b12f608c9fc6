// Runs one test tier by hand, with the environment `npm test` sets:
//   node scripts/test-tier.mjs unit|api|browser [vitest file filters…]
// TT_TEST_DB picks the test database (default torquetrail_test), so two people or agents on one
// machine can run API tests side by side. Needs a prior `npm run build` (for the migrator and,
// for the browser tier, the built web app).
import fs from 'node:fs';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import { apiEnvironment, ownerEnvironment, pg, repoRoot, s3 } from './lib/config.mjs';
import { migrateDatabase } from './lib/bootstrap.mjs';
import { run } from './lib/proc.mjs';
import { startServices } from './services.mjs';
import { ensureDatabase } from './lib/postgres.mjs';

const [tier, ...filters] = process.argv.slice(2);
if (!['unit', 'api', 'browser'].includes(tier ?? '')) {
  console.error('usage: node scripts/test-tier.mjs unit|api|browser [vitest file filters…]');
  process.exit(2);
}
if (!fs.existsSync(path.join(repoRoot, 'apps/api/dist/db/migrate.js'))) {
  console.error('Build first: npm run build');
  process.exit(2);
}
const database = process.env.TT_TEST_DB ?? pg.testDatabase;
const env = {
  ...apiEnvironment({ database, bucket: s3.testBucket, jwtSecret: randomBytes(48).toString('base64url'), port: 0 }),
  // For the tests' own set-up (emptying tables, backup and restore); the app under test never reads it.
  ...ownerEnvironment(database),
  NODE_ENV: 'test',
  CHROMIUM_PATH: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
};
try {
  if (tier !== 'unit') {
    await startServices();
    await ensureDatabase(database, { fresh: true });
    await migrateDatabase(database, env);
  }
  await run(
    process.execPath,
    [path.join(repoRoot, 'node_modules/vitest/vitest.mjs'), 'run', '--project', tier, ...filters],
    { cwd: repoRoot, env: { ...process.env, ...env } },
  );
} catch (error) {
  console.error(error.message);
  process.exit(1);
}
