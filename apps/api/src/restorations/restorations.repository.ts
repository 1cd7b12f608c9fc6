import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import type { Db, Tx } from '../db/database.js';
import {
  components,
  findingAcknowledgements,
  implantSites,
  implantSystems,
  labPrescriptions,
  patients,
  placements,
  platforms,
  practices,
  restorationSiteComponents,
  restorationSites,
  restorations,
  users,
} from '../db/schema/index.js';
import type { Scope } from '../authz/scope.js';
import { visiblePatients } from '../authz/visible-patients.js';
import { componentSpecColumns } from '../catalogue/catalogue.repository.js';
import { isCurrentVersion, supersededById } from '../db/amendments.js';

const notSuperseded = isCurrentVersion(placements);

/** The patient's implant sites with the platform and axis of the current placement. */
export async function listRestorableSites(db: Db, patientId: string, siteIds?: string[]) {
  return db
    .select({
      siteId: implantSites.id,
      practiceId: implantSites.practiceId,
      patientId: implantSites.patientId,
      fdi: implantSites.fdi,
      status: implantSites.status,
      platformId: placements.platformId,
      systemName: implantSystems.name,
      manufacturer: implantSystems.manufacturer,
      platformName: platforms.name,
      connection: platforms.connection,
      diameterMm: platforms.diameterMm,
      lengthMm: placements.lengthMm,
      axisX: placements.axisX,
      axisY: placements.axisY,
      axisZ: placements.axisZ,
    })
    .from(implantSites)
    .leftJoin(placements, and(eq(placements.siteId, implantSites.id), notSuperseded))
    .leftJoin(platforms, eq(platforms.id, placements.platformId))
    .leftJoin(implantSystems, eq(implantSystems.id, platforms.systemId))
    .where(and(eq(implantSites.patientId, patientId), siteIds ? inArray(implantSites.id, siteIds) : undefined))
    .orderBy(asc(implantSites.fdi));
}
export type RestorableSiteRow = Awaited<ReturnType<typeof listRestorableSites>>[number];

/** A patient the user may see, with what the lab prescription needs. */
export async function findVisiblePatientBrief(db: Db, scope: Scope, id: string) {
  const [row] = await db
    .select({
      id: patients.id,
      practiceId: patients.practiceId,
      chartNumber: patients.chartNumber,
      givenName: patients.givenName,
      familyName: patients.familyName,
      practiceName: practices.name,
    })
    .from(patients)
    .innerJoin(practices, eq(practices.id, patients.practiceId))
    .where(and(eq(patients.id, id), visiblePatients(scope)));
  return row ?? null;
}

const restorationColumns = {
  id: restorations.id,
  practiceId: restorations.practiceId,
  patientId: restorations.patientId,
  kind: restorations.kind,
  retention: restorations.retention,
  material: restorations.material,
  shade: restorations.shade,
  status: restorations.status,
  copingsSplinted: restorations.copingsSplinted,
  impressionTakenOn: restorations.impressionTakenOn,
  deliveredOn: restorations.deliveredOn,
  labName: restorations.labName,
  labEmail: restorations.labEmail,
  dueOn: restorations.dueOn,
  notes: restorations.notes,
  findings: restorations.findings,
  rulesVersion: restorations.rulesVersion,
  plannedBy: restorations.plannedBy,
  plannedByName: users.displayName,
  createdAt: restorations.createdAt,
  supersedesId: restorations.supersedesId,
  amendmentReason: restorations.amendmentReason,
  supersededById: supersededById(restorations),
};

/** A restoration whose patient the user may see (scoped in SQL). */
export async function findVisibleRestoration(db: Db, scope: Scope, id: string) {
  const [row] = await db
    .select(restorationColumns)
    .from(restorations)
    .innerJoin(patients, eq(patients.id, restorations.patientId))
    .leftJoin(users, eq(users.id, restorations.plannedBy))
    .where(and(eq(restorations.id, id), visiblePatients(scope)));
  return row ?? null;
}
export type RestorationRow = NonNullable<Awaited<ReturnType<typeof findVisibleRestoration>>>;

/**
 * Locks one restoration version until the transaction ends: amendments and the delivery of one
 * version then run one after the other, and each re-reads the version after taking the lock.
 */
export async function lockRestoration(tx: Tx, id: string) {
  await tx.select({ id: restorations.id }).from(restorations).where(eq(restorations.id, id)).for('update');
}

export async function listRestorationsOfPatient(db: Db, patientId: string) {
  return db
    .select(restorationColumns)
    .from(restorations)
    .leftJoin(users, eq(users.id, restorations.plannedBy))
    .where(eq(restorations.patientId, patientId))
    .orderBy(desc(restorations.createdAt));
}

/** Sites of restorations with their current placement's platform, and the chosen parts. */
export async function loadRestorationSites(db: Db, restorationIds: string[]) {
  if (restorationIds.length === 0) return { sites: [], parts: [] };
  const sites = await db
    .select({
      id: restorationSites.id,
      restorationId: restorationSites.restorationId,
      siteId: restorationSites.siteId,
      fdi: implantSites.fdi,
      interface: restorationSites.interface,
      impressionCoping: restorationSites.impressionCoping,
      multiUnitAngleDeg: restorationSites.multiUnitAngleDeg,
      restorativeSpaceMm: restorationSites.restorativeSpaceMm,
      axisX: restorationSites.axisX,
      axisY: restorationSites.axisY,
      axisZ: restorationSites.axisZ,
      platformId: placements.platformId,
      systemName: implantSystems.name,
      manufacturer: implantSystems.manufacturer,
      platformName: platforms.name,
      connection: platforms.connection,
      diameterMm: platforms.diameterMm,
      lengthMm: placements.lengthMm,
    })
    .from(restorationSites)
    .innerJoin(implantSites, eq(implantSites.id, restorationSites.siteId))
    .leftJoin(placements, and(eq(placements.siteId, implantSites.id), notSuperseded))
    .leftJoin(platforms, eq(platforms.id, placements.platformId))
    .leftJoin(implantSystems, eq(implantSystems.id, platforms.systemId))
    .where(inArray(restorationSites.restorationId, restorationIds))
    .orderBy(asc(implantSites.fdi));
  const parts =
    sites.length === 0
      ? []
      : await db
          .select({ restorationSiteId: restorationSiteComponents.restorationSiteId, ...componentSpecColumns })
          .from(restorationSiteComponents)
          .innerJoin(components, eq(components.id, restorationSiteComponents.componentId))
          .where(inArray(restorationSiteComponents.restorationSiteId, sites.map((s) => s.id)))
          .orderBy(asc(restorationSiteComponents.id));
  return { sites, parts };
}

export async function loadAcknowledgements(db: Db, restorationIds: string[]) {
  if (restorationIds.length === 0) return [];
  return db
    .select({ restorationId: findingAcknowledgements.restorationId, code: findingAcknowledgements.code, fdi: findingAcknowledgements.fdi, byName: users.displayName, at: findingAcknowledgements.acknowledgedAt })
    .from(findingAcknowledgements)
    .innerJoin(users, eq(users.id, findingAcknowledgements.acknowledgedBy))
    .where(inArray(findingAcknowledgements.restorationId, restorationIds))
    .orderBy(asc(findingAcknowledgements.acknowledgedAt));
}

export async function loadLabPrescriptions(db: Db, restorationIds: string[]) {
  if (restorationIds.length === 0) return [];
  return db
    .select({ id: labPrescriptions.id, restorationId: labPrescriptions.restorationId, sizeBytes: labPrescriptions.sizeBytes, emailedTo: labPrescriptions.emailedTo, emailedAt: labPrescriptions.emailedAt, createdAt: labPrescriptions.createdAt })
    .from(labPrescriptions)
    .where(inArray(labPrescriptions.restorationId, restorationIds))
    .orderBy(desc(labPrescriptions.createdAt));
}
