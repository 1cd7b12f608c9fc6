import { and, asc, desc, eq, inArray, isNull, ne, sql } from 'drizzle-orm';
import type { TorqueReason, TorqueVerdict } from '@torquetrail/contracts';
import { alias } from 'drizzle-orm/pg-core';
import type { Db } from '../db/database.js';
import {
  componentInstances,
  components,
  implantSites,
  implantSystems,
  patients,
  placements,
  platforms,
  radiographs,
  restorationSites,
  restorations,
  seatingChecks,
  torqueEvents,
} from '../db/schema/index.js';
import type { Scope } from '../authz/scope.js';
import { visiblePatients } from '../authz/visible-patients.js';
import { isCurrentVersion } from '../db/amendments.js';

export async function findVisibleSite(db: Db, scope: Scope, siteId: string) {
  const [row] = await db
    .select({
      id: implantSites.id,
      practiceId: implantSites.practiceId,
      patientId: implantSites.patientId,
      fdi: implantSites.fdi,
      status: implantSites.status,
      patientName: sql<string>`${patients.givenName} || ' ' || ${patients.familyName}`,
    })
    .from(implantSites)
    .innerJoin(patients, eq(patients.id, implantSites.patientId))
    .where(and(eq(implantSites.id, siteId), visiblePatients(scope)));
  return row ?? null;
}

/** The current placement: the one no later amendment supersedes. */
export async function findCurrentPlacement(db: Db, siteId: string) {
  const [row] = await db
    .select({
      placedOn: placements.placedOn,
      surgeonName: placements.surgeonName,
      systemName: implantSystems.name,
      manufacturer: implantSystems.manufacturer,
      platformName: platforms.name,
      diameterMm: platforms.diameterMm,
      lengthMm: placements.lengthMm,
      connection: platforms.connection,
      platformShift: platforms.platformShift,
      lot: placements.lot,
      insertionTorqueNcm: placements.insertionTorqueNcm,
      stabilityIsq: placements.stabilityIsq,
      loadingProtocol: placements.loadingProtocol,
    })
    .from(placements)
    .innerJoin(platforms, eq(platforms.id, placements.platformId))
    .innerJoin(implantSystems, eq(implantSystems.id, platforms.systemId))
    .where(and(eq(placements.siteId, siteId), isCurrentVersion(placements)))
    .orderBy(desc(placements.recordedAt))
    .limit(1);
  return row ?? null;
}

/** Parts in the mouth now (not removed), from the implant outward, each as the version installed. */
export async function listCurrentParts(db: Db, siteId: string) {
  const latest = alias(components, 'latest');
  return db
    .select({
      instanceId: componentInstances.id,
      componentId: components.id,
      requiresLot: components.requiresLot,
      kind: components.kind,
      name: components.name,
      referenceCode: components.referenceCode,
      engaging: components.engaging,
      angleDeg: components.angleDeg,
      torqueSpecNcm: components.torqueSpecNcm,
      tolerancePct: components.tolerancePct,
      lot: componentInstances.lot,
      installedOn: componentInstances.installedOn,
      // The catalogue's current version of the part, when an edit came after this one was installed.
      latest: {
        id: latest.id,
        name: latest.name,
        torqueSpecNcm: latest.torqueSpecNcm,
        tolerancePct: latest.tolerancePct,
        versionedAt: latest.createdAt,
      },
    })
    .from(componentInstances)
    .innerJoin(components, eq(components.id, componentInstances.componentId))
    .innerJoin(
      latest,
      and(
        eq(latest.lineageId, components.lineageId),
        sql`not exists (select 1 from ${components} newer where newer.supersedes_id = ${latest.id})`,
      ),
    )
    .where(and(eq(componentInstances.siteId, siteId), isNull(componentInstances.removedOn)))
    .orderBy(asc(componentInstances.installedOn), asc(componentInstances.recordedAt));
}

/** The latest torque event per part (amended entries are replaced by their amendment). */
export async function latestTorqueByInstance(db: Db, instanceIds: string[]) {
  if (instanceIds.length === 0) return new Map<string, LatestTorque>();
  const rows = await db
    .selectDistinctOn([torqueEvents.componentInstanceId], {
      instanceId: torqueEvents.componentInstanceId,
      id: torqueEvents.id,
      appliedNcm: torqueEvents.appliedNcm,
      specNcm: torqueEvents.specNcm,
      tolerancePct: torqueEvents.tolerancePct,
      verdict: torqueEvents.verdict,
      reason: torqueEvents.reason,
      performedAt: torqueEvents.performedAt,
    })
    .from(torqueEvents)
    .where(and(inArray(torqueEvents.componentInstanceId, instanceIds), isCurrentVersion(torqueEvents)))
    .orderBy(torqueEvents.componentInstanceId, desc(torqueEvents.performedAt));
  return new Map(rows.map((r) => [r.instanceId, r]));
}
export type LatestTorque = {
  instanceId: string;
  id: string;
  appliedNcm: number;
  specNcm: number;
  tolerancePct: number;
  verdict: TorqueVerdict;
  reason: TorqueReason;
  performedAt: Date;
};

/** The restoration on this site now: the delivered one, else the current plan (not amended, not removed). */
export async function findCurrentRestoration(db: Db, siteId: string) {
  const [row] = await db
    .select({
      id: restorations.id,
      kind: restorations.kind,
      retention: restorations.retention,
      material: restorations.material,
      deliveredOn: restorations.deliveredOn,
      interface: restorationSites.interface,
    })
    .from(restorationSites)
    .innerJoin(restorations, eq(restorations.id, restorationSites.restorationId))
    .where(
      and(
        eq(restorationSites.siteId, siteId),
        ne(restorations.status, 'removed'),
        // An amended plan is replaced by its amendment.
        isCurrentVersion(restorations),
      ),
    )
    // What is in the mouth comes before what is only planned; then the newest.
    .orderBy(
      sql`(${restorations.status} = 'delivered') desc`,
      desc(restorations.deliveredOn),
      desc(restorations.createdAt),
    )
    .limit(1);
  if (!row) return null;
  const spans = await db
    .select({ fdi: implantSites.fdi })
    .from(restorationSites)
    .innerJoin(implantSites, eq(implantSites.id, restorationSites.siteId))
    .where(eq(restorationSites.restorationId, row.id))
    .orderBy(asc(implantSites.fdi));
  return { ...row, spansFdi: spans.map((s) => s.fdi) };
}

/** Current (not amended) torque entries of the parts, oldest first: for the re-torque reminder. */
export async function torqueReasonsByInstance(db: Db, instanceIds: string[]) {
  if (instanceIds.length === 0) return [];
  return db
    .select({
      instanceId: torqueEvents.componentInstanceId,
      reason: torqueEvents.reason,
      performedAt: torqueEvents.performedAt,
    })
    .from(torqueEvents)
    .where(and(inArray(torqueEvents.componentInstanceId, instanceIds), isCurrentVersion(torqueEvents)))
    .orderBy(asc(torqueEvents.performedAt));
}

/**
 * The current seating check of a restoration's delivery (written by the seating feature; the Stack
 * only reads it), with whether its radiograph has since been marked entered in error.
 */
export async function deliverySeating(db: Db, restorationId: string) {
  const [row] = await db
    .select({
      checkId: seatingChecks.id,
      seated: seatingChecks.seated,
      radiographId: seatingChecks.radiographId,
      radiographTakenOn: radiographs.takenOn,
      radiographEnteredInError: sql<boolean>`${radiographs.enteredInErrorAt} is not null`,
      recordedAt: seatingChecks.recordedAt,
    })
    .from(seatingChecks)
    .innerJoin(radiographs, eq(radiographs.id, seatingChecks.radiographId))
    .where(
      and(
        eq(seatingChecks.restorationId, restorationId),
        eq(seatingChecks.event, 'delivery'),
        isCurrentVersion(seatingChecks),
      ),
    );
  return row ? { ...row, recordedAt: row.recordedAt.toISOString() } : null;
}
