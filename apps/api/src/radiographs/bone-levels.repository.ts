// SQL for a site's measured bone levels: current measurement versions on radiographs that are not
// entered in error, and what the bone-level summary needs beside them (loading date, implant
// length, the latest recall exam's findings).
import { and, desc, eq, inArray, isNull, sql } from 'drizzle-orm';
import type { Db } from '../db/database.js';
import { isCurrentVersion } from '../db/amendments.js';
import {
  implantSites,
  patients,
  placements,
  radiographMeasurements,
  radiographs,
  recallExams,
  recallExamSites,
  users,
} from '../db/schema/index.js';
import type { Scope } from '../authz/scope.js';
import { visiblePatients } from '../authz/visible-patients.js';

/** The site when the scope may see its patient, with its loading date and placement length. */
export async function findVisibleSite(db: Db, scope: Scope, siteId: string) {
  const [row] = await db
    .select({
      id: implantSites.id,
      practiceId: implantSites.practiceId,
      patientId: implantSites.patientId,
      // Raw SQL: the same loading date as the exam form's (first delivery of a restoration not removed).
      loadedOn: sql<
        string | null
      >`(select min(rr.delivered_on)::text from restoration_sites rs join restorations rr on rr.id = rs.restoration_id where rs.site_id = ${implantSites.id} and rr.delivered_on is not null and rr.status <> 'removed')`,
      implantLengthMm: sql<
        number | null
      >`(select p.length_mm::float8 from ${placements} p where p.site_id = ${implantSites.id} and not exists (select 1 from ${placements} p2 where p2.supersedes_id = p.id) limit 1)`,
    })
    .from(implantSites)
    .innerJoin(patients, eq(patients.id, implantSites.patientId))
    .where(and(eq(implantSites.id, siteId), visiblePatients(scope)));
  return row ?? null;
}

/**
 * Current measurements of the given sites on radiographs not entered in error, latest first (by the
 * date the radiograph was taken, undated last, then by when measured). Callers have checked the sites.
 */
export async function currentSiteMeasurements(db: Db, siteIds: readonly string[]) {
  if (siteIds.length === 0) return [];
  return db
    .select({
      measurementId: radiographMeasurements.id,
      radiographId: radiographMeasurements.radiographId,
      siteId: radiographMeasurements.siteId,
      takenOn: radiographs.takenOn,
      mesialMm: radiographMeasurements.mesialMm,
      distalMm: radiographMeasurements.distalMm,
      implantTrueMm: radiographMeasurements.implantTrueMm,
      measuredBy: users.displayName,
      measuredAt: radiographMeasurements.measuredAt,
      amended: sql<boolean>`${radiographMeasurements.supersedesId} is not null`,
    })
    .from(radiographMeasurements)
    .innerJoin(radiographs, eq(radiographs.id, radiographMeasurements.radiographId))
    .innerJoin(users, eq(users.id, radiographMeasurements.measuredBy))
    .where(
      and(
        inArray(radiographMeasurements.siteId, [...siteIds]),
        isCurrentVersion(radiographMeasurements),
        isNull(radiographs.enteredInErrorAt),
      ),
    )
    .orderBy(sql`${radiographs.takenOn} desc nulls last`, desc(radiographMeasurements.measuredAt));
}
export type SiteMeasurementRow = Awaited<ReturnType<typeof currentSiteMeasurements>>[number];

/** One current measurement of a site, for checking the source the exam names. */
export async function findCurrentSiteMeasurement(db: Db, measurementId: string, siteId: string) {
  const rows = await currentSiteMeasurements(db, [siteId]);
  return rows.find((r) => r.measurementId === measurementId) ?? null;
}

/** The site's current recall exams, latest first, with their deepest probing depth and any suppuration. */
export async function examFindings(db: Db, siteId: string) {
  return (
    db
      .select({
        mobility: recallExams.mobility,
        maxProbingDepthMm: sql<number>`(select max(s.probing_depth_mm)::float8 from ${recallExamSites} s where s.exam_id = ${recallExams.id})`,
        suppuration: sql<boolean>`exists (select 1 from ${recallExamSites} s where s.exam_id = ${recallExams.id} and s.suppuration)`,
      })
      .from(recallExams)
      // The join makes drizzle qualify the columns inside the subqueries ("id" alone would bind to them).
      .innerJoin(implantSites, eq(implantSites.id, recallExams.siteId))
      .where(and(eq(recallExams.siteId, siteId), isCurrentVersion(recallExams)))
      .orderBy(desc(recallExams.examinedOn), desc(recallExams.recordedAt))
  );
}
