import { and, asc, eq, inArray, isNotNull, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { partInPlace } from '../db/parts-in-place.js';
import { currentWrenchVersion } from '../db/catalogue-parts.js';
import type { Db, Tx } from '../db/database.js';
import {
  componentInstances,
  components,
  implantSites,
  patients,
  practices,
  restorations,
  torqueEvents,
  torqueWrenches,
  users,
  wrenchCalibrations,
} from '../db/schema/index.js';
import type { Scope } from '../authz/scope.js';
import { visiblePatients } from '../authz/visible-patients.js';
import { insertAmendment, isCurrentVersion, supersededById } from '../db/amendments.js';

/**
 * A part instance whose patient the user may see, with the specification a new torque is judged
 * against: the current catalogue version of the installed part (ADR 0006).
 */
export async function findVisibleInstance(db: Db, scope: Scope, id: string) {
  const installed = alias(components, 'installed');
  const [row] = await db
    .select({
      id: componentInstances.id,
      practiceId: componentInstances.practiceId,
      patientId: componentInstances.patientId,
      siteId: componentInstances.siteId,
      restorationId: componentInstances.restorationId,
      currentComponentId: components.id,
      removedOn: componentInstances.removedOn,
      enteredInErrorAt: componentInstances.enteredInErrorAt,
      name: components.name,
      torqueSpecNcm: components.torqueSpecNcm,
      tolerancePct: components.tolerancePct,
      requiresLot: components.requiresLot,
    })
    .from(componentInstances)
    .innerJoin(installed, eq(installed.id, componentInstances.componentId))
    .innerJoin(components, and(eq(components.lineageId, installed.lineageId), isCurrentVersion(components)))
    .innerJoin(patients, eq(patients.id, componentInstances.patientId))
    .where(and(eq(componentInstances.id, id), visiblePatients(scope)));
  return row ?? null;
}

export async function findVisibleTorqueEvent(db: Db, scope: Scope, id: string) {
  const [row] = await db
    .select({
      id: torqueEvents.id,
      practiceId: torqueEvents.practiceId,
      patientId: torqueEvents.patientId,
      componentInstanceId: torqueEvents.componentInstanceId,
      specNcm: torqueEvents.specNcm,
      tolerancePct: torqueEvents.tolerancePct,
      reason: torqueEvents.reason,
      appliedNcm: torqueEvents.appliedNcm,
      wrenchId: torqueEvents.wrenchId,
      performedAt: torqueEvents.performedAt,
      earlySettlingConfirmed: torqueEvents.earlySettlingConfirmed,
      supersededById: supersededById(torqueEvents),
    })
    .from(torqueEvents)
    .innerJoin(patients, eq(patients.id, torqueEvents.patientId))
    .where(and(eq(torqueEvents.id, id), visiblePatients(scope)));
  return row ?? null;
}

export async function loadTorqueEvent(db: Db, id: string) {
  const [row] = await db
    .select({
      id: torqueEvents.id,
      componentInstanceId: torqueEvents.componentInstanceId,
      appliedNcm: torqueEvents.appliedNcm,
      specNcm: torqueEvents.specNcm,
      tolerancePct: torqueEvents.tolerancePct,
      verdict: torqueEvents.verdict,
      rulesVersion: torqueEvents.rulesVersion,
      reason: torqueEvents.reason,
      wrenchId: torqueEvents.wrenchId,
      wrenchLabel: torqueWrenches.label,
      wrenchCalibrationOverdue: torqueEvents.wrenchCalibrationOverdue,
      earlySettlingConfirmed: torqueEvents.earlySettlingConfirmed,
      performedAt: torqueEvents.performedAt,
      recordedByName: users.displayName,
      supersedesId: torqueEvents.supersedesId,
      amendmentReason: torqueEvents.amendmentReason,
    })
    .from(torqueEvents)
    .leftJoin(torqueWrenches, eq(torqueWrenches.id, torqueEvents.wrenchId))
    .leftJoin(users, eq(users.id, torqueEvents.recordedBy))
    .where(eq(torqueEvents.id, id));
  return row;
}

/** The current version of a wrench of the practice, by the id of any of its versions. */
export const findWrenchOfPractice = currentWrenchVersion;

/** Locks a part instance until the transaction ends: two entries that retire it run one after the other. */
export async function lockInstance(tx: Tx, id: string) {
  await tx
    .select({ id: componentInstances.id })
    .from(componentInstances)
    .where(eq(componentInstances.id, id))
    .for('update');
}

/** Retires a part: it came out of the mouth on `day` (its row and history stay). */
export async function retireInstance(tx: Tx, id: string, day: string) {
  await tx.update(componentInstances).set({ removedOn: day }).where(eq(componentInstances.id, id));
}

/** A new instance of a part, installed on the day the one it replaces came out. */
export async function insertInstance(tx: Tx, v: typeof componentInstances.$inferInsert) {
  const [row] = await tx.insert(componentInstances).values(v).returning({ id: componentInstances.id });
  return row.id;
}

type TorqueValues = typeof torqueEvents.$inferInsert;

export async function insertTorqueEvent(db: Db, v: TorqueValues) {
  const [row] = await db.insert(torqueEvents).values(v).returning({ id: torqueEvents.id });
  return row.id;
}

/** A new version of a torque entry; a second amendment of one version is refused by the database. */
export const insertTorqueAmendment = (db: Db, v: TorqueValues & { supersedesId: string; amendmentReason: string }) =>
  insertAmendment(db, torqueEvents, v);

/** A restoration whose patient the user may see: what seating its screws needs. */
export async function findVisibleRestoration(db: Db, scope: Scope, id: string) {
  const [row] = await db
    .select({
      id: restorations.id,
      practiceId: restorations.practiceId,
      patientId: restorations.patientId,
      status: restorations.status,
      deliveredOn: restorations.deliveredOn,
      // The sites it spans: a share of one of them opens it (assertCan).
      siteIds: sql<
        string[]
      >`array(select rs.site_id from restoration_sites rs where rs.restoration_id = ${restorations.id})`,
    })
    .from(restorations)
    .innerJoin(patients, eq(patients.id, restorations.patientId))
    .where(and(eq(restorations.id, id), visiblePatients(scope)));
  return row ?? null;
}

/**
 * The parts of a restoration in place with a torque specification (the current catalogue
 * version of each, ADR 0006), from the first site to the last, implant outward.
 */
export async function listRestorationScrews(db: Db, restorationId: string) {
  const installed = alias(components, 'installed');
  return db
    .select({
      instanceId: componentInstances.id,
      practiceId: componentInstances.practiceId,
      patientId: componentInstances.patientId,
      siteId: componentInstances.siteId,
      fdi: implantSites.fdi,
      kind: components.kind,
      name: components.name,
      referenceCode: components.referenceCode,
      torqueSpecNcm: components.torqueSpecNcm,
      tolerancePct: components.tolerancePct,
    })
    .from(componentInstances)
    .innerJoin(installed, eq(installed.id, componentInstances.componentId))
    .innerJoin(components, and(eq(components.lineageId, installed.lineageId), isCurrentVersion(components)))
    .innerJoin(implantSites, eq(implantSites.id, componentInstances.siteId))
    .where(and(eq(componentInstances.restorationId, restorationId), partInPlace(), isNotNull(components.torqueSpecNcm)))
    .orderBy(asc(implantSites.fdi), asc(componentInstances.recordedAt), asc(componentInstances.id));
}

/** The current torque entries of some parts, oldest first: what seated them and when. */
export async function currentTorqueOfInstances(db: Db, instanceIds: string[]) {
  if (instanceIds.length === 0) return [];
  return db
    .select({
      instanceId: torqueEvents.componentInstanceId,
      reason: torqueEvents.reason,
      performedAt: torqueEvents.performedAt,
    })
    .from(torqueEvents)
    .where(and(inArray(torqueEvents.componentInstanceId, instanceIds), isCurrentVersion(torqueEvents)))
    .orderBy(asc(torqueEvents.performedAt), asc(torqueEvents.recordedAt));
}

/**
 * A wrench's latest calibration on or before `day` (YYYY-MM-DD) and its practice's calibration
 * interval: what calibrationOverdue needs for a torque recorded that day.
 */
export async function wrenchCalibrationOn(db: Db, practiceId: string, lineageId: string, day: string) {
  const [row] = await db
    .select({
      intervalMonths: practices.wrenchCalibrationIntervalMonths,
      lastCalibratedOn: sql<string | null>`(select max(wc.calibrated_on)::text from ${wrenchCalibrations} wc
        where wc.wrench_lineage_id = ${lineageId} and wc.calibrated_on <= ${day}::date)`,
    })
    .from(practices)
    .where(eq(practices.id, practiceId));
  return row;
}
