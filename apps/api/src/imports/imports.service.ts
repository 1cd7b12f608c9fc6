import {
  BadRequestException,
  ConflictException,
  ForbiddenException,
  Inject,
  Injectable,
  NotFoundException,
  PayloadTooLargeException,
  UnprocessableEntityException,
} from '@nestjs/common';
import { type AppAbility, subject } from '@torquetrail/authz';
import {
  IMPORT_COLUMNS,
  IMPORT_REQUIRED_COLUMNS,
  type ImportColumn,
  type ImportIssue,
  type ImportProgress,
  type ImportQuery,
  type ImportReport,
  type ImportResult,
} from '@torquetrail/contracts';
import { setImmediate } from 'node:timers/promises';
import { RULES_VERSION } from '@torquetrail/domain';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { reportChange } from '../common/audit-context.js';
import { isUniqueViolation } from '../common/postgres-error.js';
import { datePrinter } from '../common/printed-dates.js';
import { ENV, type Env } from '../config/env.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database, type Db } from '../db/database.js';
import { columnName, decode, detectDelimiter, readBody, records, sha256Of, TooLarge } from './csv-reader.js';
import { ImportPlanner } from './import-plan.js';
import { RecallScheduler } from '../recalls/recall-scheduler.service.js';
import { ImportProgressStore } from './import-progress.js';
import * as repo from './imports.repository.js';
import { asIssues, readRow } from './row-reader.js';

type Query = z.output<typeof ImportQuery>;
/** The report lists this many problems at most; the counts still count them all. */
const MAX_LISTED_ISSUES = 10_000;
const mb = (bytes: number) => `${Math.round(bytes / 1024 / 1024)} MB`;
/** Today in the time zone furthest ahead of UTC (UTC+14): no clinic has records after it. */
const latestPossibleToday = () => new Date(Date.now() + 14 * 3_600_000).toISOString().slice(0, 10);

/** Each patient's latest imported visit (the visit of their latest imported exam). */
function latestVisits(exams: readonly { patientId: string; visitId: string; examinedOn: string }[]) {
  const latest = new Map<string, { on: string; visitId: string }>();
  for (const e of exams) {
    const seen = latest.get(e.patientId);
    if (!seen || e.examinedOn >= seen.on) latest.set(e.patientId, { on: e.examinedOn, visitId: e.visitId });
  }
  return new Map([...latest].map(([patientId, v]) => [patientId, v.visitId]));
}

interface Checked {
  planner: ImportPlanner;
  sha256: string;
  encoding: ImportReport['encoding'];
  delimiter: ImportReport['delimiter'];
  errors: number;
  warnings: number;
}

@Injectable()
export class ImportsService {
  constructor(
    @Inject(DB) private readonly db: Database,
    @Inject(ENV) private readonly env: Env,
    private readonly progress: ImportProgressStore,
    private readonly recalls: RecallScheduler,
  ) {}

  /** Reads and checks the whole file and reports; nothing but the audit row is written. */
  async dryRun(
    ability: AppAbility,
    user: SessionUser,
    query: Query,
    body: AsyncIterable<Buffer>,
    declaredLength?: number,
  ): Promise<ImportReport> {
    this.allowed(ability, user);
    const progress = this.progress.start(query.runId, user.id);
    try {
      const bytes = await this.read(body, declaredLength);
      // One snapshot for every check; the transaction also carries the request's audit row.
      const report = await auditedTransaction(this.db, async (tx) => {
        const checked = await this.check(tx, user, query, bytes, progress);
        const earlier = await repo.findImport(tx, user.practiceId, checked.sha256);
        return this.report(query, checked, earlier?.importedAt ?? null);
      });
      progress.phase = 'done';
      return report;
    } catch (e) {
      progress.phase = 'failed';
      throw e;
    }
  }

  /** Writes a file that checks without errors, all of it in one transaction, once. */
  async run(
    ability: AppAbility,
    user: SessionUser,
    query: Query,
    body: AsyncIterable<Buffer>,
    declaredLength?: number,
  ): Promise<ImportResult> {
    this.allowed(ability, user);
    const progress = this.progress.start(query.runId, user.id);
    try {
      const bytes = await this.read(body, declaredLength);
      const sha256 = sha256Of(bytes);
      const result = await auditedTransaction(this.db, async (tx) => {
        const earlier = await repo.findImport(tx, user.practiceId, sha256);
        if (earlier) {
          // The same file again: nothing is written, the earlier import is the answer.
          reportChange({ type: 'LegacyImport', id: earlier.id, after: { sha256, written: false } });
          return this.result(earlier, false, []);
        }
        const checked = await this.check(tx, user, query, bytes, progress);
        if (checked.errors > 0)
          throw new UnprocessableEntityException(
            `${checked.errors} problem(s) stop this import: run the dry run, correct the file or map its parts, and import again`,
          );
        const { planner } = checked;
        progress.phase = 'writing';
        progress.recordsToWrite = Object.entries(planner.writes)
          .filter(([table]) => table !== 'siteStatus')
          .reduce((n, [, list]) => n + list.length, 0);
        const row = await repo.insertImport(tx, {
          practiceId: user.practiceId,
          sha256,
          fileName: query.fileName,
          rowCount: planner.counts.rows,
          counts: planner.counts,
          rulesVersion: RULES_VERSION,
          importedBy: user.id,
        });
        await repo.writeAll(tx, row.id, planner.writes, (n) => {
          progress.rowsWritten += n;
          this.progress.touch(progress);
        });
        // Imported exams schedule the next recall as a visit entered in the app does.
        for (const [patientId, visitId] of latestVisits(planner.writes.exams))
          await this.recalls.rescheduleAfterImport(tx, patientId, visitId);
        reportChange({
          type: 'LegacyImport',
          id: row.id,
          after: { fileName: query.fileName, sha256, counts: planner.counts, rulesVersion: RULES_VERSION },
        });
        return this.result(row, true, [...planner.touched.values()]);
      });
      progress.phase = 'done';
      return result;
    } catch (e) {
      progress.phase = 'failed';
      if (isUniqueViolation(e)) throw new ConflictException('This file is being imported by another request');
      throw e;
    }
  }

  progressOf(user: SessionUser, runId: string): ImportProgress {
    const found = this.progress.get(runId, user.id);
    if (!found) throw new NotFoundException('No such import run of yours');
    return found;
  }

  /**
   * The rule pinned to the user's own practice (the guard checked the role). Not assertCan: the
   * import opens no record for the audit row to name (the import's own row is reported).
   */
  private allowed(ability: AppAbility, user: SessionUser) {
    if (!ability.can('create', subject('LegacyImport', { practiceId: user.practiceId })))
      throw new ForbiddenException('Your role may not import records into this practice');
  }

  private async read(body: AsyncIterable<Buffer>, declaredLength?: number): Promise<Buffer> {
    const max = this.env.IMPORT_MAX_BYTES;
    const tooLarge = () => new PayloadTooLargeException(`The file is larger than the limit of ${mb(max)}`);
    if (declaredLength !== undefined && declaredLength > max) throw tooLarge();
    try {
      const bytes = await readBody(body, max);
      if (bytes.length === 0) throw new BadRequestException('The file is empty');
      return bytes;
    } catch (e) {
      throw e instanceof TooLarge ? tooLarge() : e;
    }
  }

  private async check(db: Db, user: SessionUser, query: Query, bytes: Buffer, progress: ImportProgress) {
    // NUL bytes never occur in a text CSV: UTF-16 (a spreadsheet's "Unicode text") or a binary file.
    if (bytes.includes(0))
      throw new BadRequestException(
        'This file is not a CSV in UTF-8 or Windows-1252 (it looks like UTF-16 or a binary file): save it as "CSV UTF-8"',
      );
    const sha256 = sha256Of(bytes);
    const { text, encoding } = decode(bytes);
    const delimiter = detectDelimiter(text);
    const practiceId = user.practiceId;
    const sites = await repo.liveSites(db, practiceId);
    const planner = new ImportPlanner({
      practiceId,
      userId: user.id,
      latestToday: latestPossibleToday(),
      dates: datePrinter(user.dateFormat),
      patients: await repo.practicePatients(db, practiceId),
      platforms: await repo.practicePlatforms(db, practiceId),
      parts: await repo.currentParts(db, practiceId),
      sites,
      installed: await repo.installedParts(db, practiceId),
      exams: await repo.examsOfSites(
        db,
        sites.map((s) => s.id),
      ),
      mappings: query.mappings,
    });
    progress.phase = 'checking';
    let columns: (ImportColumn | null)[] | null = null;
    try {
      for await (const record of records(text, delimiter)) {
        if (!columns) {
          columns = this.header(record.cells, planner);
          continue;
        }
        planner.counts.rows++;
        const cells: Partial<Record<ImportColumn, string>> = {};
        record.cells.forEach((cell, i) => {
          const column = columns![i];
          if (column) cells[column] = cell;
        });
        const read = readRow(cells, delimiter === ';');
        if ('row' in read) planner.add(record.row, read.row);
        else planner.issues.push(...asIssues(record.row, 'error', read.problems));
        if (++progress.rowsRead % 500 === 0) {
          this.progress.touch(progress);
          // Let other requests in (the page's progress polls) between batches of rows.
          await setImmediate();
        }
      }
    } catch (e) {
      if (e instanceof BadRequestException) throw e;
      // csv-parse's own errors (an unclosed quote …) name the line; the file cannot be read past it.
      const message = (e as { message?: string }).message ?? 'unreadable';
      if ((e as { code?: string }).code?.startsWith('CSV_'))
        throw new BadRequestException(`The file could not be read as CSV: ${message}`);
      throw e;
    }
    if (!columns) throw new BadRequestException('The file has no header line');
    progress.totalRows = planner.counts.rows;
    const errors = planner.issues.filter((i) => i.level === 'error').length;
    return { planner, sha256, encoding, delimiter, errors, warnings: planner.issues.length - errors } satisfies Checked;
  }

  /** The columns of the header line; missing required ones refuse the whole file. */
  private header(cells: string[], planner: ImportPlanner): (ImportColumn | null)[] {
    const names = cells.map(columnName);
    const missing = IMPORT_REQUIRED_COLUMNS.filter((c) => !names.includes(c));
    if (missing.length > 0)
      throw new BadRequestException(
        `The file lacks required column(s): ${missing.join(', ')} (docs: the import template lists every column)`,
      );
    return names.map((name) => {
      if ((IMPORT_COLUMNS as readonly string[]).includes(name)) return name as ImportColumn;
      planner.warning(1, name, `Unknown column "${name}" is ignored`);
      return null;
    });
  }

  private report(query: Query, checked: Checked, importedAt: Date | null): ImportReport {
    const { planner } = checked;
    const issues: ImportIssue[] = planner.issues.slice(0, MAX_LISTED_ISSUES);
    if (planner.issues.length > MAX_LISTED_ISSUES)
      issues.push({
        row: 0,
        column: null,
        level: 'warning',
        message: `${planner.issues.length - MAX_LISTED_ISSUES} more problems are not listed`,
      });
    return {
      fileName: query.fileName,
      sha256: checked.sha256,
      encoding: checked.encoding,
      delimiter: checked.delimiter,
      counts: planner.counts,
      errors: checked.errors,
      warnings: checked.warnings,
      issues,
      unknownParts: [...planner.unknownParts.values()],
      catalogueParts: planner.catalogueParts(),
      alreadyImportedAt: importedAt?.toISOString() ?? null,
    };
  }

  private result(
    row: { id: string; fileName: string; sha256: string; counts: Record<string, number>; importedAt: Date },
    written: boolean,
    patients: ImportResult['patients'],
  ): ImportResult {
    return {
      importId: row.id,
      fileName: row.fileName,
      sha256: row.sha256,
      written,
      counts: row.counts as ImportResult['counts'],
      patients,
      importedAt: row.importedAt.toISOString(),
    };
  }
}
