// `npm run backup [-- --out DIR]`: a pg_dump (custom format) of the database and a copy of the
// bucket's objects, with a manifest of SHA-256 hashes and row counts, in a dated folder
// (default .local/backups/<UTC time>). It reads MIGRATION_DATABASE_URL (the owner) and S3_*; without
// them it backs up this checkout's local installation (starting its services when needed).
import path from 'node:path';
import { parseArgs } from 'node:util';
import { localDir } from './lib/config.mjs';
import { BackupError, backup, targetFromEnv } from './lib/backup.mjs';
import { localTargetEnv } from './lib/backup-target.mjs';

const { values } = parseArgs({
  options: { out: { type: 'string' }, database: { type: 'string' }, bucket: { type: 'string' } },
});
const stamp = new Date()
  .toISOString()
  .replace(/:/g, '-')
  .replace(/\.\d+Z$/, 'Z');
const dir = path.resolve(values.out ?? path.join(localDir, 'backups', stamp));

try {
  const env = await localTargetEnv(values);
  const manifest = await backup(targetFromEnv(env), dir, (line) => console.log(`[backup] ${line}`));
  const rows = Object.values(manifest.database.rows).reduce((a, b) => a + b, 0);
  console.log(
    `[backup] done: ${dir} (${rows} rows in ${Object.keys(manifest.database.rows).length} tables, ${manifest.bucket.objects.length} objects)`,
  );
} catch (error) {
  console.error(`backup failed: ${error instanceof BackupError ? error.message : error.stack}`);
  process.exit(1);
}
