// Legacy import files for the tests (docs/import.md): rows as objects, written as CSV.
import { randomUUID } from 'node:crypto';
import { sql } from 'drizzle-orm';
import { IMPORT_COLUMNS } from '@torquetrail/contracts';
import type { TestContext } from './test-app.js';

export type ImportCells = Partial<Record<(typeof IMPORT_COLUMNS)[number], string>>;

const quote = (v: string, delimiter: string) =>
  v.includes(delimiter) || /["\r\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v;

/** The rows as CSV text with every column of the documented set. */
export function csvText(rows: ImportCells[], delimiter: ',' | ';' = ','): string {
  const lines = [IMPORT_COLUMNS.join(delimiter)];
  for (const row of rows) lines.push(IMPORT_COLUMNS.map((c) => quote(row[c] ?? '', delimiter)).join(delimiter));
  return `${lines.join('\r\n')}\r\n`;
}

export const patientCells = (chart: string, family: string, given: string, birth: string, fdi: number) => ({
  chart_number: chart,
  family_name: family,
  given_name: given,
  birth_date: birth,
  fdi: String(fdi),
});

/** Sends a file to the dry run or the import as the user of `cookie`. */
export async function sendImport(
  ctx: TestContext,
  cookie: string,
  file: Buffer | string,
  { dryRun = false, fileName = 'history.csv', mappings, runId = randomUUID() } = {} as {
    dryRun?: boolean;
    fileName?: string;
    mappings?: unknown[];
    runId?: string;
  },
) {
  const query = new URLSearchParams({ fileName, runId });
  if (mappings) query.set('mappings', JSON.stringify(mappings));
  return ctx.http
    .post(`/api/imports${dryRun ? '/dry-run' : ''}?${query.toString()}`)
    .set('Cookie', cookie)
    .set('Content-Type', 'application/octet-stream')
    .send(typeof file === 'string' ? Buffer.from(file, 'utf8') : file);
}

/** Row counts of every table but the audit trail, to prove nothing was written. */
export async function rowCounts(ctx: TestContext): Promise<Record<string, number>> {
  const { rows } = await ctx.db.execute<{ tablename: string }>(
    sql`select tablename from pg_tables where schemaname = 'public' and tablename <> 'audit_events'`,
  );
  const parts = rows.map((r) => `'${r.tablename}', (select count(*) from "${r.tablename}")`).join(', ');
  const { rows: counted } = await ctx.db.execute<{ counts: Record<string, number> }>(
    sql.raw(`select json_build_object(${parts}) as counts`),
  );
  return counted[0].counts;
}
