// SQL of the legacy import: what the checks compare the file with (the practice's patients,
// catalogue, live sites, parts and exams), and the bulk writes of a checked file. Every query
// is pinned to the importing user's practice.
import { and, eq, inArray, notInArray, sql } from 'drizzle-orm';
import { partInPlace } from '../db/parts-in-place.js';
import { isCurrentVersion } from '../db/amendments.js';
import type { Db, Tx } from '../db/database.js';
import {
  componentInstances,
  components,
  implantSites,
  implantSystems,
  importEntries,
  importedFreeTextParts,
  legacyImports,
  patients,
  patientVersions,
  placements,
  platforms,
  recallExamSites,
  recallExams,
  restorationSites,
  restorations,
  torqueEvents,
} from '../db/schema/index.js';

export async function findImport(db: Db, practiceId: string, sha256: string) {
  const [row] = await db
    .select()
    .from(legacyImports)
    .where(and(eq(legacyImports.practiceId, practiceId), eq(legacyImports.sha256, sha256)))
    .limit(1);
  return row ?? null;
}

export async function practicePatients(db: Db, practiceId: string) {
  return db
    .select({
      id: patients.id,
      chartNumber: patients.chartNumber,
      familyName: patients.familyName,
      givenName: patients.givenName,
      birthDate: patients.birthDate,
    })
    .from(patients)
    .where(eq(patients.practiceId, practiceId));
}

export async function practicePlatforms(db: Db, practiceId: string) {
  return db
    .select({ id: platforms.id, name: platforms.name, systemName: implantSystems.name })
    .from(platforms)
    .innerJoin(implantSystems, eq(implantSystems.id, platforms.systemId))
    .where(eq(platforms.practiceId, practiceId));
}

/** The current version of every catalogue part (ADR 0006: a version no other row supersedes). */
export async function currentParts(db: Db, practiceId: string) {
  return db
    .select({
      id: components.id,
      lineageId: components.lineageId,
      name: components.name,
      referenceCode: components.referenceCode,
      torqueSpecNcm: components.torqueSpecNcm,
      tolerancePct: components.tolerancePct,
      requiresLot: components.requiresLot,
      platformName: platforms.name,
    })
    .from(components)
    .innerJoin(platforms, eq(platforms.id, components.platformId))
    .where(and(eq(components.practiceId, practiceId), isCurrentVersion(components)));
}

/** Live sites (not failed or removed) with the latest delivery date and restoration there. */
export async function liveSites(db: Db, practiceId: string) {
  return db
    .select({
      id: implantSites.id,
      patientId: implantSites.patientId,
      fdi: implantSites.fdi,
      status: implantSites.status,
      deliveredOn: sql<
        string | null
      >`(select max(r.delivered_on)::text from restoration_sites rs join restorations r on r.id = rs.restoration_id where rs.site_id = implant_sites.id)`,
    })
    .from(implantSites)
    .where(and(eq(implantSites.practiceId, practiceId), notInArray(implantSites.status, ['failed', 'removed'])));
}

/** Parts in the mouth (not removed) at the practice's sites, with their catalogue version. */
export async function installedParts(db: Db, practiceId: string) {
  return db
    .select({
      id: componentInstances.id,
      siteId: componentInstances.siteId,
      componentId: componentInstances.componentId,
      lineageId: components.lineageId,
    })
    .from(componentInstances)
    .innerJoin(components, eq(components.id, componentInstances.componentId))
    .where(and(eq(componentInstances.practiceId, practiceId), partInPlace()));
}

/** Exams of the given sites with their probing, for choosing an imported exam's baseline. */
export async function examsOfSites(db: Db, siteIds: string[]) {
  if (siteIds.length === 0) return [];
  const exams = await db
    .select({
      id: recallExams.id,
      siteId: recallExams.siteId,
      examinedOn: recallExams.examinedOn,
      recordedAt: recallExams.recordedAt,
      isBaseline: recallExams.isBaseline,
      boneLevelMm: recallExams.boneLevelMm,
    })
    .from(recallExams)
    .where(and(inArray(recallExams.siteId, siteIds), isCurrentVersion(recallExams)));
  if (exams.length === 0) return [];
  const probes = await db
    .select({
      examId: recallExamSites.examId,
      position: recallExamSites.position,
      probingDepthMm: recallExamSites.probingDepthMm,
      bleeding: recallExamSites.bleeding,
      suppuration: recallExamSites.suppuration,
    })
    .from(recallExamSites)
    .where(
      inArray(
        recallExamSites.examId,
        exams.map((e) => e.id),
      ),
    );
  return exams.map((e) => ({ ...e, sites: probes.filter((p) => p.examId === e.id) }));
}

type NewPatient = typeof patients.$inferInsert & { id: string };
type NewPatientVersion = typeof patientVersions.$inferInsert;
export type NewSite = typeof implantSites.$inferInsert & { id: string };
type NewPlacement = typeof placements.$inferInsert & { id: string };
type NewRestoration = typeof restorations.$inferInsert & { id: string };
type NewRestorationSite = typeof restorationSites.$inferInsert;
type NewInstance = typeof componentInstances.$inferInsert & { id: string };
type NewTorque = typeof torqueEvents.$inferInsert & { id: string };
type NewExam = typeof recallExams.$inferInsert & { id: string };
type NewExamSite = typeof recallExamSites.$inferInsert;
type NewFreeTextPart = typeof importedFreeTextParts.$inferInsert & { id: string };
type NewImportEntry = Omit<typeof importEntries.$inferInsert, 'importId'>;
type SiteStatusChange = { id: string; status: 'placed' | 'restored' };

/** Everything a checked file writes, in the order the foreign keys need. */
export interface ImportWrites {
  patients: NewPatient[];
  patientVersions: NewPatientVersion[];
  sites: NewSite[];
  siteStatus: SiteStatusChange[];
  placements: NewPlacement[];
  restorations: NewRestoration[];
  restorationSites: NewRestorationSite[];
  instances: NewInstance[];
  torque: NewTorque[];
  exams: NewExam[];
  examSites: NewExamSite[];
  freeTextParts: NewFreeTextPart[];
  entries: NewImportEntry[];
}

/** Rows per insert statement: well under PostgreSQL's 65 535 parameters for the widest table. */
const CHUNK = 1000;

async function insertChunks<T extends Record<string, unknown>>(
  values: T[],
  insert: (chunk: T[]) => Promise<unknown>,
  progress: (n: number) => void,
) {
  for (let i = 0; i < values.length; i += CHUNK) {
    const chunk = values.slice(i, i + CHUNK);
    await insert(chunk);
    progress(chunk.length);
  }
}

export async function insertImport(tx: Tx, values: typeof legacyImports.$inferInsert) {
  const [row] = await tx.insert(legacyImports).values(values).returning();
  return row;
}

/** Bulk inserts in foreign-key order; `progress` is told how many records each statement wrote. */
export async function writeAll(tx: Tx, importId: string, w: ImportWrites, progress: (n: number) => void) {
  await insertChunks(w.patients, (c) => tx.insert(patients).values(c), progress);
  await insertChunks(w.patientVersions, (c) => tx.insert(patientVersions).values(c), progress);
  await insertChunks(w.sites, (c) => tx.insert(implantSites).values(c), progress);
  for (const s of w.siteStatus)
    await tx.update(implantSites).set({ status: s.status }).where(eq(implantSites.id, s.id));
  await insertChunks(w.placements, (c) => tx.insert(placements).values(c), progress);
  await insertChunks(w.restorations, (c) => tx.insert(restorations).values(c), progress);
  await insertChunks(w.restorationSites, (c) => tx.insert(restorationSites).values(c), progress);
  await insertChunks(w.instances, (c) => tx.insert(componentInstances).values(c), progress);
  await insertChunks(w.torque, (c) => tx.insert(torqueEvents).values(c), progress);
  await insertChunks(w.exams, (c) => tx.insert(recallExams).values(c), progress);
  await insertChunks(w.examSites, (c) => tx.insert(recallExamSites).values(c), progress);
  await insertChunks(w.freeTextParts, (c) => tx.insert(importedFreeTextParts).values(c), progress);
  await insertChunks(
    w.entries.map((e) => ({ ...e, importId })),
    (c) => tx.insert(importEntries).values(c),
    progress,
  );
}
