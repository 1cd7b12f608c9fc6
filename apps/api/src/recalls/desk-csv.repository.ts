// The Recall desk's CSV written by PostgreSQL (issue 13, goal 4): `COPY (the desk's rows) TO
// STDOUT WITH (FORMAT csv, HEADER)`, streamed to the reply (db/copy-out.ts), so the API moves bytes
// and builds no row objects. Only for a scope of the user's own practice alone: a shared patient's
// row is cut down by the share's CASL rules in the API (desk.service.ts), which SQL does not know.
import { sql, type SQL } from 'drizzle-orm';
import type { RecallDeskCsvQuery } from '@torquetrail/contracts';
import type pg from 'pg';
import type { Scope } from '../authz/scope.js';
import { copyOut } from '../db/copy-out.js';
import { deskOrder } from './desk-order.repository.js';

/** The CSV's columns in order (the header's words); phone and e-mail only for a user who may read them. */
export const deskCsvColumns = (withContact: boolean) => [
  'chart number',
  'patient',
  ...(withContact ? ['phone', 'e-mail'] : []),
  'next recall',
  'overdue days',
  'last exam',
  'last status per implant',
  'risk factors',
];

/** The risk factors' words in the CSV's cell, in its order (one source for both writers). */
export const RISK_WORDS = {
  smoker: 'smoker',
  diabetesPoorlyControlled: 'diabetes (poorly controlled)',
  periodontitisHistory: 'periodontitis history',
  priorPeriImplantitis: 'prior peri-implantitis',
} as const;

/**
 * A text cell as csvField (@torquetrail/contracts) writes it: a leading = + - @ tab or CR gets a
 * `'` so a spreadsheet does not run the cell as a formula. Empty text becomes null, which COPY
 * writes as nothing (it writes an empty string as `""`); COPY quotes the rest exactly where
 * csvField does (a comma, a quote, CR or LF in the cell).
 */
const cell = (text: SQL) =>
  sql`nullif(case when left(${text}, 1) in ('=', '+', '-', '@', e'\\t', e'\\r') then '''' || ${text} else ${text} end, '')`;

/**
 * Every row of the desk under `q` as CSV bytes, header first, with CRLF still to put at each record's
 * end (common/csv-record-ends.ts). The rows and their order are the desk's (the same filter and
 * order, `deskOrder`), at most `limit`; the cells are the cursor writer's (desk.service.ts).
 */
export function copyDeskCsv(
  pool: pg.Pool,
  scope: Scope,
  today: string,
  q: RecallDeskCsvQuery,
  limit: number,
  withContact: boolean,
): Promise<AsyncGenerator<Buffer, void>> {
  if (scope.sharedPatientIds.length > 0) throw new Error('copyDeskCsv: a scope with shared patients');
  return copyOut(pool, deskCsvStatement(scope, today, q, limit, withContact), 'format csv, header');
}

function deskCsvStatement(
  scope: Scope,
  today: string,
  q: RecallDeskCsvQuery,
  limit: number,
  withContact: boolean,
): SQL {
  const order = deskOrder(scope, today, q, limit);
  const [chart, patient, phone, email, nextRecall, overdue, lastExam, sites, risks] = deskCsvColumns(true).map((name) =>
    sql.identifier(name),
  );
  const risk = (column: string, word: string) => sql`case when ${sql.raw(column)} then ${word} end`;
  return sql`
    with ${order.ctes}
    select ${cell(sql`pa.chart_number`)} as ${chart},
           ${cell(sql`pa.given_name || ' ' || pa.family_name`)} as ${patient},
           ${withContact ? sql`${cell(sql`pa.phone`)} as ${phone}, ${cell(sql`pa.email`)} as ${email},` : sql``}
           ordered.next_due::text as ${nextRecall},
           greatest(0, coalesce(${today}::date - ordered.next_due, 0))::int as ${overdue},
           ordered.last_exam_on::text as ${lastExam},
           ${cell(sql`ordered.sites_text`)} as ${sites},
           nullif(concat_ws('; ', ${risk('pa.smoker', RISK_WORDS.smoker)},
             ${risk('pa.diabetes_poorly_controlled', RISK_WORDS.diabetesPoorlyControlled)},
             ${risk('pa.periodontitis_history', RISK_WORDS.periodontitisHistory)},
             ${risk('ordered.prior_peri_implantitis', RISK_WORDS.priorPeriImplantitis)}), '') as ${risks}
    from ordered join patients pa on pa.id = ordered.patient_id
    order by ${order.orderBy('ordered')}
    limit ${limit}::int
  `;
}
