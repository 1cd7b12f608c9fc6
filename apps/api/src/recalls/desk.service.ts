import { Inject, Injectable } from '@nestjs/common';
import { type AppAbility, readableFields, subject } from '@torquetrail/authz';
import type { RecallDeskCsvQuery, RecallDeskQuery, RecallDeskReply, RecallDeskRow } from '@torquetrail/contracts';
import type { Scope } from '../authz/scope.js';
import { DB, type Database } from '../db/database.js';
import { queryDesk } from './desk.repository.js';
import { csvLine } from '@torquetrail/contracts';
import { RecallClock } from './recall-clock.js';

/** Most rows one CSV export carries (a whole practice of 10 000 patients fits). */
const CSV_MAX_ROWS = 50_000;

@Injectable()
export class DeskService {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly clock: RecallClock,
  ) {}

  async page(ability: AppAbility, scope: Scope, q: RecallDeskQuery): Promise<RecallDeskReply> {
    const today = this.clock.today();
    const { rows, total } = await queryDesk(this.db, scope, today, q, {
      limit: q.pageSize,
      offset: (q.page - 1) * q.pageSize,
    });
    return { items: sharedLeastPrivilege(ability, scope, rows), total, page: q.page, pageSize: q.pageSize, today };
  }

  async csv(ability: AppAbility, scope: Scope, q: RecallDeskCsvQuery): Promise<string> {
    const today = this.clock.today();
    const found = await queryDesk(this.db, scope, today, q, { limit: CSV_MAX_ROWS, offset: 0 });
    const rows = sharedLeastPrivilege(ability, scope, found.rows);
    const risk = (r: RecallDeskRow['riskFactors']) =>
      !r
        ? ''
        : [
            r.smoker && 'smoker',
            r.diabetesPoorlyControlled && 'diabetes (poorly controlled)',
            r.periodontitisHistory && 'periodontitis history',
            r.priorPeriImplantitis && 'prior peri-implantitis',
          ]
            .filter(Boolean)
            .join('; ');
    let out = csvLine([
      'chart number',
      'patient',
      'next recall',
      'overdue days',
      'last exam',
      'last status per implant',
      'risk factors',
    ]);
    for (const r of rows) {
      out += csvLine([
        r.chartNumber,
        r.name,
        r.nextDueOn,
        r.overdueDays,
        r.lastExamOn,
        r.sites.map((s) => `${s.fdi}: ${s.status}`).join('; '),
        risk(r.riskFactors),
      ]);
    }
    return out;
  }
}

/**
 * A shared patient's row as the share's CASL rules allow (issue 12): only the sites whose exams the
 * share opens (none: the row is left out) and the risk factors only where the patient's field
 * rules name them. Rows of the user's own practice pass whole.
 */
function sharedLeastPrivilege(ability: AppAbility, scope: Scope, rows: RecallDeskRow[]): RecallDeskRow[] {
  const shared = new Set(scope.sharedPatientIds);
  return rows.flatMap((row) => {
    if (!shared.has(row.patientId)) return [row];
    const sites = row.sites.filter((s) =>
      ability.can('read', subject('RecallExam', { patientId: row.patientId, siteId: s.siteId })),
    );
    if (sites.length === 0) return [];
    const fields = readableFields(ability, 'Patient', { id: row.patientId });
    const { riskFactors, ...rest } = row;
    return [{ ...rest, sites, ...(fields === null || fields.includes('riskFactors') ? { riskFactors } : {}) }];
  });
}
