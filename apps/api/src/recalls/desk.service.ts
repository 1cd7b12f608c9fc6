import { Inject, Injectable } from '@nestjs/common';
import { type AppAbility, readableFields, subject } from '@torquetrail/authz';
import type { RecallDeskCsvQuery, RecallDeskQuery, RecallDeskReply, RecallDeskRow } from '@torquetrail/contracts';
import type { Scope } from '../authz/scope.js';
import { DB, type Database } from '../db/database.js';
import { type DeskRowWithContact, queryDesk } from './desk.repository.js';
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
    // The desk on screen shows no contact details: they go to the CSV only, to call or write to the patient.
    const items = sharedLeastPrivilege(ability, scope, rows).map(({ contact: _contact, ...row }) => row);
    return { items, total, page: q.page, pageSize: q.pageSize, today };
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
    // Phone and e-mail columns when the user may read a patient's contact details (CASL field
    // rules, row by row): never for a shared patient, so never in a surgeon's export of shares.
    const withContact = rows.some((r) => r.contact);
    let out = csvLine([
      'chart number',
      'patient',
      ...(withContact ? ['phone', 'e-mail'] : []),
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
        ...(withContact ? [r.contact?.phone ?? '', r.contact?.email ?? ''] : []),
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

/** A desk row as the user may see it, with the contact details only where the field rules open them. */
type VisibleDeskRow = RecallDeskRow & { contact?: { phone: string | null; email: string | null } };

/**
 * A shared patient's row as the share's CASL rules allow (issue 12): only the sites whose exams the
 * share opens (none: the row is left out) and the risk factors only where the patient's field
 * rules name them. Rows of the user's own practice pass whole. Contact details (phone, e-mail)
 * follow the same field rules, for every row.
 */
function sharedLeastPrivilege(ability: AppAbility, scope: Scope, rows: DeskRowWithContact[]): VisibleDeskRow[] {
  const shared = new Set(scope.sharedPatientIds);
  return rows.flatMap(({ phone, email, ...row }) => {
    const own = !shared.has(row.patientId);
    const fields = readableFields(
      ability,
      'Patient',
      own ? { id: row.patientId, practiceId: scope.practiceId } : { id: row.patientId },
    );
    const contact = fields === null || (fields.includes('phone') && fields.includes('email'));
    const withContact = (r: RecallDeskRow): VisibleDeskRow => (contact ? { ...r, contact: { phone, email } } : r);
    if (own) return [withContact(row)];
    const sites = row.sites.filter((s) =>
      ability.can('read', subject('RecallExam', { patientId: row.patientId, siteId: s.siteId })),
    );
    if (sites.length === 0) return [];
    const { riskFactors, ...rest } = row;
    return [
      withContact({ ...rest, sites, ...(fields === null || fields.includes('riskFactors') ? { riskFactors } : {}) }),
    ];
  });
}
