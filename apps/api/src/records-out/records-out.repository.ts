import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { partInPlace, partWasFitted } from '../db/parts-in-place.js';
import type { Db, Tx } from '../db/database.js';
import { isCurrentVersion } from '../db/amendments.js';
import {
  componentInstances,
  components,
  implantSites,
  implantSystems,
  impressionScanBodies,
  impressions,
  passportMails,
  patients,
  placements,
  platforms,
  practices,
  recallExamSites,
  recallExams,
  recalls,
  restorationSiteComponents,
  restorationSites,
  restorations,
  scanFiles,
  torqueEvents,
  users,
} from '../db/schema/index.js';
import type { Scope } from '../authz/scope.js';
import { visiblePatients } from '../authz/visible-patients.js';

/** The patient, if the user may see them, with their practice's name and contact. */
export async function findVisiblePatient(db: Db, scope: Scope, patientId: string) {
  const [row] = await db
    .select({
      id: patients.id,
      practiceId: patients.practiceId,
      chartNumber: patients.chartNumber,
      givenName: patients.givenName,
      familyName: patients.familyName,
      birthDate: patients.birthDate,
      sex: patients.sex,
      email: patients.email,
      phone: patients.phone,
      emailConsent: patients.emailReminderConsent,
      practice: {
        id: practices.id,
        name: practices.name,
        dateFormat: practices.dateFormat,
        phone: practices.phone,
        email: practices.email,
        address: practices.address,
      },
    })
    .from(patients)
    .innerJoin(practices, eq(practices.id, patients.practiceId))
    .where(and(eq(patients.id, patientId), visiblePatients(scope)));
  return row ?? null;
}

/** Current placements of the patient's live sites (a failed or removed site is no longer in the mouth). */
export async function placementsOfPatient(db: Db, patientId: string) {
  return db
    .select({
      siteId: implantSites.id,
      fdi: implantSites.fdi,
      id: placements.id,
      placedOn: placements.placedOn,
      surgeonName: placements.surgeonName,
      systemName: implantSystems.name,
      manufacturer: implantSystems.manufacturer,
      platformName: platforms.name,
      diameterMm: platforms.diameterMm,
      connection: platforms.connection,
      lengthMm: placements.lengthMm,
      lot: placements.lot,
      udi: placements.udi,
    })
    .from(placements)
    .innerJoin(implantSites, eq(implantSites.id, placements.siteId))
    .innerJoin(platforms, eq(platforms.id, placements.platformId))
    .innerJoin(implantSystems, eq(implantSystems.id, platforms.systemId))
    .where(
      and(
        eq(placements.patientId, patientId),
        isCurrentVersion(placements),
        sql`${implantSites.status} not in ('failed', 'removed')`,
      ),
    )
    .orderBy(asc(implantSites.fdi), desc(placements.recordedAt));
}

/** Delivered restorations (current versions) and the sites they rest on. */
export async function deliveredRestorationsOfPatient(db: Db, patientId: string) {
  return db
    .select({
      id: restorations.id,
      siteId: restorationSites.siteId,
      fdi: implantSites.fdi,
      kind: restorations.kind,
      retention: restorations.retention,
      material: restorations.material,
      deliveredOn: restorations.deliveredOn,
      dentistName: users.displayName,
    })
    .from(restorations)
    .innerJoin(restorationSites, eq(restorationSites.restorationId, restorations.id))
    .innerJoin(implantSites, eq(implantSites.id, restorationSites.siteId))
    .leftJoin(users, eq(users.id, restorations.plannedBy))
    .where(
      and(eq(restorations.patientId, patientId), eq(restorations.status, 'delivered'), isCurrentVersion(restorations)),
    )
    .orderBy(asc(restorations.deliveredOn), asc(implantSites.fdi));
}

/** Parts in the mouth now (not removed), each as the catalogue version installed, with its maker. */
export async function partsOfPatient(db: Db, patientId: string) {
  return db
    .select({
      id: componentInstances.id,
      siteId: componentInstances.siteId,
      kind: components.kind,
      name: components.name,
      referenceCode: components.referenceCode,
      manufacturer: implantSystems.manufacturer,
      lot: componentInstances.lot,
      installedOn: componentInstances.installedOn,
      torqueSpecNcm: components.torqueSpecNcm,
      tolerancePct: components.tolerancePct,
    })
    .from(componentInstances)
    .innerJoin(components, eq(components.id, componentInstances.componentId))
    .innerJoin(platforms, eq(platforms.id, components.platformId))
    .innerJoin(implantSystems, eq(implantSystems.id, platforms.systemId))
    .where(and(eq(componentInstances.patientId, patientId), partInPlace()))
    .orderBy(asc(componentInstances.installedOn), asc(componentInstances.recordedAt));
}

/** The current version of each of the patient's impressions, oldest first, with who recorded it. */
export async function impressionsOfPatient(db: Db, patientId: string) {
  return db
    .select({
      id: impressions.id,
      restorationId: impressions.restorationId,
      method: impressions.method,
      takenOn: impressions.takenOn,
      recordedByName: users.displayName,
      retention: restorations.retention,
    })
    .from(impressions)
    .innerJoin(restorations, eq(restorations.id, impressions.restorationId))
    .innerJoin(users, eq(users.id, impressions.recordedBy))
    .where(and(eq(impressions.patientId, patientId), isCurrentVersion(impressions)))
    .orderBy(asc(impressions.takenOn), asc(impressions.recordedAt));
}

/** The sites of the given restorations (the teeth an impression recorded). */
export async function sitesOfRestorations(db: Db, restorationIds: string[]) {
  if (restorationIds.length === 0) return [];
  return db
    .select({ restorationId: restorationSites.restorationId, siteId: restorationSites.siteId, fdi: implantSites.fdi })
    .from(restorationSites)
    .innerJoin(implantSites, eq(implantSites.id, restorationSites.siteId))
    .where(inArray(restorationSites.restorationId, restorationIds))
    .orderBy(asc(implantSites.fdi));
}

const partMaker = {
  name: components.name,
  referenceCode: components.referenceCode,
  kind: components.kind,
  copingLevel: components.copingLevel,
  manufacturer: implantSystems.manufacturer,
};

/** The scan bodies of the given impression versions, with the catalogue version recorded and its maker. */
export async function scanBodiesOfImpressions(db: Db, impressionIds: string[]) {
  if (impressionIds.length === 0) return [];
  return db
    .select({
      id: impressionScanBodies.id,
      impressionId: impressionScanBodies.impressionId,
      fdi: implantSites.fdi,
      lot: impressionScanBodies.lot,
      ...partMaker,
    })
    .from(impressionScanBodies)
    .innerJoin(implantSites, eq(implantSites.id, impressionScanBodies.siteId))
    .innerJoin(components, eq(components.id, impressionScanBodies.componentId))
    .innerJoin(platforms, eq(platforms.id, components.platformId))
    .innerJoin(implantSystems, eq(implantSystems.id, platforms.systemId))
    .where(inArray(impressionScanBodies.impressionId, impressionIds))
    .orderBy(asc(implantSites.fdi));
}

/** The impression copings planned at each site of the given restorations (an analog impression is taken with them). */
export async function copingsOfRestorations(db: Db, restorationIds: string[]) {
  if (restorationIds.length === 0) return [];
  return db
    .select({
      id: restorationSiteComponents.id,
      restorationId: restorationSites.restorationId,
      siteId: restorationSites.siteId,
      componentId: components.id,
      fdi: implantSites.fdi,
      ...partMaker,
    })
    .from(restorationSiteComponents)
    .innerJoin(restorationSites, eq(restorationSites.id, restorationSiteComponents.restorationSiteId))
    .innerJoin(implantSites, eq(implantSites.id, restorationSites.siteId))
    .innerJoin(components, eq(components.id, restorationSiteComponents.componentId))
    .innerJoin(platforms, eq(platforms.id, components.platformId))
    .innerJoin(implantSystems, eq(implantSystems.id, platforms.systemId))
    .where(and(inArray(restorationSites.restorationId, restorationIds), eq(components.kind, 'impression-coping')))
    .orderBy(asc(implantSites.fdi));
}

/** Lots recorded for parts delivered with the given restorations (a coping's lot, when it was recorded). */
export async function partLotsOfRestorations(db: Db, restorationIds: string[]) {
  if (restorationIds.length === 0) return [];
  return db
    .select({
      restorationId: componentInstances.restorationId,
      siteId: componentInstances.siteId,
      componentId: componentInstances.componentId,
      lot: componentInstances.lot,
    })
    .from(componentInstances)
    .where(
      and(
        inArray(componentInstances.restorationId, restorationIds),
        partWasFitted(),
        sql`${componentInstances.lot} is not null`,
      ),
    );
}

/** The scan files of the given restorations (every upload is kept), oldest first. */
export async function scanFilesOfRestorations(db: Db, restorationIds: string[]) {
  if (restorationIds.length === 0) return [];
  return db
    .select({
      id: scanFiles.id,
      restorationId: scanFiles.restorationId,
      fileType: scanFiles.fileType,
      originalName: scanFiles.originalName,
      sizeBytes: scanFiles.sizeBytes,
      sha256: scanFiles.sha256,
      uploadedAt: scanFiles.uploadedAt,
    })
    .from(scanFiles)
    .where(inArray(scanFiles.restorationId, restorationIds))
    .orderBy(asc(scanFiles.uploadedAt));
}

/** Every current torque entry of the given parts, oldest first. */
export async function torqueOfParts(db: Db, instanceIds: string[]) {
  if (instanceIds.length === 0) return [];
  return db
    .select({
      instanceId: torqueEvents.componentInstanceId,
      appliedNcm: torqueEvents.appliedNcm,
      reason: torqueEvents.reason,
      performedAt: torqueEvents.performedAt,
    })
    .from(torqueEvents)
    .where(and(inArray(torqueEvents.componentInstanceId, instanceIds), isCurrentVersion(torqueEvents)))
    .orderBy(asc(torqueEvents.performedAt));
}

/** Current recall exams of the patient with their examiner, oldest first. */
export async function examsOfPatient(db: Db, patientId: string) {
  const examiner = alias(users, 'examiner');
  return db
    .select({
      id: recallExams.id,
      siteId: recallExams.siteId,
      examinedOn: recallExams.examinedOn,
      examinerName: examiner.displayName,
      boneLevelMm: recallExams.boneLevelMm,
      status: recallExams.status,
      rulesVersion: recallExams.rulesVersion,
    })
    .from(recallExams)
    .innerJoin(examiner, eq(examiner.id, recallExams.examinerId))
    .where(and(eq(recallExams.patientId, patientId), isCurrentVersion(recallExams)))
    .orderBy(asc(recallExams.examinedOn), asc(recallExams.recordedAt));
}

export async function probingOfExams(db: Db, examIds: string[]) {
  if (examIds.length === 0) return [];
  return db
    .select({
      examId: recallExamSites.examId,
      position: recallExamSites.position,
      depthMm: recallExamSites.probingDepthMm,
      bleeding: recallExamSites.bleeding,
      suppuration: recallExamSites.suppuration,
    })
    .from(recallExamSites)
    .where(inArray(recallExamSites.examId, examIds));
}

/** The patient's next scheduled recall, if any. */
export async function nextRecallOf(db: Db, patientId: string): Promise<string | null> {
  const [row] = await db
    .select({ dueOn: recalls.dueOn })
    .from(recalls)
    .where(and(eq(recalls.patientId, patientId), eq(recalls.status, 'scheduled')))
    .orderBy(asc(recalls.dueOn))
    .limit(1);
  return row?.dueOn ?? null;
}

/**
 * Records a request to e-mail the passport, or finds the one already waiting (the partial unique
 * index keeps one pending request per patient, also under concurrent presses). `created` says
 * which, so the caller can remove a PDF it stored for nothing.
 */
export async function requestPassportMail(
  db: Db,
  v: { practiceId: string; patientId: string; sentTo: string; objectKey: string; requestedBy: string },
): Promise<{ id: string; created: boolean }> {
  const [inserted] = await db.insert(passportMails).values(v).onConflictDoNothing().returning({ id: passportMails.id });
  if (inserted) return { id: inserted.id, created: true };
  const [pending] = await db
    .select({ id: passportMails.id })
    .from(passportMails)
    .where(and(eq(passportMails.patientId, v.patientId), eq(passportMails.status, 'pending')));
  if (!pending) throw new Error('the pending passport mail vanished between insert and select');
  return { id: pending.id, created: false };
}

export async function listPendingPassportMails(db: Db) {
  return db.select({ id: passportMails.id }).from(passportMails).where(eq(passportMails.status, 'pending'));
}

/** Locks one passport mail for its send, with what the message needs. */
export async function lockPassportMail(tx: Tx, id: string) {
  const [row] = await tx
    .select({
      id: passportMails.id,
      patientId: passportMails.patientId,
      status: passportMails.status,
      sentTo: passportMails.sentTo,
      objectKey: passportMails.objectKey,
      chartNumber: patients.chartNumber,
      givenName: patients.givenName,
      practiceName: practices.name,
    })
    .from(passportMails)
    .innerJoin(patients, eq(patients.id, passportMails.patientId))
    .innerJoin(practices, eq(practices.id, passportMails.practiceId))
    .where(eq(passportMails.id, id))
    .for('update', { of: passportMails });
  return row ?? null;
}

export async function markPassportMailSent(tx: Tx, id: string, messageId: string) {
  await tx
    .update(passportMails)
    .set({
      status: 'sent',
      messageId,
      sentAt: new Date(),
      attempts: sql`${passportMails.attempts} + 1`,
      lastError: null,
    })
    .where(eq(passportMails.id, id));
}

export async function markPassportMailFailed(tx: Tx, id: string, error: string, final: boolean) {
  await tx
    .update(passportMails)
    .set({
      attempts: sql`${passportMails.attempts} + 1`,
      lastError: error.slice(0, 500),
      ...(final ? { status: 'failed' as const } : {}),
    })
    .where(eq(passportMails.id, id));
}

/** The latest passport mails of a patient, newest first (what the patient screen shows). */
export async function passportMailsOf(db: Db, patientId: string) {
  return db
    .select({
      id: passportMails.id,
      sentTo: passportMails.sentTo,
      status: passportMails.status,
      requestedAt: passportMails.requestedAt,
      sentAt: passportMails.sentAt,
    })
    .from(passportMails)
    .where(eq(passportMails.patientId, patientId))
    .orderBy(desc(passportMails.requestedAt))
    .limit(5);
}
