// The Recall desk: filtered, sorted and paged in PostgreSQL from its summary (recall_summaries,
// ADR 0009), scoped to the practice (and the user's shares) in the where clause. The order is walked
// from an index of the summary (desk-order.repository.ts). Timings: npm run bench (docs/performance.md).
import { fillPlaceholders, sql, type SQL } from 'drizzle-orm';
import { PgDialect } from 'drizzle-orm/pg-core';
import type { RecallDeskCsvQuery, RecallDeskRow } from '@torquetrail/contracts';
import type pg from 'pg';
import type { Db } from '../db/database.js';
import { cursorBatches } from '../db/cursor.js';
import type { Scope } from '../authz/scope.js';
import { deskOrder, overdueInsertReviews } from './desk-order.repository.js';

/** A desk row with the patient's contact details, for the CSV only (the service decides who sees them). */
export interface DeskRowWithContact extends RecallDeskRow {
  phone: string | null;
  email: string | null;
  /**
   * The CSV only, for a row of the user's own practice: its sites as the CSV's cell writes them
   * ("fdi: status; …"), joined by PostgreSQL; `sites` is then empty. Undefined elsewhere (a shared
   * patient's sites are filtered by the share first).
   */
  sitesText?: string;
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
  /** The CSV's statement only: the sites' cell of an own practice's row, null for a shared patient's. */
  sites_text?: string | null;
  /** The page's statement only: a delivered provisional is past its day (its list is then read). */
  provisional_late?: boolean | null;
  /** Absent in the CSV's statement. */
  provisionals_overdue?: { restorationId: string; fdis: number[]; plannedReplacementOn: string }[];
  insert_reviews_overdue?: {
    restorationId: string;
    fdis: number[];
    lastChangeOn: string | null;
    reviewDueOn: string;
  }[];
}

export async function queryDesk(
  db: Db,
  pool: pg.Pool,
  scope: Scope,
  today: string,
  q: RecallDeskCsvQuery,
  page: { limit: number; offset: number },
): Promise<DeskPage> {
  // The page and its count side by side, on two connections: the count visits every patient of the
  // filter (exact, never an estimate: it is a clinical list), the page only the rows up to the page,
  // so the reply waits for the slower of the two rather than for both one after the other. The
  // page's lists of overdue provisionals and insert reviews follow the page, while the count runs.
  const counted = db.execute<{ total: number } & Record<string, unknown>>(
    deskOrder(scope, today, q, page.offset + page.limit).countStatement,
  );
  const pageRows = async () => {
    const result = await db.execute<DeskSqlRow & Record<string, unknown>>(deskStatement(scope, today, q, page));
    await withScreenLists(pool, today, result.rows);
    return result.rows;
  };
  const [rows, total] = await Promise.all([pageRows(), counted]);
  return { rows: rows.map(toDeskRow), total: total.rows[0]?.total ?? 0 };
}

/**
 * Each row's overdue provisionals and overdue insert reviews (on screen only), for the page's
 * patients. As subqueries of the page's statement they were most of its planning (2–3 ms of
 * 3–4 on the large practice) on every request, and the page's statement is planned anew each time
 * (its filters and orders differ); this statement's text never changes, so as a named statement
 * PostgreSQL parses and plans it once per connection, and it reads the page's restorations in one
 * index scan for all its patients rather than one probe per row. Only patients with something
 * overdue come back (the others get empty lists). A provisional's list is read only for the rows
 * whose summary says one is past its day (`provisional_late`), as the page's CASE did.
 */
const SCREEN_LISTS = new PgDialect().sqlToQuery(sql`
  with late as (
    select rp.patient_id,
           json_agg(json_build_object('restorationId', rp.id, 'plannedReplacementOn', rp.planned_replacement_on,
                      'fdis', (select json_agg(s.fdi order by s.fdi) from restoration_sites rs
                               join implant_sites s on s.id = rs.site_id where rs.restoration_id = rp.id))
                    order by rp.planned_replacement_on) as list
    from restorations rp
    where rp.patient_id = any(${sql.placeholder('late')}::uuid[]) and rp.provisional and rp.status = 'delivered'
      and rp.planned_replacement_on < ${sql.placeholder('today')}::date
    group by rp.patient_id
  ), reviews as (
    select o.patient_id,
           json_agg(json_build_object('restorationId', o.id, 'lastChangeOn', o.last_change, 'reviewDueOn', o.due_on,
                      'fdis', (select json_agg(s.fdi order by s.fdi) from restoration_sites rs
                               join implant_sites s on s.id = rs.site_id where rs.restoration_id = o.id))
                    order by o.due_on) as list
    from (${overdueInsertReviews(sql.placeholder('today'), sql`ro.patient_id = any(${sql.placeholder('ids')}::uuid[])`)}) o
    group by o.patient_id
  )
  select coalesce(late.patient_id, reviews.patient_id) as id,
         coalesce(late.list, '[]'::json) as provisionals_overdue,
         coalesce(reviews.list, '[]'::json) as insert_reviews_overdue
  from late full join reviews on reviews.patient_id = late.patient_id`);

async function withScreenLists(pool: pg.Pool, today: string, rows: DeskSqlRow[]): Promise<void> {
  if (rows.length === 0) return;
  const lists = await pool.query<Pick<DeskSqlRow, 'id' | 'provisionals_overdue' | 'insert_reviews_overdue'>>({
    name: 'desk_screen_lists',
    text: SCREEN_LISTS.sql,
    values: fillPlaceholders(SCREEN_LISTS.params, {
      ids: rows.map((r) => r.id),
      late: rows.filter((r) => r.provisional_late).map((r) => r.id),
      today,
    }),
  });
  const byPatient = new Map(lists.rows.map((l) => [l.id, l]));
  for (const row of rows) {
    row.provisionals_overdue = byPatient.get(row.id)?.provisionals_overdue ?? [];
    row.insert_reviews_overdue = byPatient.get(row.id)?.insert_reviews_overdue ?? [];
  }
}

/**
 * Rows per FETCH of an export: 5 round trips for 10 000 patients, about 1 MB of rows a batch (the
 * cursor reads the next batch while the API writes this one, so two are held at most).
 */
const CSV_BATCH_ROWS = 2000;

/**
 * Every row of the desk in its order, in batches through a cursor (an export): the API holds two
 * batches at a time at most. At most `limit` rows. Only the columns the CSV writes: the overdue
 * provisionals and insert reviews (a probe of each patient's restorations, 47 000 of the
 * statement's 78 000 buffers at 10 000 patients) are on screen only, so they come back empty; an
 * own practice's row brings its sites as the CSV's text (`sitesText`) rather than as JSON to parse
 * into objects (most of the API's garbage per exported row).
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
    deskStatement(scope, today, q, { limit, offset: 0 }, { screenOnly: false }),
    CSV_BATCH_ROWS,
  ))
    yield batch.map((r) => {
      const row = toDeskRow(r);
      if (typeof r.sites_text === 'string') row.sitesText = r.sites_text;
      return row;
    });
}

/**
 * The desk in one statement: the page's summary rows in order, walked from an index of
 * recall_summaries (desk-order.repository.ts) so that only the rows up to the page are read, then
 * each row's patient. The page's count is a statement of its own (`DeskOrder.countStatement`),
 * and so are the screen's overdue provisionals and insert reviews (`SCREEN_LISTS`), for which the
 * page says whose provisional is past its day (`provisional_late`). Without `screenOnly` (the CSV)
 * those lists stay empty: the CSV has no column for them.
 */
function deskStatement(
  scope: Scope,
  today: string,
  q: RecallDeskCsvQuery,
  page: { limit: number; offset: number },
  { screenOnly }: { screenOnly: boolean } = { screenOnly: true },
): SQL {
  const order = deskOrder(scope, today, q, page.offset + page.limit);
  // The CSV: a shared patient's sites as JSON (the share's rules filter them, desk.service.ts),
  // every other row's as the CSV cell's text, kept in the summary (sites_text, desk_sites_text).
  const shared =
    scope.sharedPatientIds.length > 0
      ? sql`page.patient_id in (${sql.join(
          scope.sharedPatientIds.map((id) => sql`${id}::uuid`),
          sql`, `,
        )})`
      : sql`false`;
  const forCsv = sql`case when ${shared} then page.sites else '[]'::json end as sites,
           case when ${shared} then null else page.sites_text end as sites_text`;
  const onScreen = sql`, page.provisional_due < ${today}::date as provisional_late`;
  return sql`
    with ${order.ctes},
    page as (select * from ordered order by ${order.orderBy('ordered')} limit ${page.limit} offset ${page.offset})
    select page.patient_id as id,
           greatest(0, coalesce(${today}::date - page.next_due, 0))::int as overdue_days,
           page.next_due::text as next_due_on, page.last_exam_on::text as last_exam_on,
           pa.chart_number, pa.given_name, pa.family_name, pa.phone, pa.email, pa.smoker, pa.diabetes_poorly_controlled, pa.periodontitis_history,
           page.prior_peri_implantitis as prior_pi, ${screenOnly ? sql`page.sites${onScreen}` : forCsv}
    from page join patients pa on pa.id = page.patient_id
    order by ${order.orderBy('page')}
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
    provisionalsOverdue: (r.provisionals_overdue ?? []).map((p) => ({ ...p, fdis: p.fdis ?? [] })),
    insertReviewsOverdue: (r.insert_reviews_overdue ?? []).map((p) => ({ ...p, fdis: p.fdis ?? [] })),
    riskFactors: {
      smoker: r.smoker,
      diabetesPoorlyControlled: r.diabetes_poorly_controlled,
      periodontitisHistory: r.periodontitis_history,
      priorPeriImplantitis: r.prior_pi,
    },
  };
}
