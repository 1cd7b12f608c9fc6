// Everything that happened at one site, for the Timeline. Each query is pinned to the site,
// which the caller has already checked the user may see.
import { asc, eq, inArray } from 'drizzle-orm';
import type { Db } from '../db/database.js';
import {
  complications,
  componentInstances,
  components,
  implantSites,
  implantSystems,
  importEntries,
  importedFreeTextParts,
  legacyImports,
  labPrescriptions,
  placements,
  platforms,
  radiographMeasurements,
  radiographs,
  radiographSites,
  recallExams,
  restorationSites,
  restorations,
  seatingChecks,
  torqueEvents,
  torqueWrenches,
  users,
} from '../db/schema/index.js';
import { isAmended } from '../db/amendments.js';

export async function placementsOfSite(db: Db, siteId: string) {
  return db
    .select({
      id: placements.id,
      placedOn: placements.placedOn,
      systemName: implantSystems.name,
      platformName: platforms.name,
      lengthMm: placements.lengthMm,
      insertionTorqueNcm: placements.insertionTorqueNcm,
      stabilityIsq: placements.stabilityIsq,
      surgeonName: placements.surgeonName,
      lot: placements.lot,
      supersedesId: placements.supersedesId,
      amendmentReason: placements.amendmentReason,
      amended: isAmended(placements),
    })
    .from(placements)
    .innerJoin(platforms, eq(platforms.id, placements.platformId))
    .innerJoin(implantSystems, eq(implantSystems.id, platforms.systemId))
    .where(eq(placements.siteId, siteId));
}

export async function restorationsOfSite(db: Db, siteId: string) {
  const rows = await db
    .select({
      id: restorations.id,
      kind: restorations.kind,
      retention: restorations.retention,
      material: restorations.material,
      shade: restorations.shade,
      status: restorations.status,
      copingsSplinted: restorations.copingsSplinted,
      impressionTakenOn: restorations.impressionTakenOn,
      deliveredOn: restorations.deliveredOn,
      createdAt: restorations.createdAt,
      plannedByName: users.displayName,
      findings: restorations.findings,
      supersedesId: restorations.supersedesId,
      amendmentReason: restorations.amendmentReason,
      amended: isAmended(restorations),
      impressionCoping: restorationSites.impressionCoping,
      interface: restorationSites.interface,
    })
    .from(restorationSites)
    .innerJoin(restorations, eq(restorations.id, restorationSites.restorationId))
    .leftJoin(users, eq(users.id, restorations.plannedBy))
    .where(eq(restorationSites.siteId, siteId));
  const ids = rows.map((r) => r.id);
  const spans =
    ids.length === 0
      ? []
      : await db
          .select({ restorationId: restorationSites.restorationId, fdi: implantSites.fdi })
          .from(restorationSites)
          .innerJoin(implantSites, eq(implantSites.id, restorationSites.siteId))
          .where(inArray(restorationSites.restorationId, ids))
          .orderBy(asc(implantSites.fdi));
  const labs =
    ids.length === 0
      ? []
      : await db
          .select({
            id: labPrescriptions.id,
            restorationId: labPrescriptions.restorationId,
            createdAt: labPrescriptions.createdAt,
            emailedTo: labPrescriptions.emailedTo,
            byName: users.displayName,
          })
          .from(labPrescriptions)
          .leftJoin(users, eq(users.id, labPrescriptions.createdBy))
          .where(inArray(labPrescriptions.restorationId, ids));
  return rows.map((r) => ({
    ...r,
    spansFdi: spans.filter((s) => s.restorationId === r.id).map((s) => s.fdi),
    labs: labs.filter((l) => l.restorationId === r.id),
  }));
}

export async function partsOfSite(db: Db, siteId: string) {
  return db
    .select({
      id: componentInstances.id,
      kind: components.kind,
      name: components.name,
      referenceCode: components.referenceCode,
      torqueSpecNcm: components.torqueSpecNcm,
      tolerancePct: components.tolerancePct,
      lot: componentInstances.lot,
      installedOn: componentInstances.installedOn,
      removedOn: componentInstances.removedOn,
      replacesId: componentInstances.replacesId,
      byName: users.displayName,
    })
    .from(componentInstances)
    .innerJoin(components, eq(components.id, componentInstances.componentId))
    .leftJoin(users, eq(users.id, componentInstances.recordedBy))
    .where(eq(componentInstances.siteId, siteId))
    .orderBy(asc(componentInstances.installedOn), asc(componentInstances.recordedAt));
}

export async function torqueEventsOfSite(db: Db, siteId: string) {
  return db
    .select({
      id: torqueEvents.id,
      componentInstanceId: torqueEvents.componentInstanceId,
      partName: components.name,
      appliedNcm: torqueEvents.appliedNcm,
      specNcm: torqueEvents.specNcm,
      tolerancePct: torqueEvents.tolerancePct,
      verdict: torqueEvents.verdict,
      reason: torqueEvents.reason,
      wrenchLabel: torqueWrenches.label,
      performedAt: torqueEvents.performedAt,
      recordedAt: torqueEvents.recordedAt,
      byName: users.displayName,
      supersedesId: torqueEvents.supersedesId,
      amendmentReason: torqueEvents.amendmentReason,
      amended: isAmended(torqueEvents),
    })
    .from(torqueEvents)
    .innerJoin(componentInstances, eq(componentInstances.id, torqueEvents.componentInstanceId))
    .innerJoin(components, eq(components.id, componentInstances.componentId))
    .leftJoin(torqueWrenches, eq(torqueWrenches.id, torqueEvents.wrenchId))
    .leftJoin(users, eq(users.id, torqueEvents.recordedBy))
    .where(eq(componentInstances.siteId, siteId))
    .orderBy(asc(torqueEvents.performedAt));
}

export async function complicationsOfSite(db: Db, siteId: string) {
  return db
    .select({
      id: complications.id,
      kind: complications.kind,
      occurredOn: complications.occurredOn,
      notes: complications.notes,
      componentInstanceId: complications.componentInstanceId,
      partName: components.name,
      byName: users.displayName,
      recordedAt: complications.recordedAt,
      supersedesId: complications.supersedesId,
      amendmentReason: complications.amendmentReason,
      amended: isAmended(complications),
    })
    .from(complications)
    .leftJoin(componentInstances, eq(componentInstances.id, complications.componentInstanceId))
    .leftJoin(components, eq(components.id, componentInstances.componentId))
    .leftJoin(users, eq(users.id, complications.recordedBy))
    .where(eq(complications.siteId, siteId));
}

/** Recall exams are written by the recall feature; the Timeline only reads them. */
export async function recallExamsOfSite(db: Db, siteId: string) {
  return db
    .select({
      id: recallExams.id,
      examinedOn: recallExams.examinedOn,
      status: recallExams.status,
      boneLevelMm: recallExams.boneLevelMm,
      byName: users.displayName,
      supersedesId: recallExams.supersedesId,
      amendmentReason: recallExams.amendmentReason,
      amended: isAmended(recallExams),
    })
    .from(recallExams)
    .leftJoin(users, eq(users.id, recallExams.examinerId))
    .where(eq(recallExams.siteId, siteId));
}

/** Radiographs showing the site, entered-in-error ones included (the Timeline keeps them, marked). */
export async function radiographsOfSite(db: Db, siteId: string) {
  return db
    .select({
      id: radiographs.id,
      kind: radiographs.kind,
      fileType: radiographs.fileType,
      takenOn: radiographs.takenOn,
      uploadedAt: radiographs.uploadedAt,
      note: radiographs.note,
      enteredInErrorReason: radiographs.enteredInErrorReason,
      byName: users.displayName,
    })
    .from(radiographSites)
    .innerJoin(radiographs, eq(radiographs.id, radiographSites.radiographId))
    .leftJoin(users, eq(users.id, radiographs.uploadedBy))
    .where(eq(radiographSites.siteId, siteId));
}

/** Bone levels measured at the site, every version, with the date of the image they were read from. */
export async function measurementsOfSite(db: Db, siteId: string) {
  return db
    .select({
      id: radiographMeasurements.id,
      radiographId: radiographMeasurements.radiographId,
      mesialMm: radiographMeasurements.mesialMm,
      distalMm: radiographMeasurements.distalMm,
      measuredAt: radiographMeasurements.measuredAt,
      takenOn: radiographs.takenOn,
      enteredInErrorReason: radiographs.enteredInErrorReason,
      byName: users.displayName,
      supersedesId: radiographMeasurements.supersedesId,
      amendmentReason: radiographMeasurements.amendmentReason,
      amended: isAmended(radiographMeasurements),
    })
    .from(radiographMeasurements)
    .innerJoin(radiographs, eq(radiographs.id, radiographMeasurements.radiographId))
    .leftJoin(users, eq(users.id, radiographMeasurements.measuredBy))
    .where(eq(radiographMeasurements.siteId, siteId));
}

/** Seating checks of the restorations on the site (written by the seating feature), every version. */
export async function seatingChecksOfSite(db: Db, siteId: string) {
  return db
    .select({
      id: seatingChecks.id,
      restorationId: seatingChecks.restorationId,
      event: seatingChecks.event,
      seated: seatingChecks.seated,
      note: seatingChecks.note,
      radiographId: seatingChecks.radiographId,
      radiographTakenOn: radiographs.takenOn,
      enteredInErrorReason: radiographs.enteredInErrorReason,
      recordedAt: seatingChecks.recordedAt,
      byName: users.displayName,
      supersedesId: seatingChecks.supersedesId,
      amendmentReason: seatingChecks.amendmentReason,
      amended: isAmended(seatingChecks),
    })
    .from(seatingChecks)
    .innerJoin(radiographs, eq(radiographs.id, seatingChecks.radiographId))
    .leftJoin(users, eq(users.id, seatingChecks.recordedBy))
    .where(
      inArray(
        seatingChecks.restorationId,
        db
          .select({ id: restorationSites.restorationId })
          .from(restorationSites)
          .where(eq(restorationSites.siteId, siteId)),
      ),
    );
}

/** Parts a legacy import kept as free text (not in the catalogue). */
export async function freeTextPartsOfSite(db: Db, siteId: string) {
  return db
    .select({
      id: importedFreeTextParts.id,
      partRef: importedFreeTextParts.partRef,
      partName: importedFreeTextParts.partName,
      lot: importedFreeTextParts.lot,
      installedOn: importedFreeTextParts.installedOn,
    })
    .from(importedFreeTextParts)
    .where(eq(importedFreeTextParts.siteId, siteId));
}

/** The import marks of the given records: the file and row each was imported from. */
export async function importMarksOf(db: Db, recordIds: string[]) {
  if (recordIds.length === 0) return [];
  return db
    .select({ recordId: importEntries.recordId, rowNumber: importEntries.rowNumber, fileName: legacyImports.fileName })
    .from(importEntries)
    .innerJoin(legacyImports, eq(legacyImports.id, importEntries.importId))
    .where(inArray(importEntries.recordId, recordIds));
}
