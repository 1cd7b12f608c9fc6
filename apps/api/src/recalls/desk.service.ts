import { Readable } from 'node:stream';
import { Inject, Injectable } from '@nestjs/common';
import type pg from 'pg';
import { type AppAbility, readableFields, subject } from '@torquetrail/authz';
import type { RecallDeskCsvQuery, RecallDeskQuery, RecallDeskReply, RecallDeskRow } from '@torquetrail/contracts';
import type { Scope } from '../authz/scope.js';
import { DB, type Database, PG_POOL } from '../db/database.js';
import { type DeskRowWithContact, queryDesk, streamDesk } from './desk.repository.js';
import { copyDeskCsv, deskCsvColumns, RISK_WORDS } from './desk-csv.repository.js';
import { crlfRecords } from '../common/csv-record-ends.js';
import { csvField, csvLine } from '@torquetrail/contracts';
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
    const { rows, total } = await queryDesk(this.db, this.pool, scope, today, q, {
      limit: q.pageSize,
      offset: (q.page - 1) * q.pageSize,
    });
    // The desk on screen shows no contact details: they go to the CSV only, to call or write to the
    // patient, so their field rules are not even asked (a CASL field check per row was a tenth of
    // the page's API time).
    const items = sharedLeastPrivilege(ability, scope, rows, { contact: false });
    return { items, total, page: q.page, pageSize: q.pageSize, today };
  }

  /**
   * The desk as CSV, streamed. The header's phone and e-mail columns are there when the user may read
   * the contact details of their own practice's patients (decided before the first row, as the
   * header leaves first).
   *
   * A scope of the user's own practice alone (everyone but a surgeon with shares): PostgreSQL writes
   * the CSV (COPY, desk-csv.repository.ts) and the API passes its bytes on, so the export holds a
   * chunk or two whatever its size. Every row then follows the same field rules (the own practice's
   * Patient rules name no patient), so the header's decision holds for each row's contact cells.
   *
   * With shares: rows read in batches through a cursor, each cut down by the share's CASL rules here.
   * Either way the first bytes are read before the reply starts, so a failing query (PostgreSQL
   * away) still answers with its error status rather than a cut file.
   */
  async csv(ability: AppAbility, scope: Scope, q: RecallDeskCsvQuery): Promise<Readable> {
    const withContact = mayReadContact(readableFields(ability, 'Patient', { practiceId: scope.practiceId }));
    if (scope.sharedPatientIds.length === 0) {
      const bytes = await copyDeskCsv(this.pool, scope, this.clock.today(), q, CSV_MAX_ROWS, withContact);
      const stream = Readable.from(crlfRecords(bytes), { objectMode: false });
      // A download cancelled before its first read never starts the generators: end the COPY here too.
      stream.once('close', () => {
        bytes.return(undefined).catch(() => {});
      });
      return stream;
    }
    return this.csvWithShares(ability, scope, q, withContact);
  }

  private async csvWithShares(
    ability: AppAbility,
    scope: Scope,
    q: RecallDeskCsvQuery,
    withContact: boolean,
  ): Promise<Readable> {
    const batches = streamDesk(this.pool, scope, this.clock.today(), q, CSV_MAX_ROWS);
    const first = await batches.next();
    // Each row's cells follow the CASL field rules of that row: a shared patient's contact cells are always empty.
    async function* lines(): AsyncGenerator<string, void> {
      yield csvHeader(withContact);
      if (first.done) return;
      yield csvRows(ability, scope, first.value, withContact);
      for await (const batch of batches) {
        const text = csvRows(ability, scope, batch, withContact);
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

const csvHeader = (withContact: boolean) => csvLine(deskCsvColumns(withContact));

const riskText = (r: RecallDeskRow['riskFactors']) =>
  !r
    ? ''
    : [
        r.smoker && RISK_WORDS.smoker,
        r.diabetesPoorlyControlled && RISK_WORDS.diabetesPoorlyControlled,
        r.periodontitisHistory && RISK_WORDS.periodontitisHistory,
        r.priorPeriImplantitis && RISK_WORDS.priorPeriImplantitis,
      ]
        .filter(Boolean)
        .join('; ');

/**
 * A batch's CSV lines, each row as sharedLeastPrivilege lets the user see it. A row of the user's
 * own practice passes whole, so it is written as it is, with only its contact cells decided by
 * the field rules (ownContact): no copy of the row is made, as an export writes 10 000 of them and
 * the API's small young generation (ADR 0007) makes every allocation count.
 */
function csvRows(ability: AppAbility, scope: Scope, rows: DeskRowWithContact[], withContact: boolean): string {
  const shared = new Set(scope.sharedPatientIds);
  let out = '';
  for (const row of rows) {
    if (shared.has(row.patientId)) {
      for (const r of sharedLeastPrivilege(ability, scope, [row])) out += csvRow(r, r.contact, withContact);
    } else {
      out += csvRow(row, ownContact(ability, scope, row.patientId) ? row : undefined, withContact);
    }
  }
  return out;
}

function csvRow(
  r: RecallDeskRow & Pick<DeskRowWithContact, 'sitesText'>,
  contact: { phone: string | null; email: string | null } | undefined,
  withContact: boolean,
): string {
  let sites = r.sitesText ?? '';
  if (r.sitesText === undefined) for (const s of r.sites) sites += `${sites ? '; ' : ''}${s.fdi}: ${s.status}`;
  return (
    `${csvField(r.chartNumber)},${csvField(r.name)},` +
    (withContact ? `${csvField(contact?.phone ?? '')},${csvField(contact?.email ?? '')},` : '') +
    `${csvField(r.nextDueOn)},${csvField(r.overdueDays)},${csvField(r.lastExamOn)},` +
    `${csvField(sites)},${csvField(riskText(r.riskFactors))}\r\n`
  );
}

/** A desk row as the user may see it, with the contact details only where the field rules open them. */
type VisibleDeskRow = RecallDeskRow & { contact?: { phone: string | null; email: string | null } };

const mayReadContact = (fields: string[] | null) =>
  fields === null || (fields.includes('phone') && fields.includes('email'));

/** Whether the field rules open the contact details of a patient of the user's own practice. */
const ownContact = (ability: AppAbility, scope: Scope, patientId: string) =>
  mayReadContact(readableFields(ability, 'Patient', { id: patientId, practiceId: scope.practiceId }));

/**
 * A shared patient's row as the share's CASL rules allow (issue 12): only the sites whose exams the
 * share opens (none: the row is left out) and the risk factors only where the patient's field
 * rules name them. Rows of the user's own practice pass whole. Contact details (phone, e-mail)
 * follow the same field rules, for every row, and only where asked for (`contact`: the CSV).
 */
function sharedLeastPrivilege(
  ability: AppAbility,
  scope: Scope,
  rows: DeskRowWithContact[],
  { contact: askContact }: { contact: boolean } = { contact: true },
): VisibleDeskRow[] {
  const shared = new Set(scope.sharedPatientIds);
  return rows.flatMap(({ phone, email, ...row }) => {
    const own = !shared.has(row.patientId);
    if (own) {
      return [askContact && ownContact(ability, scope, row.patientId) ? { ...row, contact: { phone, email } } : row];
    }
    const fields = readableFields(ability, 'Patient', { id: row.patientId });
    const contact = askContact && mayReadContact(fields);
    const withContact = (r: RecallDeskRow): VisibleDeskRow => (contact ? { ...r, contact: { phone, email } } : r);
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
