// The Recall desk's filter and order, read from its summary (recall_summaries, ADR 0009): one row
// per patient holding what each filter and order needs (next recall, last exam, per-site latest
// status, peri-implantitis flags, provisional due), kept by PostgreSQL triggers in the transaction
// of every write to its sources. Each order has an index in its exact terms (recall_summaries_*_idx,
// nulls last, ties by name), so a first page reads the first rows of one index and stops, and the
// count reads the practice's desk rows of one index; no statement reads exams, recalls or sites.
//
// A new filter: a column of recall_summaries kept by recall_summary_refresh (the migration), a
// condition in `FILTERS` below, and an index when the filter is narrow and orders by a key of its own.
import { type Placeholder, sql, type SQL } from 'drizzle-orm';
import { DESK_DUE_SOON_DAYS, type RecallDeskCsvQuery } from '@torquetrail/contracts';
import type { Scope } from '../authz/scope.js';

const escapeLike = (text: string) => text.replace(/[\\%_]/g, (c) => `\\${c}`);

const inScope = (scope: Scope): SQL =>
  scope.sharedPatientIds.length > 0
    ? sql`(rs.practice_id = ${scope.practiceId} or rs.patient_id in (${sql.join(
        scope.sharedPatientIds.map((id) => sql`${id}::uuid`),
        sql`, `,
      )}))`
    : sql`rs.practice_id = ${scope.practiceId}`;

/** Each filter's condition on the summary row `rs`. */
const FILTERS: Record<RecallDeskCsvQuery['filter'], (today: string, scope: Scope) => SQL | null> = {
  all: () => null,
  overdue: (today) => sql`rs.next_due < ${today}::date`,
  // A recall due within the week and none overdue: the earliest scheduled recall is in the window.
  'due-this-week': (today) => sql`rs.next_due between ${today}::date and (${today}::date + ${DESK_DUE_SOON_DAYS}::int)`,
  // An examinable site whose latest current exam found peri-implantitis.
  'peri-implantitis-last': () => sql`rs.peri_implantitis_last`,
  // A delivered provisional past its planned replacement day.
  'provisional-overdue': (today) => sql`rs.provisional_due < ${today}::date`,
  // An overdenture whose insert review is overdue. Not a summary column: the review date follows the
  // practice's interval, which an admin may change; overdentures are few, so the set is computed once
  // per statement (an uncorrelated IN) from the practice's own delivered overdentures (insert
  // changes are never shared).
  'insert-review-overdue': (today, scope) =>
    sql`rs.patient_id in (select o.patient_id from (${overdueInsertReviews(
      today,
      sql`ro.practice_id = ${scope.practiceId}`,
    )}) o)`,
};

/**
 * The delivered overdentures (current versions) whose insert review is overdue on `today`: the last
 * current insert change on any of their sites since delivery — or the delivery when none — plus the
 * practice's interval in months (PostgreSQL clamps the day like addCalendarMonths in the domain),
 * is before today (insertReviewOverdue in @torquetrail/domain). Columns: id, patient_id,
 * last_change, due_on. `where` narrows the restorations (alias ro).
 */
export const overdueInsertReviews = (today: string | Placeholder, where: SQL) =>
  sql`select ro.id, ro.patient_id, lc.last_change, due.due_on
      from restorations ro
      join practices pr on pr.id = ro.practice_id
      cross join lateral (
        select max(ic.changed_on) as last_change from insert_changes ic
        join restoration_sites irs on irs.site_id = ic.site_id and irs.restoration_id = ro.id
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
   * A common table expression `ordered` of the summary rows in order (every column of
   * recall_summaries, plus grp and key for the order), the first `limit` at most.
   */
  ctes: SQL;
  /** Their order, for the columns of `ordered` (or a relation with the same columns) under the alias given. */
  orderBy: (alias: string) => SQL;
  /** How many patients the desk has under this filter (for the page count), as a statement of its own. */
  countStatement: SQL;
}

/** The desk's patients in order, from the summary's indexes; `limit` rows at most. */
export function deskOrder(scope: Scope, today: string, q: RecallDeskCsvQuery, limit: number): DeskOrder {
  const where: SQL[] = [inScope(scope), sql`rs.on_desk`];
  if (q.archived === 'active') where.push(sql`not rs.archived`);
  if (q.archived === 'archived') where.push(sql`rs.archived`);
  const words = (q.search ?? '').split(/\s+/).filter(Boolean).slice(0, 5);
  if (words.length > 0) {
    const matches = words.map((word) => {
      const pattern = `%${escapeLike(word)}%`;
      return sql`(pa.given_name ilike ${pattern} or pa.family_name ilike ${pattern} or pa.chart_number ilike ${pattern})`;
    });
    where.push(
      sql`exists (select 1 from patients pa where pa.id = rs.patient_id and ${sql.join(matches, sql` and `)})`,
    );
  }
  const filter = FILTERS[q.filter](today, scope);
  if (filter) where.push(filter);
  const cond = sql.join(where, sql` and `);
  const dir = sql.raw(q.dir === 'desc' ? 'desc' : 'asc');
  const countStatement = sql`select count(*)::int as total from recall_summaries rs where ${cond}`;
  const rows = sql`${limit}::int`;
  const names = (a: string) => sql.raw(`${a}.family_name, ${a}.given_name, ${a}.patient_id`);

  /** One walk of one index: the rows in order of `key` (nulls last), ties by name. */
  const byKey = (key: string) => ({
    ctes: sql`ordered as (select rs.*, 0 as grp, rs.${sql.raw(key)} as key from recall_summaries rs where ${cond}
                order by rs.${sql.raw(key)} ${dir} nulls last, ${names('rs')} limit ${rows})`,
    orderBy: (a: string) => sql`${sql.raw(a)}.${sql.raw(key)} ${dir} nulls last, ${names(a)}`,
    countStatement,
  });
  if (q.sort === 'name') {
    return {
      ctes: sql`ordered as (select rs.*, 0 as grp, null::date as key from recall_summaries rs where ${cond}
                  order by rs.family_name ${dir}, rs.given_name, rs.patient_id limit ${rows})`,
      orderBy: (a) => sql`${sql.raw(a)}.family_name ${dir}, ${sql.raw(a)}.given_name, ${sql.raw(a)}.patient_id`,
      countStatement,
    };
  }
  if (q.sort === 'dueOn') return byKey('next_due');
  if (q.sort === 'lastExamOn') return byKey('last_exam_on');
  // Overdue days (today − next recall, 0 when not overdue): the overdue by next recall (descending
  // days: earliest first), the others (0 days) by name; each part walks its own index and stops at
  // `limit`, the smaller days first when ascending.
  const late = sql`rs.next_due < ${today}::date`;
  const lateFirst = q.dir === 'desc';
  const keyDir = sql.raw(lateFirst ? 'asc' : 'desc');
  const lateRows = sql`select rs.*, ${lateFirst ? 0 : 1} as grp, rs.next_due as key from recall_summaries rs
      where ${cond} and ${late} order by rs.next_due ${keyDir}, ${names('rs')} limit ${rows}`;
  const onTimeRows = sql`select rs.*, ${lateFirst ? 1 : 0} as grp, null::date as key from recall_summaries rs
      where ${cond} and not coalesce(${late}, false) order by ${names('rs')} limit ${rows}`;
  return {
    // Under the overdue filter every row is late: no second part.
    ctes:
      q.filter === 'overdue'
        ? sql`ordered as (${lateRows})`
        : sql`ordered as ((${lateRows}) union all (${onTimeRows}))`,
    orderBy: (a) => sql`${sql.raw(a)}.grp, ${sql.raw(a)}.key ${keyDir}, ${names(a)}`,
    countStatement,
  };
}
