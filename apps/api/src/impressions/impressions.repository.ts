// SQL of impressions, their scan bodies and scan files. Every lookup joins the patient and puts
// the user's scope in the `where` clause, so another practice's restoration or impression is never
// loaded.
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type { Db, Tx } from '../db/database.js';
import { insertAmendment, isCurrentVersion, supersededById } from '../db/amendments.js';
import { currentPartVersions } from '../db/catalogue-parts.js';
import {
  components,
  impressionScanBodies,
  impressions,
  implantSites,
  patients,
  placements,
  platforms,
  restorationSites,
  restorations,
  scanFiles,
  seatingChecks,
  users,
} from '../db/schema/index.js';
import type { Scope } from '../authz/scope.js';
import { visiblePatients } from '../authz/visible-patients.js';

/** A restoration the user may see, with its sites and the platform of each site's current placement. */
export async function findVisibleRestoration(db: Db, scope: Scope, id: string) {
  const [row] = await db
    .select({
      id: restorations.id,
      practiceId: restorations.practiceId,
      patientId: restorations.patientId,
      retention: restorations.retention,
      current: sql<boolean>`${isCurrentVersion(restorations)}`,
    })
    .from(restorations)
    .innerJoin(patients, eq(patients.id, restorations.patientId))
    .where(and(eq(restorations.id, id), visiblePatients(scope)));
  if (!row) return null;
  const sites = await db
    .select({
      siteId: implantSites.id,
      fdi: implantSites.fdi,
      platformId: placements.platformId,
      platformName: platforms.name,
    })
    .from(restorationSites)
    .innerJoin(implantSites, eq(implantSites.id, restorationSites.siteId))
    .leftJoin(placements, and(eq(placements.siteId, implantSites.id), isCurrentVersion(placements)))
    .leftJoin(platforms, eq(platforms.id, placements.platformId))
    .where(eq(restorationSites.restorationId, id))
    .orderBy(asc(implantSites.fdi));
  return { ...row, sites };
}
export type VisibleRestoration = NonNullable<Awaited<ReturnType<typeof findVisibleRestoration>>>;

/** The catalogue parts named (any version, resolved to the current one), with their platform's name. */
export async function scanBodyParts(db: Db, practiceId: string, ids: string[]) {
  const parts = await currentPartVersions(db, practiceId, ids);
  if (parts.length === 0) return [];
  const names = await db
    .select({ id: platforms.id, name: platforms.name })
    .from(platforms)
    .where(
      inArray(
        platforms.id,
        parts.map((p) => p.platformId),
      ),
    );
  return parts.map((p) => ({ ...p, platformName: names.find((n) => n.id === p.platformId)?.name ?? '' }));
}

const impressionColumns = {
  i: impressions,
  recordedByName: users.displayName,
  supersededById: supersededById(impressions),
};

const flatten = (row: {
  i: typeof impressions.$inferSelect;
  recordedByName: string;
  supersededById: string | null;
}) => ({
  ...row.i,
  recordedByName: row.recordedByName,
  supersededById: row.supersededById,
});
export type ImpressionRow = ReturnType<typeof flatten>;

export async function findImpression(db: Db, scope: Scope, id: string) {
  const [row] = await db
    .select(impressionColumns)
    .from(impressions)
    .innerJoin(patients, eq(patients.id, impressions.patientId))
    .innerJoin(users, eq(users.id, impressions.recordedBy))
    .where(and(eq(impressions.id, id), visiblePatients(scope)));
  return row ? flatten(row) : null;
}

/** Every version of the restoration's impression, oldest first. */
export async function impressionsOfRestoration(db: Db, restorationId: string) {
  const rows = await db
    .select(impressionColumns)
    .from(impressions)
    .innerJoin(users, eq(users.id, impressions.recordedBy))
    .where(eq(impressions.restorationId, restorationId))
    .orderBy(asc(impressions.recordedAt));
  return rows.map(flatten);
}

/** The scan bodies of the impression versions, with the part and the site's chart number. */
export async function scanBodiesOf(db: Db, impressionIds: string[]) {
  if (impressionIds.length === 0) return [];
  return db
    .select({
      impressionId: impressionScanBodies.impressionId,
      siteId: impressionScanBodies.siteId,
      fdi: implantSites.fdi,
      componentId: impressionScanBodies.componentId,
      name: components.name,
      referenceCode: components.referenceCode,
      kind: components.kind,
      copingLevel: components.copingLevel,
      lot: impressionScanBodies.lot,
    })
    .from(impressionScanBodies)
    .innerJoin(implantSites, eq(implantSites.id, impressionScanBodies.siteId))
    .innerJoin(components, eq(components.id, impressionScanBodies.componentId))
    .where(inArray(impressionScanBodies.impressionId, impressionIds))
    .orderBy(asc(implantSites.fdi));
}

/** The first version of the restoration's impression, if any (the unique index keeps it to one). */
export async function firstImpressionOf(db: Db, restorationId: string) {
  const [row] = await db
    .select({ id: impressions.id })
    .from(impressions)
    .where(and(eq(impressions.restorationId, restorationId), sql`${impressions.supersedesId} is null`));
  return row ?? null;
}

export async function insertImpression(tx: Tx, values: typeof impressions.$inferInsert) {
  const [row] = await tx.insert(impressions).values(values).returning({ id: impressions.id });
  return row.id;
}

export function insertImpressionAmendment(
  tx: Tx,
  values: typeof impressions.$inferInsert & { supersedesId: string; amendmentReason: string },
) {
  return insertAmendment(tx, impressions, values);
}

export async function insertScanBodies(tx: Tx, rows: (typeof impressionScanBodies.$inferInsert)[]) {
  if (rows.length > 0) await tx.insert(impressionScanBodies).values(rows);
}

const scanFileColumns = {
  f: scanFiles,
  uploadedByName: users.displayName,
};
export type ScanFileRow = typeof scanFiles.$inferSelect & { uploadedByName: string };

export async function scanFilesOfRestoration(db: Db, restorationId: string): Promise<ScanFileRow[]> {
  const rows = await db
    .select(scanFileColumns)
    .from(scanFiles)
    .innerJoin(users, eq(users.id, scanFiles.uploadedBy))
    .where(eq(scanFiles.restorationId, restorationId))
    .orderBy(asc(scanFiles.uploadedAt));
  return rows.map((r) => ({ ...r.f, uploadedByName: r.uploadedByName }));
}
export async function findScanFile(db: Db, scope: Scope, id: string): Promise<ScanFileRow | null> {
  const [row] = await db
    .select(scanFileColumns)
    .from(scanFiles)
    .innerJoin(patients, eq(patients.id, scanFiles.patientId))
    .innerJoin(users, eq(users.id, scanFiles.uploadedBy))
    .where(and(eq(scanFiles.id, id), visiblePatients(scope)));
  return row ? { ...row.f, uploadedByName: row.uploadedByName } : null;
}

/** A scan file by id alone: for a signed lab link, whose signature is the authorisation. */
export async function findScanFileForLink(db: Db, id: string) {
  const [row] = await db
    .select({
      id: scanFiles.id,
      practiceId: scanFiles.practiceId,
      patientId: scanFiles.patientId,
      objectKey: scanFiles.objectKey,
      fileType: scanFiles.fileType,
      originalName: scanFiles.originalName,
    })
    .from(scanFiles)
    .where(eq(scanFiles.id, id));
  return row ?? null;
}

export async function findScanFileBySha(db: Db, restorationId: string, sha256: string) {
  const [row] = await db
    .select({ id: scanFiles.id })
    .from(scanFiles)
    .where(and(eq(scanFiles.restorationId, restorationId), eq(scanFiles.sha256, sha256)));
  return row ?? null;
}

export async function insertScanFile(tx: Tx, values: typeof scanFiles.$inferInsert) {
  await tx.insert(scanFiles).values(values);
}

/** Whether the restoration's impression has a seating check (a radiograph linked to it), any version. */
export async function hasImpressionSeatingCheck(db: Db, restorationId: string): Promise<boolean> {
  const [row] = await db
    .select({ id: seatingChecks.id })
    .from(seatingChecks)
    .where(and(eq(seatingChecks.restorationId, restorationId), eq(seatingChecks.event, 'impression')))
    .limit(1);
  return row !== undefined;
}
