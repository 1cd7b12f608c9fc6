// The Recall desk's order, walked from an index instead of computed for every patient. Each sort
// has a driver that reads the practice's rows already in the sort's order and stops after the page:
// scheduled recalls by due date (recalls_practice_due_idx; a recall counts only when it is its
// patient's earliest scheduled one), current exams by date (recall_exams_practice_examined_idx; an
// exam counts only when no later current exam of its patient exists), patients by family name
// (patients_practice_family_idx). Rows without the key (never scheduled, never examined; or, for
// overdue days, not overdue) follow in a second branch by name. Ties are broken by name in
// PostgreSQL's incremental sort, so only the rows of the page's last key are sorted.
import { sql, type SQL } from 'drizzle-orm';
import { DESK_DUE_SOON_DAYS, type RecallDeskCsvQuery } from '@torquetrail/contracts';
import type { Scope } from '../authz/scope.js';

const escapeLike = (text: string) => text.replace(/[\\%_]/g, (c) => `\\${c}`);

const inScope = (scope: Scope, practiceCol: SQL, patientCol: SQL): SQL =>
  scope.sharedPatientIds.length > 0
    ? sql`(${practiceCol} = ${scope.practiceId} or ${patientCol} in (${sql.join(
        scope.sharedPatientIds.map((id) => sql`${id}::uuid`),
        sql`, `,
      )}))`
    : sql`${practiceCol} = ${scope.practiceId}`;

/** Not replaced by an amendment. */
const current = (alias: string) =>
  sql.raw(`not exists (select 1 from recall_exams ${alias}_n where ${alias}_n.supersedes_id = ${alias}.id)`);

/**
 * The date of the patient's latest current exam: walked newest first on recall_exams_patient_idx
 * (patient_id, examined_on), stopping at the first exam no amendment replaced — usually one probe,
 * where max() over the current exams checked every exam of the patient for an amendment.
 */
export const latestCurrentExamOn = (patientId: SQL) =>
  sql`select x.examined_on from recall_exams x
      where x.patient_id = ${patientId} and not exists (select 1 from recall_exams x2 where x2.supersedes_id = x.id)
      order by x.examined_on desc limit 1`;

/**
 * The delivered overdentures (current versions) whose insert review is overdue on `today`: the last
 * current insert change on any of their sites since delivery — or the delivery when none — plus the
 * practice's interval in months (PostgreSQL clamps the day like addCalendarMonths in the domain),
 * is before today (insertReviewOverdue in @torquetrail/domain). Columns: id, patient_id,
 * last_change, due_on. `where` narrows the restorations (alias ro).
 */
export const overdueInsertReviews = (today: string, where: SQL) =>
  sql`select ro.id, ro.patient_id, lc.last_change, due.due_on
      from restorations ro
      join practices pr on pr.id = ro.practice_id
      cross join lateral (
        select max(ic.changed_on) as last_change from insert_changes ic
        join restoration_sites rs on rs.site_id = ic.site_id and rs.restoration_id = ro.id
        where ic.changed_on >= ro.delivered_on
          and not exists (select 1 from insert_changes ic2 where ic2.supersedes_id = ic.id)
      ) lc
      cross join lateral (
        select (coalesce(lc.last_change, ro.delivered_on) + make_interval(months => pr.insert_review_interval_months))::date as due_on
      ) due
      where ${where} and ro.status = 'delivered' and ro.kind in ('overdenture-studs', 'overdenture-bar')
        and not exists (select 1 from restorations rn where rn.supersedes_id = ro.id)
        and due.due_on < ${today}::date`;

export interface DeskOrder {
  /**
   * Common table expressions ending in `ordered`: the first `limit` patients in order, as id,
   * family_name, given_name, key (the driver's date) and grp (the branch, 0 first).
   */
  ctes: SQL;
  /** Their order, for the columns of `ordered` under the alias given. */
  orderBy: (alias: string) => SQL;
  /**
   * How many patients the desk has under this filter (for the page count), as a statement of its
   * own (with the CTE the filter reads), run beside the page.
   */
  countStatement: SQL;
}

/** The desk's patients in order, walked from an index; `limit` rows at most. */
export function deskOrder(scope: Scope, today: string, q: RecallDeskCsvQuery, limit: number): DeskOrder {
  const patients: SQL[] = [
    inScope(scope, sql`pa.practice_id`, sql`pa.id`),
    sql`exists (select 1 from implant_sites s where s.patient_id = pa.id and s.status in ('placed', 'restored'))`,
  ];
  if (q.archived === 'active') patients.push(sql`pa.archived_at is null`);
  if (q.archived === 'archived') patients.push(sql`pa.archived_at is not null`);
  for (const word of (q.search ?? '').split(/\s+/).filter(Boolean).slice(0, 5)) {
    const pattern = `%${escapeLike(word)}%`;
    patients.push(
      sql`(pa.given_name ilike ${pattern} or pa.family_name ilike ${pattern} or pa.chart_number ilike ${pattern})`,
    );
  }
  const scheduled = (window: SQL) =>
    sql`pa.id in (select r.patient_id from recalls r where ${inScope(scope, sql`r.practice_id`, sql`r.patient_id`)}
          and r.status = 'scheduled' and ${window})`;
  const overdue = scheduled(sql`r.due_on < ${today}::date`);
  const dueSoon = sql`${scheduled(sql`r.due_on between ${today}::date and (${today}::date + ${DESK_DUE_SOON_DAYS}::int)`)} and not ${overdue}`;
  // "Peri-implantitis last time": a current peri-implantitis exam that is its examinable site's
  // latest current exam. From the partial index of such exams (a few per hundred), each checked
  // against its site's latest exam (recall_exams_site_idx), once per statement.
  const piPatients = sql`pi_patients as materialized (
      select distinct x.patient_id
      from recall_exams x
      join implant_sites s on s.id = x.site_id and s.status in ('placed', 'restored')
      cross join lateral (
        select y.id from recall_exams y where y.site_id = x.site_id and ${current('y')}
        order by y.examined_on desc, y.recorded_at desc limit 1) latest
      where ${inScope(scope, sql`x.practice_id`, sql`x.patient_id`)} and x.status = 'peri-implantitis' and latest.id = x.id)`;
  const filter: Record<RecallDeskCsvQuery['filter'], SQL[]> = {
    all: [],
    overdue: [overdue],
    'due-this-week': [dueSoon],
    'peri-implantitis-last': [sql`pa.id in (select patient_id from pi_patients)`],
    // From the partial index restorations_provisional_due_idx (delivered provisionals only).
    'provisional-overdue': [
      sql`pa.id in (select rp.patient_id from restorations rp where ${inScope(scope, sql`rp.practice_id`, sql`rp.patient_id`)}
            and rp.provisional and rp.status = 'delivered' and rp.planned_replacement_on < ${today}::date)`,
    ],
    'insert-review-overdue': [
      sql`pa.id in (select o.patient_id from (${overdueInsertReviews(
        today,
        inScope(scope, sql`ro.practice_id`, sql`ro.patient_id`),
      )}) o)`,
    ],
  };
  const where = sql.join([...patients, ...filter[q.filter]], sql` and `);
  const withPi = q.filter === 'peri-implantitis-last' ? sql`${piPatients}, ` : sql``;
  const dir = sql.raw(q.dir === 'desc' ? 'desc' : 'asc');
  const byName = sql`pa.family_name, pa.given_name, pa.id`;
  const count = sql`(select count(*)::int from patients pa where ${where})`;

  /** Patients in the filter, by name, with `extra` conditions; in group `grp`. */
  const rest = (grp: number, extra: SQL, rows: SQL) =>
    sql`select pa.id, pa.family_name, pa.given_name, null::date as key, ${grp}::int as grp
        from patients pa where ${where} and ${extra} order by ${byName} limit ${rows}`;
  /** Each patient's earliest scheduled recall, walked by due date. */
  const byDue = (grp: number, keyDir: SQL, window: SQL, rows: SQL) =>
    sql`select pa.id, pa.family_name, pa.given_name, r.due_on as key, ${grp}::int as grp
        from recalls r join patients pa on pa.id = r.patient_id
        where ${inScope(scope, sql`r.practice_id`, sql`r.patient_id`)} and r.status = 'scheduled' and ${window}
          and not exists (select 1 from recalls r2 where r2.patient_id = r.patient_id and r2.status = 'scheduled'
                           and (r2.due_on, r2.id) < (r.due_on, r.id))
          and ${where}
        order by r.due_on ${keyDir}, ${byName} limit ${rows}`;
  /** Each patient's latest current exam, walked by date. */
  const byExam = (rows: SQL) =>
    sql`select pa.id, pa.family_name, pa.given_name, x.examined_on as key, 0 as grp
        from recall_exams x join patients pa on pa.id = x.patient_id
        where ${inScope(scope, sql`x.practice_id`, sql`x.patient_id`)} and ${current('x')}
          and not exists (select 1 from recall_exams y where y.patient_id = x.patient_id
                           and (y.examined_on, y.id) > (x.examined_on, x.id) and ${current('y')})
          and ${where}
        order by x.examined_on ${dir}, ${byName} limit ${rows}`;
  const all = sql`${limit}::int`;
  // The second branch is read only for what the first left of the page: when the first fills
  // it, the second's limit is 0 and PostgreSQL does not start it.
  const left = sql`greatest(0, ${limit}::int - (select count(*)::int from head))`;
  const one = (rows: SQL) => sql`${withPi}ordered as (${rows})`;
  const two = (first: (rows: SQL) => SQL, second: (rows: SQL) => SQL) =>
    sql`${withPi}head as materialized (${first(all)}), tail as materialized (${second(left)}),
        ordered as (select * from head union all select * from tail)`;
  const byKey = (keyDir: SQL) => (a: string) =>
    sql`${sql.raw(a)}.grp, ${sql.raw(a)}.key ${keyDir}, ${sql.raw(a)}.family_name, ${sql.raw(a)}.given_name, ${sql.raw(a)}.id`;
  const noneScheduled = sql`pa.id not in (select r.patient_id from recalls r where ${inScope(scope, sql`r.practice_id`, sql`r.patient_id`)} and r.status = 'scheduled')`;
  const dueFilter = q.filter === 'overdue';
  // A narrow filter (a search, "due this week", "peri-implantitis last time": a few hundred
  // patients at most) reads its few patients' keys instead of walking the whole practice's order.
  // So does an export (every row): there the walk's index probes would cost more than one pass.
  const narrow =
    Boolean(q.search?.trim()) ||
    q.filter === 'due-this-week' ||
    q.filter === 'peri-implantitis-last' ||
    q.filter === 'provisional-overdue' ||
    q.filter === 'insert-review-overdue' ||
    limit > 1000;
  const nextDue = sql`(select min(r.due_on) from recalls r where r.patient_id = pa.id and r.status = 'scheduled')`;
  const lastExam = sql`(${latestCurrentExamOn(sql`pa.id`)})`;
  // `offset 0` keeps the key a subquery of its own, read once per patient: flattened, PostgreSQL
  // would evaluate it once for each use (the group and the sort key).
  const keyed = (key: SQL, grp: SQL) =>
    one(sql`select pa.id, pa.family_name, pa.given_name, k.key, ${grp}::int as grp
            from patients pa cross join lateral (select ${key} as key offset 0) k where ${where}`);
  const window =
    q.filter === 'overdue'
      ? sql`r.due_on < ${today}::date`
      : q.filter === 'due-this-week'
        ? sql`r.due_on between ${today}::date and (${today}::date + ${DESK_DUE_SOON_DAYS}::int)`
        : sql`true`;
  const orders: Record<RecallDeskCsvQuery['sort'], () => Omit<DeskOrder, 'countStatement'>> = {
    name: () => ({
      ctes: one(sql`select pa.id, pa.family_name, pa.given_name, null::date as key, 0 as grp
           from patients pa where ${where} order by pa.family_name ${dir}, pa.given_name, pa.id limit ${all}`),
      orderBy: (a) => sql`${sql.raw(a)}.family_name ${dir}, ${sql.raw(a)}.given_name, ${sql.raw(a)}.id`,
    }),
    dueOn: () => {
      const due = (rows: SQL) => byDue(0, dir, window, rows);
      const ctes = narrow
        ? keyed(nextDue, sql`(k.key is null)`)
        : dueFilter // only patients with a scheduled recall: no second branch
          ? one(due(all))
          : two(due, (rows) => rest(1, noneScheduled, rows));
      return { ctes, orderBy: byKey(dir) };
    },
    overdueDays: () => {
      // Overdue days order the overdue by due date (reversed); everyone else has 0 days, by name.
      const keyDir = sql.raw(q.dir === 'desc' ? 'asc' : 'desc');
      const late = (grp: number) => (rows: SQL) => byDue(grp, keyDir, sql`r.due_on < ${today}::date`, rows);
      const onTime = (grp: number) => (rows: SQL) => rest(grp, sql`not ${overdue}`, rows);
      const ctes = narrow
        ? keyed(
            sql`(select min(r.due_on) from recalls r where r.patient_id = pa.id and r.status = 'scheduled' having min(r.due_on) < ${today}::date)`,
            q.dir === 'desc' ? sql`(k.key is null)` : sql`(k.key is not null)`,
          )
        : q.filter === 'overdue'
          ? one(late(0)(all))
          : q.dir === 'desc'
            ? two(late(0), onTime(1))
            : two(onTime(0), late(1));
      return { ctes, orderBy: byKey(keyDir) };
    },
    lastExamOn: () => ({
      // Walked newest first; oldest first would pass every older exam of every patient, so the
      // ascending order reads each patient's last exam instead.
      ctes:
        narrow || q.dir === 'asc'
          ? keyed(lastExam, sql`(k.key is null)`)
          : two(byExam, (rows) =>
              rest(
                1,
                sql`not exists (select 1 from recall_exams x where x.patient_id = pa.id and ${current('x')})`,
                rows,
              ),
            ),
      orderBy: byKey(dir),
    }),
  };
  const chosen = orders[q.sort]();
  const countStatement =
    q.filter === 'peri-implantitis-last'
      ? sql`with ${piPatients} select ${count} as total`
      : sql`select ${count} as total`;
  return { ...chosen, countStatement };
}
