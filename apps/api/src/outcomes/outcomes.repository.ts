// The implants of the outcomes view: one row per implant site with a current placement (system,
// delivered restoration, complications) for every implant in scope, which the curves count; the
// latest exam and the bone levels only for the page of implants listed. Scoped to the practice and
// the user's shares in the where clause.
import { sql, type SQL } from 'drizzle-orm';
import type { PeriImplantStatus, Retention, SiteStatus } from '@torquetrail/contracts';
import type { Scope } from '../authz/scope.js';
import type { Db } from '../db/database.js';

/**
 * The implant sites the view counts: the practice's own, every site of a patient shared whole, and
 * only the chosen sites of a patient shared site by site (`siteLimits`).
 */
function visible(scope: Scope): SQL {
  const limits = scope.siteLimits ?? {};
  const whole = scope.sharedPatientIds.filter((id) => !limits[id]);
  const chosenSites = scope.sharedPatientIds.flatMap((id) => limits[id] ?? []);
  const ids = (list: readonly string[]) =>
    sql.join(
      list.map((id) => sql`${id}::uuid`),
      sql`, `,
    );
  return sql`(pa.practice_id = ${scope.practiceId}${whole.length > 0 ? sql` or pa.id in (${ids(whole)})` : sql``}${
    chosenSites.length > 0 ? sql` or s.id in (${ids(chosenSites)})` : sql``
  })`;
}

export interface ImplantRow {
  siteId: string;
  patientId: string;
  chartNumber: string;
  fdi: number;
  status: SiteStatus;
  endedOn: string | null;
  placedOn: string;
  system: string;
  retention: Retention | null;
  deliveredOn: string | null;
  complications: number;
}

export async function listImplants(db: Db, scope: Scope): Promise<ImplantRow[]> {
  const result = await db.execute<{
    site_id: string;
    patient_id: string;
    chart_number: string;
    fdi: number;
    status: SiteStatus;
    ended_on: string | null;
    placed_on: string;
    system: string;
    retention: Retention | null;
    delivered_on: string | null;
    complications: number | string;
  }>(sql`
    select s.id as site_id, pa.id as patient_id, pa.chart_number, s.fdi, s.status, s.ended_on::text,
           pl.placed_on::text, sy.name as system, rr.retention, rr.delivered_on::text,
           (select count(*) from complications c
             where c.site_id = s.id and not exists (select 1 from complications n where n.supersedes_id = c.id)
           ) as complications
      from implant_sites s
      join patients pa on pa.id = s.patient_id
      join placements pl on pl.site_id = s.id
           and not exists (select 1 from placements n where n.supersedes_id = pl.id)
      join platforms pf on pf.id = pl.platform_id
      join implant_systems sy on sy.id = pf.system_id
      left join lateral (
        select r.retention, r.delivered_on from restoration_sites rs join restorations r on r.id = rs.restoration_id
         where rs.site_id = s.id and r.delivered_on is not null and r.status <> 'removed'
           and not exists (select 1 from restorations n where n.supersedes_id = r.id)
         order by r.delivered_on desc limit 1
      ) rr on true
     where ${visible(scope)} and s.status <> 'planned'
     order by pl.placed_on, pa.chart_number, s.fdi`);
  return result.rows.map((r) => ({
    siteId: r.site_id,
    patientId: r.patient_id,
    chartNumber: r.chart_number,
    fdi: r.fdi,
    status: r.status,
    endedOn: r.ended_on,
    placedOn: r.placed_on,
    system: r.system,
    retention: r.retention,
    deliveredOn: r.delivered_on,
    complications: Number(r.complications),
  }));
}

/** Bone levels of the current exams of the sites, oldest first. */
export async function boneLevelsOfSites(db: Db, siteIds: readonly string[]) {
  if (siteIds.length === 0) return [];
  const result = await db.execute<{ site_id: string; examined_on: string; bone_level_mm: string | number }>(sql`
    select e.site_id, e.examined_on::text, e.bone_level_mm from recall_exams e
     where e.site_id = any(${sql.param([...siteIds])}::uuid[])
       and e.bone_level_mm is not null
       and not exists (select 1 from recall_exams n where n.supersedes_id = e.id)
     order by e.examined_on`);
  return result.rows.map((r) => ({ siteId: r.site_id, date: r.examined_on, boneLevelMm: Number(r.bone_level_mm) }));
}

/** The latest current exam of each of the sites (those without one are left out). */
export async function latestExamsOfSites(db: Db, siteIds: readonly string[]) {
  if (siteIds.length === 0) return [];
  const result = await db.execute<{ site_id: string; status: PeriImplantStatus; examined_on: string }>(sql`
    select distinct on (e.site_id) e.site_id, e.status, e.examined_on::text from recall_exams e
     where e.site_id = any(${sql.param([...siteIds])}::uuid[])
       and not exists (select 1 from recall_exams n where n.supersedes_id = e.id)
     order by e.site_id, e.examined_on desc, e.recorded_at desc`);
  return result.rows.map((r) => ({ siteId: r.site_id, status: r.status, examinedOn: r.examined_on }));
}
