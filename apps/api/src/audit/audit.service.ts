import { Inject, Injectable } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import type {
  AuditCsvQuery,
  AuditEvent,
  AuditPage,
  AuditQuery,
  PatientAuditQuery,
  PracticeAuditPage,
} from '@torquetrail/contracts';
import { assertCan, type Scope } from '../authz/scope.js';
import { csvLine } from '@torquetrail/contracts';
import { DB, type Database } from '../db/database.js';
import {
  type AuditEventRow,
  type AuditFilter,
  findPracticePatient,
  listAuditEvents,
  listPracticePeople,
} from './audit.repository.js';

/** Rows read per query while the CSV streams: memory stays flat however long the trail. */
export const CSV_BATCH = 2000;

const CSV_HEADER = [
  'at (UTC)',
  'action',
  'outcome',
  'status',
  'user',
  'role',
  'patient',
  'chart number',
  'record type',
  'record id',
  'route',
  'address',
  'user agent',
  'query',
  'before',
  'after',
];

const json = (value: unknown) => (value === null || value === undefined ? null : JSON.stringify(value));

const toEvent = (row: AuditEventRow): AuditEvent => ({
  ...row,
  at: row.at.toISOString(),
  query: (row.query as Record<string, unknown> | null) ?? null,
});

@Injectable()
export class AuditService {
  constructor(@Inject(DB) private readonly db: Database) {}

  private async page(filter: AuditFilter, query: AuditQuery | PatientAuditQuery): Promise<AuditPage> {
    const rows = await listAuditEvents(this.db, filter, query.before, query.pageSize + 1);
    const items = rows.slice(0, query.pageSize).map(toEvent);
    return { items, nextBefore: rows.length > query.pageSize ? items[items.length - 1].id : null };
  }

  /** The practice's trail (the practice admin's: the route's @Allow says so). */
  async practicePage(scope: Scope, query: AuditQuery): Promise<PracticeAuditPage> {
    const { before: _b, pageSize: _p, ...filters } = query;
    const [page, people] = await Promise.all([
      this.page({ ...filters, practiceId: scope.practiceId }, query),
      listPracticePeople(this.db, scope.practiceId),
    ]);
    return { ...page, people };
  }

  /** Who accessed one patient's record: that patient's rows, for the dentist and the admin. */
  async patientPage(ability: AppAbility, scope: Scope, patientId: string, query: PatientAuditQuery) {
    const patient = assertCan(
      ability,
      'read',
      'PatientAudit',
      await findPracticePatient(this.db, scope.practiceId, patientId),
      'patient',
    );
    const { before: _b, pageSize: _p, ...filters } = query;
    return this.page({ ...filters, practiceId: patient.practiceId, patientId: patient.id }, query);
  }

  /**
   * The filtered trail as CSV, read in keyset batches as the client takes them; each batch is
   * written as one chunk, not one chunk per line (session 12, the large practice's 22 000 events).
   */
  async *csv(scope: Scope, query: AuditCsvQuery): AsyncGenerator<string> {
    const filter = { ...query, practiceId: scope.practiceId };
    yield csvLine(CSV_HEADER);
    let before: string | undefined;
    for (;;) {
      const rows = await listAuditEvents(this.db, filter, before, CSV_BATCH);
      yield rows
        .map((r) =>
          csvLine([
            r.at.toISOString(),
            r.action,
            r.outcome,
            r.httpStatus,
            r.userName,
            r.role,
            r.patientName,
            r.chartNumber,
            r.recordType,
            r.recordId,
            r.route,
            r.address,
            r.userAgent,
            json(r.query),
            json(r.before),
            json(r.after),
          ]),
        )
        .join('');
      if (rows.length < CSV_BATCH) return;
      before = rows[rows.length - 1].id;
    }
  }
}
