// The Recall desk in one SQL statement: filtered, sorted and paged in PostgreSQL, scoped to the
// practice (and the user's shares) in the where clause. Indexes used: recalls_patient_idx,
// recall_exams_site_idx (latest exam per site), recall_exams_patient_idx, recall_exams_supersedes_unique,
// recall_exams_peri_implantitis_idx,
// implant_sites_practice_idx / the patient FK look-ups. See scripts/bench-recall-desk.mjs for timings.
import { sql, type SQL } from 'drizzle-orm';
import { DESK_DUE_SOON_DAYS, type RecallDeskCsvQuery, type RecallDeskRow } from '@torquetrail/contracts';
import type pg from 'pg';
import type { Db } from '../db/database.js';
import { cursorBatches } from '../db/cursor.js';
import type { Scope } from '../authz/scope.js';

const escapeLike = (text: string) => text.replace(/[\\%_]/g, (c) => `\\${c}`);

const SORTS: Record<RecallDeskCsvQuery['sort'], string> = {
  dueOn: 'next_due',
  // Overdue days grow as the due date recedes: the same order as the due date, reversed.
  overdueDays: 'overdue_days',
  name: 'family_name',
  lastExamOn: 'last_exam',
};

export interface DeskPage {
  rows: RecallDeskRow[];
  total: number;
}

interface DeskSqlRow {
  id: string;
  chart_number: string;
  given_name: string;
  family_name: string;
  smoker: boolean;
  diabetes_poorly_controlled: boolean;
  periodontitis_history: boolean;
  prior_pi: boolean;
  next_due_on: string | null;
  overdue_days: number;
  last_exam_on: string | null;
  sites: { siteId: string; fdi: number; status: string | null; examinedOn: string | null }[];
  total: number;
}

export async function queryDesk(
  db: Db,
  scope: Scope,
  today: string,
  q: RecallDeskCsvQuery,
  page: { limit: number; offset: number },
): Promise<DeskPage> {
  const result = await db.execute<DeskSqlRow & Record<string, unknown>>(deskStatement(scope, today, q, page));
  const rows = result.rows.map(toDeskRow);
  return { rows, total: result.rows[0]?.total ?? (page.offset > 0 ? await countOnly() : 0) };

  // A page past the end has no rows to carry the window count; count separately then.
  async function countOnly(): Promise<number> {
    const again = await queryDesk(db, scope, today, q, { limit: 1, offset: 0 });
    return again.total;
  }
}

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
): AsyncGenerator<RecallDeskRow[], void> {
  for await (const batch of cursorBatches<DeskSqlRow>(pool, deskStatement(scope, today, q, { limit, offset: 0 }), 500))
    yield batch.map(toDeskRow);
}

function deskStatement(
  scope: Scope,
  today: string,
  q: RecallDeskCsvQuery,
  page: { limit: number; offset: number },
): SQL {
  const visible: SQL =
    scope.sharedPatientIds.length > 0
      ? sql`(pa.practice_id = ${scope.practiceId} or pa.id in (${sql.join(
          scope.sharedPatientIds.map((id) => sql`${id}::uuid`),
          sql`, `,
        )}))`
      : sql`pa.practice_id = ${scope.practiceId}`;
  const filters: SQL[] = [visible];
  if (q.archived === 'active') filters.push(sql`pa.archived_at is null`);
  if (q.archived === 'archived') filters.push(sql`pa.archived_at is not null`);
  if (q.search) {
    for (const word of q.search.split(/\s+/).filter(Boolean).slice(0, 5)) {
      const pattern = `%${escapeLike(word)}%`;
      filters.push(
        sql`(pa.given_name ilike ${pattern} or pa.family_name ilike ${pattern} or pa.chart_number ilike ${pattern})`,
      );
    }
  }
  // The due filters start from the scheduled recalls in their window (recalls_practice_due_idx):
  // a patient whose next recall falls in it has a scheduled recall in it, so this only narrows the
  // patients the next-due test below decides on, from the whole practice to a few hundred.
  const visibleRecall: SQL =
    scope.sharedPatientIds.length > 0
      ? sql`(r.practice_id = ${scope.practiceId} or r.patient_id in (${sql.join(
          scope.sharedPatientIds.map((id) => sql`${id}::uuid`),
          sql`, `,
        )}))`
      : sql`r.practice_id = ${scope.practiceId}`;
  const scheduledIn = (window: SQL) =>
    sql`pa.id in (select r.patient_id from recalls r where ${visibleRecall} and r.status = 'scheduled' and ${window})`;
  if (q.filter === 'due-this-week')
    filters.push(scheduledIn(sql`r.due_on between ${today}::date and (${today}::date + ${DESK_DUE_SOON_DAYS}::int)`));
  if (q.filter === 'overdue') filters.push(scheduledIn(sql`r.due_on < ${today}::date`));
  const outer: SQL[] = [sql`true`];
  if (q.filter === 'due-this-week')
    outer.push(sql`next_due between ${today}::date and (${today}::date + ${DESK_DUE_SOON_DAYS}::int)`);
  if (q.filter === 'overdue') outer.push(sql`next_due < ${today}::date`);
  if (q.filter === 'peri-implantitis-last') outer.push(sql`coalesce(last_pi, false)`);

  const dir = q.dir === 'desc' ? sql.raw('desc') : sql.raw('asc');
  // Patients never scheduled or never examined go last whichever the direction.
  const nulls = sql.raw('nulls last');
  const sortCol = sql.raw(SORTS[q.sort]);

  // Two phases: the sort and filter keys for every patient (cheap index look-ups), then the page;
  // the per-implant statuses and the derived risk factor only for the rows of the page.
  // "Peri-implantitis last time": a current peri-implantitis exam of an examinable site with no
  // later current exam of that site. Starts from the practice's peri-implantitis exams (a partial
  // index, recall_exams_peri_implantitis_idx), a few per hundred, not from every exam.
  const visibleExam: SQL =
    scope.sharedPatientIds.length > 0
      ? sql`(x.practice_id = ${scope.practiceId} or x.patient_id in (${sql.join(
          scope.sharedPatientIds.map((id) => sql`${id}::uuid`),
          sql`, `,
        )}))`
      : sql`x.practice_id = ${scope.practiceId}`;
  const lastPi = sql`(pa.id in (
      select x.patient_id
      from recall_exams x join implant_sites s on s.id = x.site_id and s.status in ('placed', 'restored')
      where ${visibleExam} and x.status = 'peri-implantitis'
        and not exists (select 1 from recall_exams x2 where x2.supersedes_id = x.id)
        and not exists (
          select 1 from recall_exams y
          where y.site_id = x.site_id and (y.examined_on, y.recorded_at) > (x.examined_on, x.recorded_at)
            and not exists (select 1 from recall_exams y2 where y2.supersedes_id = y.id))))`;
  return sql`
    with keys as (
      select pa.id, pa.family_name, pa.given_name,
             (select min(r.due_on) from recalls r where r.patient_id = pa.id and r.status = 'scheduled') as next_due,
             (select x.examined_on from recall_exams x
               where x.patient_id = pa.id and not exists (select 1 from recall_exams x2 where x2.supersedes_id = x.id)
               order by x.examined_on desc limit 1) as last_exam,
             ${q.filter === 'peri-implantitis-last' ? lastPi : sql`null::boolean`} as last_pi
      from patients pa
      where ${sql.join(filters, sql` and `)}
        and exists (select 1 from implant_sites s where s.patient_id = pa.id and s.status in ('placed', 'restored'))
    ),
    filtered as (
      select keys.*, greatest(0, coalesce(${today}::date - next_due, 0))::int as overdue_days from keys
      where ${sql.join(outer, sql` and `)}
    ),
    page as (
      select filtered.*, count(*) over ()::int as total from filtered
      order by ${sortCol} ${dir} ${nulls}, family_name asc, given_name asc, id asc
      limit ${page.limit} offset ${page.offset}
    )
    select page.id, page.total, page.overdue_days, page.next_due::text as next_due_on, page.last_exam::text as last_exam_on,
           pa.chart_number, pa.given_name, pa.family_name, pa.smoker, pa.diabetes_poorly_controlled, pa.periodontitis_history,
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
           ), '[]'::json) as sites
    from page join patients pa on pa.id = page.id
    order by ${sql.raw(`page.${SORTS[q.sort]}`)} ${dir} ${nulls}, page.family_name asc, page.given_name asc, page.id asc
  `;
}

function toDeskRow(r: DeskSqlRow): RecallDeskRow {
  return {
    patientId: r.id,
    chartNumber: r.chart_number,
    name: `${r.given_name} ${r.family_name}`,
    nextDueOn: r.next_due_on,
    overdueDays: r.overdue_days,
    lastExamOn: r.last_exam_on,
    sites: r.sites.map((s) => ({
      siteId: s.siteId,
      fdi: s.fdi,
      status: (s.status ?? 'not-examined') as RecallDeskRow['sites'][number]['status'],
      lastExamOn: s.examinedOn,
    })),
    riskFactors: {
      smoker: r.smoker,
      diabetesPoorlyControlled: r.diabetes_poorly_controlled,
      periodontitisHistory: r.periodontitis_history,
      priorPeriImplantitis: r.prior_pi,
    },
  };
}
