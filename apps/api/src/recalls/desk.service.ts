import { Readable } from 'node:stream';
import { Inject, Injectable } from '@nestjs/common';
import type pg from 'pg';
import { type AppAbility, readableFields, subject } from '@torquetrail/authz';
import type { RecallDeskCsvQuery, RecallDeskQuery, RecallDeskReply, RecallDeskRow } from '@torquetrail/contracts';
import type { Scope } from '../authz/scope.js';
import { DB, type Database, PG_POOL } from '../db/database.js';
import { queryDesk, streamDesk } from './desk.repository.js';
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
    return { items: sharedLeastPrivilege(ability, scope, rows), total, page: q.page, pageSize: q.pageSize, today };
  }

  /**
   * The desk as CSV, streamed: rows leave in batches read through a cursor, so an export of the
   * whole practice holds one batch in memory. The first batch is read before the reply starts, so
   * a failing query (PostgreSQL away) still answers with its error status rather than a cut file.
   */
  async csv(ability: AppAbility, scope: Scope, q: RecallDeskCsvQuery): Promise<Readable> {
    const batches = streamDesk(this.pool, scope, this.clock.today(), q, CSV_MAX_ROWS);
    const first = await batches.next();
    async function* lines(): AsyncGenerator<string, void> {
      yield CSV_HEADER;
      if (first.done) return;
      yield csvRows(sharedLeastPrivilege(ability, scope, first.value));
      for await (const batch of batches) {
        const text = csvRows(sharedLeastPrivilege(ability, scope, batch));
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

const CSV_HEADER = csvLine([
  'chart number',
  'patient',
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

function csvRows(rows: RecallDeskRow[]): string {
  let out = '';
  for (const r of rows) {
    out += csvLine([
      r.chartNumber,
      r.name,
      r.nextDueOn,
      r.overdueDays,
      r.lastExamOn,
      r.sites.map((s) => `${s.fdi}: ${s.status}`).join('; '),
      riskText(r.riskFactors),
    ]);
  }
  return out;
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
