import { Readable } from 'node:stream';
import { Inject, Injectable } from '@nestjs/common';
import type pg from 'pg';
import { type AppAbility, readableFields, subject } from '@torquetrail/authz';
import type { RecallDeskCsvQuery, RecallDeskQuery, RecallDeskReply, RecallDeskRow } from '@torquetrail/contracts';
import type { Scope } from '../authz/scope.js';
import { DB, type Database, PG_POOL } from '../db/database.js';
import { type DeskRowWithContact, queryDesk, streamDesk } from './desk.repository.js';
import { csvLine } from '@torquetrail/contracts';
import { RecallClock } from './recall-clock.js';

/** Most rows one CSV export carries (a whole practice of 10 000 patients fits). */
const CSV_MAX_ROWS = 50_000;

@Injectable()
export class DeskService {
  constructor(
    @Inject(DB) private readonly db: Database,
    @Inject(PG_POOL) private readonly pool: pg.Pool,
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

  /**
   * The desk as CSV, streamed: rows leave in batches read through a cursor, so an export of the
   * whole practice holds one batch in memory. The first batch is read before the reply starts, so
   * a failing query (PostgreSQL away) still answers with its error status rather than a cut file.
   */
  async csv(ability: AppAbility, scope: Scope, q: RecallDeskCsvQuery): Promise<Readable> {
    const batches = streamDesk(this.pool, scope, this.clock.today(), q, CSV_MAX_ROWS);
    const first = await batches.next();
    // Phone and e-mail columns when the user may read the contact details of their own practice's
    // patients (decided before the first row, as the header leaves first); each row's cells then
    // follow the CASL field rules of that row: a shared patient's are always empty.
    const withContact = mayReadContact(readableFields(ability, 'Patient', { practiceId: scope.practiceId }));
    async function* lines(): AsyncGenerator<string, void> {
      yield csvHeader(withContact);
      if (first.done) return;
      yield csvRows(sharedLeastPrivilege(ability, scope, first.value), withContact);
      for await (const batch of batches) {
        const text = csvRows(sharedLeastPrivilege(ability, scope, batch), withContact);
        if (text) yield text;
      }
    }
    const stream = Readable.from(lines(), { objectMode: false });
    // A download cancelled before its first read never starts `lines`: end the cursor here too.
    stream.once('close', () => {
      batches.return(undefined).catch(() => {});
    });
    return stream;
  }
}

const csvHeader = (withContact: boolean) =>
  csvLine([
    'chart number',
    'patient',
    ...(withContact ? ['phone', 'e-mail'] : []),
    'next recall',
    'overdue days',
    'last exam',
    'last status per implant',
    'risk factors',
  ]);

const riskText = (r: RecallDeskRow['riskFactors']) =>
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

function csvRows(rows: VisibleDeskRow[], withContact: boolean): string {
  let out = '';
  for (const r of rows) {
    out += csvLine([
      r.chartNumber,
      r.name,
      ...(withContact ? [r.contact?.phone ?? '', r.contact?.email ?? ''] : []),
      r.nextDueOn,
      r.overdueDays,
      r.lastExamOn,
      r.sites.map((s) => `${s.fdi}: ${s.status}`).join('; '),
      riskText(r.riskFactors),
    ]);
  }
  return out;
}

/** A desk row as the user may see it, with the contact details only where the field rules open them. */
type VisibleDeskRow = RecallDeskRow & { contact?: { phone: string | null; email: string | null } };

const mayReadContact = (fields: string[] | null) =>
  fields === null || (fields.includes('phone') && fields.includes('email'));

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
    const contact = mayReadContact(fields);
    const withContact = (r: RecallDeskRow): VisibleDeskRow => (contact ? { ...r, contact: { phone, email } } : r);
    if (own) return [withContact(row)];
    const sites = row.sites.filter((s) =>
      ability.can('read', subject('RecallExam', { patientId: row.patientId, siteId: s.siteId })),
    );
    if (sites.length === 0) return [];
    const { riskFactors, provisionalsOverdue: _own, insertReviewsOverdue: _inserts, ...rest } = row;
    return [
      withContact({ ...rest, sites, ...(fields === null || fields.includes('riskFactors') ? { riskFactors } : {}) }),
    ];
  });
}
