import { and, desc, eq, gte, inArray, isNull, sql } from 'drizzle-orm';
import type { Database, Db } from '../db/database.js';
import { preparedFor } from '../db/prepared.js';
import { insertAmendment, isCurrentVersion } from '../db/amendments.js';
import {
  implantSites,
  patients,
  placements,
  radiographMeasurements,
  radiographs,
  radiographSites,
  users,
} from '../db/schema/index.js';
import type { Scope } from '../authz/scope.js';
import { scopeParams, visiblePatients, visiblePatientsPrepared } from '../authz/visible-patients.js';

export async function findVisiblePatient(db: Database, scope: Scope, id: string) {
  const [row] = await visiblePatientQuery(db).execute({ id, ...scopeParams(scope) });
  return row ? { ...row, patientId: row.id } : null;
}
const visiblePatientQuery = preparedFor((db) =>
  db
    .select({ id: patients.id, practiceId: patients.practiceId })
    .from(patients)
    .where(and(eq(patients.id, sql.placeholder('id')), visiblePatientsPrepared()))
    .prepare('radiograph_patient'),
);

/** The ids among `siteIds` that are sites of the patient. */
export async function sitesOfPatient(db: Db, patientId: string, siteIds: readonly string[]) {
  if (siteIds.length === 0) return [];
  const rows = await db
    .select({ id: implantSites.id })
    .from(implantSites)
    .where(and(eq(implantSites.patientId, patientId), inArray(implantSites.id, [...siteIds])));
  return rows.map((r) => r.id);
}

/** Bytes the user has uploaded since `since`. */
export async function bytesUploadedSince(db: Db, userId: string, since: Date): Promise<number> {
  const [row] = await db
    .select({ total: sql<string>`coalesce(sum(${radiographs.sizeBytes}), 0)` })
    .from(radiographs)
    .where(and(eq(radiographs.uploadedBy, userId), gte(radiographs.uploadedAt, since)));
  return Number(row?.total ?? 0);
}

export async function findBySha(db: Db, patientId: string, sha256: string) {
  const [row] = await db
    .select({ id: radiographs.id, uploadedAt: radiographs.uploadedAt })
    .from(radiographs)
    .where(and(eq(radiographs.patientId, patientId), eq(radiographs.sha256, sha256)));
  return row ?? null;
}

export async function insertRadiograph(db: Db, values: typeof radiographs.$inferInsert, siteIds: readonly string[]) {
  await db.insert(radiographs).values(values);
  if (siteIds.length > 0) {
    await db.insert(radiographSites).values(siteIds.map((siteId) => ({ radiographId: values.id!, siteId })));
  }
}

const columns = {
  r: radiographs,
  uploadedByName: users.displayName,
  siteIds: sql<
    string[]
  >`coalesce((select array_agg(rs.site_id::text order by rs.site_id) from ${radiographSites} rs where rs.radiograph_id = ${radiographs.id}), '{}')`,
};

export async function findVisibleRadiograph(db: Db, scope: Scope, id: string) {
  const [row] = await db
    .select(columns)
    .from(radiographs)
    .innerJoin(patients, eq(patients.id, radiographs.patientId))
    .innerJoin(users, eq(users.id, radiographs.uploadedBy))
    .where(and(eq(radiographs.id, id), visiblePatients(scope)));
  return row ? { ...row.r, uploadedByName: row.uploadedByName, siteIds: row.siteIds } : null;
}
export type RadiographRow = NonNullable<Awaited<ReturnType<typeof findVisibleRadiograph>>>;

export async function listForPatient(
  db: Database,
  scope: Scope,
  patientId: string,
  includeEnteredInError: boolean,
  siteIds: readonly string[] | null,
) {
  const rows = await patientRadiographsQuery(db).execute({
    patientId,
    includeEnteredInError,
    siteIds: siteIds ? [...siteIds] : null,
    ...scopeParams(scope),
  });
  return rows.map((row) => ({ ...row.r, uploadedByName: row.uploadedByName, siteIds: row.siteIds }));
}
const patientRadiographsQuery = preparedFor((db) =>
  db
    .select(columns)
    .from(radiographs)
    .innerJoin(patients, eq(patients.id, radiographs.patientId))
    .innerJoin(users, eq(users.id, radiographs.uploadedBy))
    .where(
      and(
        eq(radiographs.patientId, sql.placeholder('patientId')),
        visiblePatientsPrepared(),
        sql`(${sql.placeholder('includeEnteredInError')}::boolean or ${radiographs.enteredInErrorAt} is null)`,
        // A share of chosen sites: only the radiographs that show one of them (null: every site).
        sql`(${sql.placeholder('siteIds')}::uuid[] is null or exists (select 1 from ${radiographSites}
          where ${radiographSites.radiographId} = ${radiographs.id} and ${radiographSites.siteId} = any(${sql.placeholder('siteIds')}::uuid[])))`,
      ),
    )
    .orderBy(desc(radiographs.takenOn), desc(radiographs.uploadedAt))
    .prepare('radiograph_list'),
);

export async function markEnteredInError(db: Db, id: string, userId: string, reason: string) {
  await db
    .update(radiographs)
    .set({ enteredInErrorAt: new Date(), enteredInErrorBy: userId, enteredInErrorReason: reason })
    .where(and(eq(radiographs.id, id), isNull(radiographs.enteredInErrorAt)));
}

/** The implant length of the site's current placement, if any. */
export async function currentImplantLength(db: Db, siteId: string): Promise<number | null> {
  const [row] = await db
    .select({ lengthMm: placements.lengthMm })
    .from(placements)
    .where(and(eq(placements.siteId, siteId), isCurrentVersion(placements)));
  return row?.lengthMm ?? null;
}

const measurementColumns = { m: radiographMeasurements, measuredByName: users.displayName };

export async function insertMeasurement(db: Db, values: typeof radiographMeasurements.$inferInsert) {
  const [row] = await db.insert(radiographMeasurements).values(values).returning({ id: radiographMeasurements.id });
  return row.id;
}

export function insertMeasurementAmendment(
  db: Db,
  values: typeof radiographMeasurements.$inferInsert & { supersedesId: string; amendmentReason: string },
) {
  return insertAmendment(db, radiographMeasurements, values);
}

export async function findMeasurement(db: Db, scope: Scope, id: string) {
  const [row] = await db
    .select({
      ...measurementColumns,
      current: sql<boolean>`${isCurrentVersion(radiographMeasurements)}`,
    })
    .from(radiographMeasurements)
    .innerJoin(patients, eq(patients.id, radiographMeasurements.patientId))
    .innerJoin(users, eq(users.id, radiographMeasurements.measuredBy))
    .where(and(eq(radiographMeasurements.id, id), visiblePatients(scope)));
  return row ? { ...row.m, measuredByName: row.measuredByName, current: row.current } : null;
}

export async function currentMeasurements(db: Db, radiographId: string) {
  const rows = await db
    .select(measurementColumns)
    .from(radiographMeasurements)
    .innerJoin(users, eq(users.id, radiographMeasurements.measuredBy))
    .where(and(eq(radiographMeasurements.radiographId, radiographId), isCurrentVersion(radiographMeasurements)))
    .orderBy(radiographMeasurements.measuredAt);
  return rows.map((row) => ({ ...row.m, measuredByName: row.measuredByName }));
}
export type MeasurementRow = Awaited<ReturnType<typeof currentMeasurements>>[number];

/** What the preview job needs of a radiograph (no scope: the job runs for the row it was queued for). */
export async function previewTarget(db: Db, id: string) {
  const [row] = await db
    .select({
      id: radiographs.id,
      objectKey: radiographs.objectKey,
      fileType: radiographs.fileType,
      rows: radiographs.rows,
      columns: radiographs.columns,
      previewStatus: radiographs.previewStatus,
    })
    .from(radiographs)
    .where(eq(radiographs.id, id));
  return row ?? null;
}

/** Ends a pending preview: ready (with the image size when the upload could not read it) or unavailable. */
export async function finishPreview(
  db: Db,
  id: string,
  outcome: { ready: true; rows?: number; columns?: number } | { ready: false; problem: string },
) {
  await db
    .update(radiographs)
    .set(
      outcome.ready
        ? {
            previewStatus: 'ready',
            previewProblem: null,
            ...(outcome.rows && outcome.columns
              ? {
                  rows: sql`coalesce(${radiographs.rows}, ${outcome.rows})`,
                  columns: sql`coalesce(${radiographs.columns}, ${outcome.columns})`,
                }
              : {}),
          }
        : { previewStatus: 'unavailable', previewProblem: outcome.problem },
    )
    .where(and(eq(radiographs.id, id), eq(radiographs.previewStatus, 'pending')));
}

/** Counts a failed attempt of the preview job; the row stays pending while retries remain. */
export async function countPreviewAttempt(db: Db, id: string) {
  await db
    .update(radiographs)
    .set({ previewAttempts: sql`${radiographs.previewAttempts} + 1` })
    .where(and(eq(radiographs.id, id), eq(radiographs.previewStatus, 'pending')));
}

/** Radiographs still waiting for their preview, oldest first (the sweep queues a job for each). */
export async function listPendingPreviews(db: Db, limit: number) {
  const rows = await db
    .select({ id: radiographs.id })
    .from(radiographs)
    .where(eq(radiographs.previewStatus, 'pending'))
    .orderBy(radiographs.uploadedAt)
    .limit(limit);
  return rows.map((r) => r.id);
}
