// Where backup and restore read from or write to: the environment's MIGRATION_DATABASE_URL and S3_*
// settings when given (a deployed installation), else this checkout's local services.
import { apiEnvironment, ownerEnvironment, pg, s3 } from './config.mjs';
import { ensureDatabase } from './postgres.mjs';

export async function localTargetEnv({ database, bucket }, { create = false } = {}) {
  if ((process.env.MIGRATION_DATABASE_URL ?? process.env.DATABASE_URL) && !database)
    return { ...process.env, ...(bucket ? { S3_BUCKET: bucket } : {}) };
  const { startServices } = await import('../services.mjs');
  await startServices();
  const name = database ?? pg.database;
  if (create) await ensureDatabase(name);
  const local = apiEnvironment({ database: name, bucket: bucket ?? s3.bucket, jwtSecret: 'unused', port: 0 });
  return { ...process.env, ...local, ...ownerEnvironment(name) };
}
