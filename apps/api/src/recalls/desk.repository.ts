// The Recall desk: filtered, sorted and paged in PostgreSQL, scoped to the practice (and the
// user's shares) in the where clause. The order is walked from an index (desk-order.repository.ts);
// the per-row reads use recall_exams_site_idx (latest exam per site), recall_exams_patient_idx,
// recall_exams_supersedes_unique and recalls_patient_idx. Timings: npm run bench (docs/performance.md).
import { sql, type SQL } from 'drizzle-orm';
import type { RecallDeskCsvQuery, RecallDeskRow } from '@torquetrail/contracts';
import type pg from 'pg';
import type { Db } from '../db/database.js';
import { cursorBatches } from '../db/cursor.js';
import type { Scope } from '../authz/scope.js';
import { deskOrder, latestCurrentExamOn, overdueInsertReviews } from './desk-order.repository.js';

/** A desk row with the patient's contact details, for the CSV only (the service decides who sees them). */
export interface DeskRowWithContact extends RecallDeskRow {
  phone: string | null;
  email: string | null;
}

export interface DeskPage {
  rows: DeskRowWithContact[];
  total: number;
}

interface DeskSqlRow {
  id: string;
  chart_number: string;
  given_name: string;
  family_name: string;
  phone: string | null;
  email: string | null;
  smoker: boolean;
  diabetes_poorly_controlled: boolean;
  periodontitis_history: boolean;
  prior_pi: boolean;
  next_due_on: string | null;
  overdue_days: number;
  last_exam_on: string | null;
  sites: { siteId: string; fdi: number; status: string | null; examinedOn: string | null }[];
  provisionals_overdue: { restorationId: string; fdis: number[]; plannedReplacementOn: string }[];
  insert_reviews_overdue: { restorationId: string; fdis: number[]; lastChangeOn: string | null; reviewDueOn: string }[];
}

export async function queryDesk(
  db: Db,
  scope: Scope,
  today: string,
  q: RecallDeskCsvQuery,
  page: { limit: number; offset: number },
): Promise<DeskPage> {
  // The page and its count side by side, on two connections: the count visits every patient of the
  // filter (exact, never an estimate: it is a clinical list), the page only the rows up to the page,
  // so the reply waits for the slower of the two rather than for both one after the other.
  const [result, counted] = await Promise.all([
    db.execute<DeskSqlRow & Record<string, unknown>>(deskStatement(scope, today, q, page)),
    db.execute<{ total: number } & Record<string, unknown>>(
      deskOrder(scope, today, q, page.offset + page.limit).countStatement,
    ),
  ]);
  return { rows: result.rows.map(toDeskRow), total: counted.rows[0]?.total ?? 0 };
}

/** Rows per FETCH of an export: 5 round trips for 10 000 patients, about 1 MB of rows held at a time. */
const CSV_BATCH_ROWS = 2000;

/**
 * Every row of the desk in its order, in batches through a cursor (an export): the API holds one
 * batch at a time. At most `limit` rows.
 */
export async function* streamDesk(
  pool: pg.Pool,
  scope: Scope,
  today: string,
  q: RecallDeskCsvQuery,
  limit: number,
): AsyncGenerator<DeskRowWithContact[], void> {
  for await (const batch of cursorBatches<DeskSqlRow>(
    pool,
    deskStatement(scope, today, q, { limit, offset: 0 }),
    CSV_BATCH_ROWS,
  ))
    yield batch.map(toDeskRow);
}

/**
 * The desk in one statement, in two phases: the page's patients in order, walked from an index
 * (desk-order.repository.ts) so that only the rows up to the page are read, then for those rows
 * only their next recall, last exam, per-implant statuses and prior peri-implantitis. The page's
 * count is a statement of its own (`DeskOrder.countStatement`).
 */
function deskStatement(
  scope: Scope,
  today: string,
  q: RecallDeskCsvQuery,
  page: { limit: number; offset: number },
): SQL {
  const order = deskOrder(scope, today, q, page.offset + page.limit);
  return sql`
    with ${order.ctes},
    page as (select * from ordered order by ${order.orderBy('ordered')} limit ${page.limit} offset ${page.offset}),
    keyed as (
      -- The next recall in a lateral aggregate: read once per row, though two columns use it.
      select page.*, nd.next_due, (${latestCurrentExamOn(sql`page.id`)}) as last_exam
      from page cross join lateral (
        select min(r.due_on) as next_due from recalls r where r.patient_id = page.id and r.status = 'scheduled'
      ) nd
    )
    select keyed.id,
           greatest(0, coalesce(${today}::date - keyed.next_due, 0))::int as overdue_days,
           keyed.next_due::text as next_due_on, keyed.last_exam::text as last_exam_on,
           pa.chart_number, pa.given_name, pa.family_name, pa.phone, pa.email, pa.smoker, pa.diabetes_poorly_controlled, pa.periodontitis_history,
           exists (select 1 from recall_exams pe where pe.patient_id = pa.id and pe.status = 'peri-implantitis'
                    and not exists (select 1 from recall_exams s2 where s2.supersedes_id = pe.id)) as prior_pi,
           coalesce((
             select json_agg(json_build_object('siteId', s.id, 'fdi', s.fdi, 'status', e.status, 'examinedOn', e.examined_on) order by s.fdi)
             from implant_sites s
             left join lateral (
               select x.status, x.examined_on from recall_exams x
               where x.site_id = s.id and not exists (select 1 from recall_exams x2 where x2.supersedes_id = x.id)
               order by x.examined_on desc, x.recorded_at desc limit 1
             ) e on true
             where s.patient_id = pa.id and s.status in ('placed', 'restored')
           ), '[]'::json) as sites,
           coalesce((
             select json_agg(json_build_object('restorationId', rp.id, 'plannedReplacementOn', rp.planned_replacement_on,
                      'fdis', (select json_agg(s.fdi order by s.fdi) from restoration_sites rs
                               join implant_sites s on s.id = rs.site_id where rs.restoration_id = rp.id))
                    order by rp.planned_replacement_on)
             from restorations rp
             where rp.patient_id = pa.id and rp.provisional and rp.status = 'delivered'
               and rp.planned_replacement_on < ${today}::date
           ), '[]'::json) as provisionals_overdue,
           coalesce((
             select json_agg(json_build_object('restorationId', o.id, 'lastChangeOn', o.last_change, 'reviewDueOn', o.due_on,
                      'fdis', (select json_agg(s.fdi order by s.fdi) from restoration_sites rs
                               join implant_sites s on s.id = rs.site_id where rs.restoration_id = o.id))
                    order by o.due_on)
             from (${overdueInsertReviews(today, sql`ro.patient_id = pa.id`)}) o
           ), '[]'::json) as insert_reviews_overdue
    from keyed join patients pa on pa.id = keyed.id
    order by ${order.orderBy('keyed')}
  `;
}

function toDeskRow(r: DeskSqlRow): DeskRowWithContact {
  return {
    patientId: r.id,
    chartNumber: r.chart_number,
    name: `${r.given_name} ${r.family_name}`,
    phone: r.phone,
    email: r.email,
    nextDueOn: r.next_due_on,
    overdueDays: r.overdue_days,
    lastExamOn: r.last_exam_on,
    sites: r.sites.map((s) => ({
      siteId: s.siteId,
      fdi: s.fdi,
      status: (s.status ?? 'not-examined') as RecallDeskRow['sites'][number]['status'],
      lastExamOn: s.examinedOn,
    })),
    provisionalsOverdue: r.provisionals_overdue.map((p) => ({ ...p, fdis: p.fdis ?? [] })),
    insertReviewsOverdue: r.insert_reviews_overdue.map((p) => ({ ...p, fdis: p.fdis ?? [] })),
    riskFactors: {
      smoker: r.smoker,
      diabetesPoorlyControlled: r.diabetes_poorly_controlled,
      periodontitisHistory: r.periodontitis_history,
      priorPeriImplantitis: r.prior_pi,
    },
  };
}
