// `npm test`: the same set-up as `npm start` with a separate test database, the house rules
// (`npm run lint`: code, format, bounds, unused — each counted as one result), then the three
// tiers (unit, API through Supertest on the real PostgreSQL, browser with Debian's chromium
// against the built app), and one closing line counting all of them: "N passed, N failed".
import fs from 'node:fs';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import { spawn } from 'node:child_process';
import { apiEnvironment, localDir, ownerEnvironment, pg, repoRoot, s3 } from './lib/config.mjs';
import { buildAll, ensureChromium, ensureDependencies, typecheckAll, migrateDatabase } from './lib/bootstrap.mjs';
import { runLint } from './lint.mjs';
import { summarizeReport } from './lib/test-report.mjs';

const tiers = ['unit', 'api', 'browser'];
const resultsDir = path.join(localDir, 'test-results');

/** The order seed of the shuffled tiers, chosen here so the closing summary can print it. */
const seed = Number(process.env.TT_TEST_SEED) || Math.floor(Math.random() * 2 ** 31);

function runTier(name, env) {
  const outputFile = path.join(resultsDir, `${name}.json`);
  fs.rmSync(outputFile, { force: true });
  return new Promise((resolve) => {
    const child = spawn(
      process.execPath,
      [
        path.join(repoRoot, 'node_modules/vitest/vitest.mjs'),
        'run',
        '--project',
        name,
        '--reporter=default',
        '--reporter=json',
        `--outputFile.json=${outputFile}`,
        `--sequence.seed=${seed}`,
      ],
      { cwd: repoRoot, env: { ...process.env, ...env }, stdio: 'inherit' },
    );
    child.on('exit', (code) => {
      let summary;
      try {
        summary = summarizeReport(JSON.parse(fs.readFileSync(outputFile, 'utf8')), repoRoot);
      } catch {
        summary = { passed: 0, failed: 1, failures: ['the runner died before writing its report'] };
      }
      if (code !== 0 && summary.failed === 0) {
        summary = { ...summary, failed: 1, failures: [`vitest exited with ${code}`] };
      }
      resolve({ name, ...summary });
    });
  });
}

async function main() {
  await ensureDependencies();
  const chromium = await ensureChromium();
  const { startServices, stopServices } = await import('./services.mjs');
  const { ensureDatabase } = await import('./lib/postgres.mjs');
  // Services this run starts are stopped at the end; ones already running (npm start) stay up.
  const started = await startServices();
  process.on('exit', () => {
    if (started.length > 0) stopServices(started);
  });
  await ensureDatabase(pg.testDatabase, { fresh: true });
  await buildAll();
  await typecheckAll();
  const env = {
    ...apiEnvironment({
      database: pg.testDatabase,
      bucket: s3.testBucket,
      jwtSecret: randomBytes(48).toString('base64url'),
      port: 0,
    }),
    // For the tests' own set-up (emptying tables, backup and restore); the app under test never reads it.
    ...ownerEnvironment(pg.testDatabase),
    NODE_ENV: 'test',
    CHROMIUM_PATH: chromium,
  };
  // The test database is migrated by the same command production uses.
  await migrateDatabase(pg.testDatabase, env);

  fs.mkdirSync(resultsDir, { recursive: true });
  // A broken house rule fails the run, but the tiers still run so every failure is seen at once.
  const lint = await runLint();
  const results = [
    {
      name: 'lint',
      passed: lint.filter((c) => c.ok).length,
      failed: lint.filter((c) => !c.ok).length,
      failures: lint.filter((c) => !c.ok).map((c) => c.name),
    },
  ];
  for (const tier of tiers) results.push(await runTier(tier, env));

  console.log('\nTest tiers:');
  for (const r of results) {
    console.log(`  ${r.name.padEnd(8)} ${r.passed} passed, ${r.failed} failed`);
    for (const failure of r.failures) console.log(`    ✗ ${failure}`);
  }
  if (results.some((r) => r.failed > 0))
    console.log(`  (order seed ${seed}: TT_TEST_SEED=${seed} npm test replays it)`);
  const passed = results.reduce((n, r) => n + r.passed, 0);
  const failed = results.reduce((n, r) => n + r.failed, 0);
  console.log(`${passed} passed, ${failed} failed`);
  process.exit(failed > 0 || passed === 0 ? 1 : 0);
}

main().catch((error) => {
  console.error(`\nnpm test could not run: ${error.message}`);
  console.log('0 passed, 1 failed');
  process.exit(1);
});
