import { and, asc, desc, eq, ne, sql } from 'drizzle-orm';
import type { TorqueReason, TorqueVerdict } from '@torquetrail/contracts';
import { alias } from 'drizzle-orm/pg-core';
import { partInPlace } from '../db/parts-in-place.js';
import type { Database } from '../db/database.js';
import { preparedFor } from '../db/prepared.js';
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
  systemGtins,
  torqueEvents,
} from '../db/schema/index.js';
import type { Scope } from '../authz/scope.js';
import { scopeParams, visiblePatientsPrepared } from '../authz/visible-patients.js';
import { isCurrentVersion } from '../db/amendments.js';

export async function findVisibleSite(db: Database, scope: Scope, siteId: string) {
  const [row] = await visibleSiteQuery(db).execute({ siteId, ...scopeParams(scope) });
  return row ?? null;
}
const visibleSiteQuery = preparedFor((db) =>
  db
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
    .where(and(eq(implantSites.id, sql.placeholder('siteId')), visiblePatientsPrepared()))
    .prepare('site_file_site'),
);

/**
 * The system the practice's catalogue gives the placement's GTIN when it is another than the
 * chosen platform's (null when they agree or the GTIN is unknown): flagged in the Site file.
 */
export const gtinOtherSystem = () => sql<string | null>`(
  select os.name from ${systemGtins} sg join ${implantSystems} os on os.id = sg.system_id
  where sg.practice_id = ${placements.practiceId} and sg.gtin = ${placements.gtin}
    and sg.system_id <> ${platforms.systemId})`;

/** The current placement: the one no later amendment supersedes. */
export async function findCurrentPlacement(db: Database, siteId: string) {
  const [row] = await currentPlacementQuery(db).execute({ siteId });
  return row ?? null;
}
const currentPlacementQuery = preparedFor((db) =>
  db
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
      udi: placements.udi,
      gtin: placements.gtin,
      insertionTorqueNcm: placements.insertionTorqueNcm,
      stabilityIsq: placements.stabilityIsq,
      loadingProtocol: placements.loadingProtocol,
      grafting: placements.grafting,
      notes: placements.notes,
      gtinOtherSystem: gtinOtherSystem(),
    })
    .from(placements)
    .innerJoin(platforms, eq(platforms.id, placements.platformId))
    .innerJoin(implantSystems, eq(implantSystems.id, platforms.systemId))
    .where(and(eq(placements.siteId, sql.placeholder('siteId')), isCurrentVersion(placements)))
    .orderBy(desc(placements.recordedAt))
    .limit(1)
    .prepare('site_file_placement'),
);

/** Parts in the mouth now (not removed), from the implant outward, each as the version installed. */
export async function listCurrentParts(db: Database, siteId: string) {
  return currentPartsQuery(db).execute({ siteId });
}
const currentPartsQuery = preparedFor((db) => {
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
    .where(and(eq(componentInstances.siteId, sql.placeholder('siteId')), partInPlace()))
    .orderBy(asc(componentInstances.installedOn), asc(componentInstances.recordedAt))
    .prepare('site_file_parts');
});

/**
 * Every current (not amended) torque entry of the parts in the mouth at the site, oldest first:
 * the last one per part for the Stack and the whole list for the re-torque reminder, in one read.
 */
export async function currentTorqueOfSite(db: Database, siteId: string): Promise<SiteTorque[]> {
  return currentTorqueQuery(db).execute({ siteId });
}
const currentTorqueQuery = preparedFor((db) =>
  db
    .select({
      instanceId: torqueEvents.componentInstanceId,
      id: torqueEvents.id,
      appliedNcm: torqueEvents.appliedNcm,
      specNcm: torqueEvents.specNcm,
      tolerancePct: torqueEvents.tolerancePct,
      verdict: torqueEvents.verdict,
      reason: torqueEvents.reason,
      performedAt: torqueEvents.performedAt,
      wrenchCalibrationOverdue: torqueEvents.wrenchCalibrationOverdue,
    })
    .from(torqueEvents)
    .innerJoin(componentInstances, eq(componentInstances.id, torqueEvents.componentInstanceId))
    .where(and(eq(componentInstances.siteId, sql.placeholder('siteId')), partInPlace(), isCurrentVersion(torqueEvents)))
    .orderBy(asc(torqueEvents.performedAt), asc(torqueEvents.recordedAt))
    .prepare('site_file_torque'),
);
export type SiteTorque = {
  instanceId: string;
  id: string;
  appliedNcm: number;
  specNcm: number;
  tolerancePct: number;
  verdict: TorqueVerdict;
  reason: TorqueReason;
  performedAt: Date;
  wrenchCalibrationOverdue: boolean;
};

/**
 * The restoration on this site now: the delivered one, else the current plan (not amended, not
 * removed), with the positions it spans.
 */
export async function findCurrentRestoration(db: Database, siteId: string) {
  const [row] = await currentRestorationQuery(db).execute({ siteId });
  return row ?? null;
}
const currentRestorationQuery = preparedFor((db) => {
  return (
    db
      .select({
        id: restorations.id,
        kind: restorations.kind,
        retention: restorations.retention,
        material: restorations.material,
        deliveredOn: restorations.deliveredOn,
        provisional: restorations.provisional,
        plannedReplacementOn: restorations.plannedReplacementOn,
        interface: restorationSites.interface,
        spansFdi: sql<number[]>`array(select s.fdi from restoration_sites rs join implant_sites s on s.id = rs.site_id
        where rs.restoration_id = ${restorations.id} order by s.fdi)`,
      })
      .from(restorationSites)
      .innerJoin(restorations, eq(restorations.id, restorationSites.restorationId))
      .where(
        and(
          eq(restorationSites.siteId, sql.placeholder('siteId')),
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
      .limit(1)
      .prepare('site_file_restoration')
  );
});

/**
 * The current delivery seating checks of the restorations on the site (written by the seating
 * feature; the Stack only reads the one of its restoration), with whether the radiograph has since
 * been marked entered in error. Read by site, so it runs beside the restoration's own read.
 */
export async function deliverySeatingOfSite(db: Database, siteId: string) {
  const rows = await deliverySeatingQuery(db).execute({ siteId });
  return rows.map(({ restorationId, ...row }) => ({
    restorationId,
    seating: { ...row, recordedAt: row.recordedAt.toISOString() },
  }));
}
const deliverySeatingQuery = preparedFor((db) =>
  db
    .select({
      restorationId: seatingChecks.restorationId,
      checkId: seatingChecks.id,
      seated: seatingChecks.seated,
      radiographId: seatingChecks.radiographId,
      radiographTakenOn: radiographs.takenOn,
      radiographEnteredInError: sql<boolean>`${radiographs.enteredInErrorAt} is not null`,
      recordedAt: seatingChecks.recordedAt,
    })
    .from(seatingChecks)
    .innerJoin(radiographs, eq(radiographs.id, seatingChecks.radiographId))
    .innerJoin(restorationSites, eq(restorationSites.restorationId, seatingChecks.restorationId))
    .where(
      and(
        eq(restorationSites.siteId, sql.placeholder('siteId')),
        eq(seatingChecks.event, 'delivery'),
        isCurrentVersion(seatingChecks),
      ),
    )
    .prepare('site_file_seating'),
);
