// `npm run demo:reset [-- --yes]`: drops the development database and seeds the demo practice
// afresh (for when the demo scenario has changed). It asks first, because everything in that
// database is lost; `--yes` answers for scripts. Needs a prior build (npm start or npm run build).
import readline from 'node:readline/promises';
import { apiEnvironment, app, pg, s3 } from './lib/config.mjs';
import { localJwtSecret, nodeScript, migrateDatabase } from './lib/bootstrap.mjs';
import { startServices } from './services.mjs';
import { ensureDatabase } from './lib/postgres.mjs';

async function confirmed() {
  if (process.argv.includes('--yes')) return true;
  if (!process.stdin.isTTY) {
    console.error(
      `demo:reset drops the database "${pg.database}"; run it in a terminal to confirm, or pass --yes (npm run demo:reset -- --yes).`,
    );
    return false;
  }
  const prompt = readline.createInterface({ input: process.stdin, output: process.stdout });
  const answer = await prompt.question(
    `This drops the database "${pg.database}" and everything in it, then seeds the demo. Type "reset" to go on: `,
  );
  prompt.close();
  return answer.trim() === 'reset';
}

if (!(await confirmed())) {
  console.log('demo:reset: nothing was changed.');
  process.exit(1);
}
try {
  await startServices();
  await ensureDatabase(pg.database, { fresh: true });
  const env = apiEnvironment({ database: pg.database, bucket: s3.bucket, jwtSecret: localJwtSecret(), port: app.port });
  await migrateDatabase(pg.database, env);
  await nodeScript('apps/api/dist/seed/seed.js', env);
} catch (error) {
  console.error(`demo:reset failed: ${error.message}`);
  process.exit(1);
}
