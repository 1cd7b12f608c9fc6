// Everything that happened at one site, for the Timeline. Each query is pinned to the site,
// which the caller has already checked the user may see, and prepared once (db/prepared.ts).
import { asc, eq, inArray, sql } from 'drizzle-orm';
import type { Database } from '../db/database.js';
import { preparedFor } from '../db/prepared.js';
import {
  complications,
  componentInstances,
  components,
  implantSystems,
  importEntries,
  impressions,
  importedFreeTextParts,
  legacyImports,
  labPrescriptions,
  passportMails,
  placements,
  platforms,
  radiographMeasurements,
  radiographs,
  radiographSites,
  recallExams,
  implantSites,
  referralSummaryMails,
  restorationSites,
  restorations,
  seatingChecks,
  torqueEvents,
  torqueWrenches,
  users,
} from '../db/schema/index.js';
import { isAmended } from '../db/amendments.js';
import { gtinOtherSystem } from './sites.repository.js';

export async function placementsOfSite(db: Database, siteId: string) {
  return placementsOfSiteQuery(db).execute({ siteId });
}
const placementsOfSiteQuery = preparedFor((db) =>
  db
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
      udi: placements.udi,
      gtin: placements.gtin,
      gtinOtherSystem: gtinOtherSystem(),
      grafting: placements.grafting,
      notes: placements.notes,
      supersedesId: placements.supersedesId,
      amendmentReason: placements.amendmentReason,
      amended: isAmended(placements),
    })
    .from(placements)
    .innerJoin(platforms, eq(platforms.id, placements.platformId))
    .innerJoin(implantSystems, eq(implantSystems.id, platforms.systemId))
    .where(eq(placements.siteId, sql.placeholder('siteId')))
    .prepare('timeline_placements'),
);

export async function restorationsOfSite(db: Database, siteId: string) {
  // The plans and their lab prescriptions side by side: both are found from the site.
  const [rows, labs] = await Promise.all([
    restorationsQuery(db).execute({ siteId }),
    labPrescriptionsQuery(db).execute({ siteId }),
  ]);
  return rows.map((r) => ({ ...r, labs: labs.filter((l) => l.restorationId === r.id) }));
}
const restorationsQuery = preparedFor((db) => {
  return db
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
      provisional: restorations.provisional,
      replacedById: restorations.replacedById,
      replacesProvisional: sql<boolean>`exists (select 1 from restorations rp where rp.replaced_by_id = ${restorations.id} and rp.provisional)`,
      impressionCoping: restorationSites.impressionCoping,
      interface: restorationSites.interface,
      spansFdi: sql<number[]>`array(select s.fdi from restoration_sites rs join implant_sites s on s.id = rs.site_id
        where rs.restoration_id = ${restorations.id} order by s.fdi)`,
    })
    .from(restorationSites)
    .innerJoin(restorations, eq(restorations.id, restorationSites.restorationId))
    .leftJoin(users, eq(users.id, restorations.plannedBy))
    .where(eq(restorationSites.siteId, sql.placeholder('siteId')))
    .prepare('timeline_restorations');
});
const labPrescriptionsQuery = preparedFor((db) =>
  db
    .select({
      id: labPrescriptions.id,
      restorationId: labPrescriptions.restorationId,
      createdAt: labPrescriptions.createdAt,
      emailedTo: labPrescriptions.emailedTo,
      byName: users.displayName,
    })
    .from(labPrescriptions)
    .innerJoin(restorationSites, eq(restorationSites.restorationId, labPrescriptions.restorationId))
    .leftJoin(users, eq(users.id, labPrescriptions.createdBy))
    .where(eq(restorationSites.siteId, sql.placeholder('siteId')))
    .prepare('timeline_lab_prescriptions'),
);

export async function partsOfSite(db: Database, siteId: string) {
  return partsOfSiteQuery(db).execute({ siteId });
}
const partsOfSiteQuery = preparedFor((db) =>
  db
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
      insertChangeId: componentInstances.insertChangeId,
      enteredInErrorReason: componentInstances.enteredInErrorReason,
      byName: users.displayName,
    })
    .from(componentInstances)
    .innerJoin(components, eq(components.id, componentInstances.componentId))
    .leftJoin(users, eq(users.id, componentInstances.recordedBy))
    .where(eq(componentInstances.siteId, sql.placeholder('siteId')))
    .orderBy(asc(componentInstances.installedOn), asc(componentInstances.recordedAt))
    .prepare('timeline_parts'),
);

export async function torqueEventsOfSite(db: Database, siteId: string) {
  return torqueEventsOfSiteQuery(db).execute({ siteId });
}
const torqueEventsOfSiteQuery = preparedFor((db) =>
  db
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
      wrenchCalibrationOverdue: torqueEvents.wrenchCalibrationOverdue,
      earlySettlingConfirmed: torqueEvents.earlySettlingConfirmed,
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
    .where(eq(componentInstances.siteId, sql.placeholder('siteId')))
    .orderBy(asc(torqueEvents.performedAt))
    .prepare('timeline_torqueevents'),
);

export async function complicationsOfSite(db: Database, siteId: string) {
  return complicationsOfSiteQuery(db).execute({ siteId });
}
const complicationsOfSiteQuery = preparedFor((db) =>
  db
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
    .where(eq(complications.siteId, sql.placeholder('siteId')))
    .prepare('timeline_complications'),
);

/** Recall exams are written by the recall feature; the Timeline only reads them. */
export async function recallExamsOfSite(db: Database, siteId: string) {
  return recallExamsOfSiteQuery(db).execute({ siteId });
}
const recallExamsOfSiteQuery = preparedFor((db) =>
  db
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
    .where(eq(recallExams.siteId, sql.placeholder('siteId')))
    .prepare('timeline_recallexams'),
);

/** Radiographs showing the site, entered-in-error ones included (the Timeline keeps them, marked). */
export async function radiographsOfSite(db: Database, siteId: string) {
  return radiographsOfSiteQuery(db).execute({ siteId });
}
const radiographsOfSiteQuery = preparedFor((db) =>
  db
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
    .where(eq(radiographSites.siteId, sql.placeholder('siteId')))
    .prepare('timeline_radiographs'),
);

/** Bone levels measured at the site, every version, with the date of the image they were read from. */
export async function measurementsOfSite(db: Database, siteId: string) {
  return measurementsOfSiteQuery(db).execute({ siteId });
}
const measurementsOfSiteQuery = preparedFor((db) =>
  db
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
    .where(eq(radiographMeasurements.siteId, sql.placeholder('siteId')))
    .prepare('timeline_measurements'),
);

/** Seating checks of the restorations on the site (written by the seating feature), every version. */
export async function seatingChecksOfSite(db: Database, siteId: string) {
  return seatingChecksOfSiteQuery(db).execute({ siteId });
}
const seatingChecksOfSiteQuery = preparedFor((db) =>
  db
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
          .where(eq(restorationSites.siteId, sql.placeholder('siteId'))),
      ),
    )
    .prepare('timeline_seatingchecks'),
);

/** The recorded impressions (every version) of the restorations at the site, with their scan bodies and files counted. */
export async function impressionsOfSite(db: Database, siteId: string) {
  return impressionsOfSiteQuery(db).execute({ siteId });
}
const impressionsOfSiteQuery = preparedFor((db) =>
  db
    .select({
      id: impressions.id,
      restorationId: impressions.restorationId,
      method: impressions.method,
      takenOn: impressions.takenOn,
      note: impressions.note,
      byName: users.displayName,
      supersedesId: impressions.supersedesId,
      amendmentReason: impressions.amendmentReason,
      amended: isAmended(impressions),
      scanBodies: sql<string[]>`array(select s.fdi || ': ' || c.name || coalesce(' lot ' || b.lot, '')
        from impression_scan_bodies b join implant_sites s on s.id = b.site_id join components c on c.id = b.component_id
        where b.impression_id = ${impressions.id} order by s.fdi)`,
      scanFileCount: sql<number>`(select count(*)::int from scan_files f where f.impression_id = ${impressions.id})`,
    })
    .from(impressions)
    .leftJoin(users, eq(users.id, impressions.recordedBy))
    .where(
      inArray(
        impressions.restorationId,
        db
          .select({ id: restorationSites.restorationId })
          .from(restorationSites)
          .where(eq(restorationSites.siteId, sql.placeholder('siteId'))),
      ),
    )
    .prepare('timeline_impressions'),
);

/** The patient's referral summaries e-mailed (or waiting to be) to a surgeon: shown on every site. */
export function referralSummariesOfSite(db: Database, siteId: string) {
  return referralSummariesQuery(db).execute({ siteId });
}

const referralSummariesQuery = preparedFor((db) =>
  db
    .select({
      id: referralSummaryMails.id,
      sentTo: referralSummaryMails.sentTo,
      status: referralSummaryMails.status,
      requestedAt: referralSummaryMails.requestedAt,
      sentAt: referralSummaryMails.sentAt,
      byName: users.displayName,
    })
    .from(referralSummaryMails)
    .innerJoin(implantSites, eq(implantSites.patientId, referralSummaryMails.patientId))
    .leftJoin(users, eq(users.id, referralSummaryMails.requestedBy))
    .where(eq(implantSites.id, sql.placeholder('siteId')))
    .prepare('timeline_referral_summaries'),
);
/** The implant passport e-mails of the site's patient (a patient-wide entry, on every site). */
export function passportMailsOfSite(db: Database, siteId: string) {
  return passportMailsQuery(db).execute({ siteId });
}

const passportMailsQuery = preparedFor((db) =>
  db
    .select({
      id: passportMails.id,
      sentTo: passportMails.sentTo,
      status: passportMails.status,
      requestedAt: passportMails.requestedAt,
      sentAt: passportMails.sentAt,
      byName: users.displayName,
    })
    .from(passportMails)
    .innerJoin(implantSites, eq(implantSites.patientId, passportMails.patientId))
    .leftJoin(users, eq(users.id, passportMails.requestedBy))
    .where(eq(implantSites.id, sql.placeholder('siteId')))
    .prepare('timeline_passport_mails'),
);
/** Parts a legacy import kept as free text (not in the catalogue). */
export async function freeTextPartsOfSite(db: Database, siteId: string) {
  return freeTextPartsQuery(db).execute({ siteId });
}
const freeTextPartsQuery = preparedFor((db) =>
  db
    .select({
      id: importedFreeTextParts.id,
      partRef: importedFreeTextParts.partRef,
      partName: importedFreeTextParts.partName,
      lot: importedFreeTextParts.lot,
      installedOn: importedFreeTextParts.installedOn,
    })
    .from(importedFreeTextParts)
    .where(eq(importedFreeTextParts.siteId, sql.placeholder('siteId')))
    .prepare('timeline_free_text_parts'),
);

/** The import marks of the given records: the file and row each was imported from. */
export async function importMarksOf(db: Database, recordIds: string[]) {
  if (recordIds.length === 0) return [];
  return importMarksQuery(db).execute({ recordIds });
}
// The records as one array parameter (`= any`): one named statement for any number of them.
const importMarksQuery = preparedFor((db) =>
  db
    .select({ recordId: importEntries.recordId, rowNumber: importEntries.rowNumber, fileName: legacyImports.fileName })
    .from(importEntries)
    .innerJoin(legacyImports, eq(legacyImports.id, importEntries.importId))
    .where(sql`${importEntries.recordId} = any(${sql.placeholder('recordIds')}::uuid[])`)
    .prepare('timeline_import_marks'),
);
