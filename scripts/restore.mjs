// `npm run restore -- FOLDER [--force] [--database NAME] [--bucket NAME]`: restores a backup made
// by `npm run backup` after checking every hash in its manifest. The target database and bucket
// must be empty (a missing local database or bucket is created); `--force` overwrites a non-empty
// one. It reads MIGRATION_DATABASE_URL (the owner) and S3_*; without them it restores into this checkout's
// local installation, or into the local database and bucket named by --database and --bucket.
import path from 'node:path';
import { parseArgs } from 'node:util';
import { BackupError, restore, targetFromEnv } from './lib/backup.mjs';
import { localTargetEnv } from './lib/backup-target.mjs';

const { values, positionals } = parseArgs({
  allowPositionals: true,
  options: { force: { type: 'boolean', default: false }, database: { type: 'string' }, bucket: { type: 'string' } },
});
if (positionals.length !== 1) {
  console.error('usage: npm run restore -- FOLDER [--force] [--database NAME] [--bucket NAME]');
  process.exit(2);
}

try {
  const env = await localTargetEnv(values, { create: true });
  const result = await restore(targetFromEnv(env), path.resolve(positionals[0]), {
    force: values.force,
    log: (line) => console.log(`[restore] ${line}`),
  });
  if (result.differences.length > 0) {
    console.log(
      `[restore] row counts differ from the manifest in: ${result.differences.join(', ')} (was the source busy during the backup?)`,
    );
  }
  const rows = Object.values(result.rows).reduce((a, b) => a + b, 0);
  console.log(`[restore] done: ${rows} rows, ${result.manifest.bucket.objects.length} objects, every hash verified`);
} catch (error) {
  console.error(`restore failed: ${error instanceof BackupError ? error.message : error.stack}`);
  process.exit(1);
}
