// Takes the local services away and brings them back from a test: PostgreSQL through pg_ctl
// (scripts/lib/postgres.mjs), the S3 fake and the mail catcher through their pid files
// (scripts/services.mjs). Other test files share these services: a fault test restores each one
// in `finally`, and the API tier runs files one at a time.
import path from 'node:path';
import { pathToFileURL } from 'node:url';

const repoRoot = path.resolve(import.meta.dirname, '../../../..');

interface PostgresControl {
  stopPostgres: () => void;
  startPostgres: () => Promise<boolean>;
}
interface ServiceControl {
  stopService: (name: 's3' | 'mail') => Promise<void>;
  startService: (name: 's3' | 'mail') => Promise<void>;
}

const load = async <T>(file: string) => (await import(pathToFileURL(path.join(repoRoot, file)).href)) as T;

export const postgres = () => load<PostgresControl>('scripts/lib/postgres.mjs');
export const services = () => load<ServiceControl>('scripts/services.mjs');

/** The figures of a fault run, printed at the end so they can be quoted. */
export function report(title: string, figures: Record<string, number | string>): void {
  const lines = Object.entries(figures).map(([k, v]) => `  ${k}: ${v}`);
  console.log(`[faults] ${title}\n${lines.join('\n')}`);
}
