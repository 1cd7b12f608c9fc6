import { and, asc, eq, ilike, isNotNull, isNull, or, sql, type SQL } from 'drizzle-orm';
import type { ArchiveFilter } from '@torquetrail/contracts';
import { partInPlace } from '../db/parts-in-place.js';
import type { Db } from '../db/database.js';
import {
  componentInstances,
  components,
  implantSites,
  implantSystems,
  patients,
  placements,
  platforms,
  practices,
  torqueEvents,
  users,
} from '../db/schema/index.js';
import type { Scope } from '../authz/scope.js';
import { visiblePatients } from '../authz/visible-patients.js';
import { isCurrentVersion } from '../db/amendments.js';

const escapeLike = (text: string) => text.replace(/[\\%_]/g, (c) => `\\${c}`);

const ARCHIVED: Record<ArchiveFilter, SQL | undefined> = {
  active: isNull(patients.archivedAt),
  archived: isNotNull(patients.archivedAt),
  all: undefined,
};

export async function listPatients(db: Db, scope: Scope, search: string | undefined, archived: ArchiveFilter) {
  const filters: (SQL | undefined)[] = [visiblePatients(scope), ARCHIVED[archived]];
  if (search) {
    const words = search.split(/\s+/).filter(Boolean).slice(0, 5);
    for (const word of words) {
      const pattern = `%${escapeLike(word)}%`;
      filters.push(
        or(
          ilike(patients.givenName, pattern),
          ilike(patients.familyName, pattern),
          ilike(patients.chartNumber, pattern),
        ),
      );
    }
  }
  return db
    .select({
      id: patients.id,
      chartNumber: patients.chartNumber,
      givenName: patients.givenName,
      familyName: patients.familyName,
      birthDate: patients.birthDate,
      practiceId: patients.practiceId,
      practiceName: practices.name,
      archivedAt: patients.archivedAt,
      implantSiteCount: sql<number>`(select count(*)::int from ${implantSites} where ${implantSites.patientId} = ${patients.id})`,
    })
    .from(patients)
    .innerJoin(practices, eq(practices.id, patients.practiceId))
    .where(and(...filters))
    .orderBy(asc(patients.familyName), asc(patients.givenName))
    .limit(200);
}

export async function findVisiblePatient(db: Db, scope: Scope, id: string) {
  const [row] = await db
    .select({
      id: patients.id,
      practiceId: patients.practiceId,
      chartNumber: patients.chartNumber,
      givenName: patients.givenName,
      familyName: patients.familyName,
      birthDate: patients.birthDate,
      practiceName: practices.name,
      sex: patients.sex,
      email: patients.email,
      phone: patients.phone,
      preferredLanguage: patients.preferredLanguage,
      emailReminderConsent: patients.emailReminderConsent,
      emailReminderConsentOn: patients.emailReminderConsentOn,
      smoker: patients.smoker,
      diabetesPoorlyControlled: patients.diabetesPoorlyControlled,
      periodontitisHistory: patients.periodontitisHistory,
      riskFactorsRecordedOn: patients.riskFactorsRecordedOn,
      missingTeeth: patients.missingTeeth,
      chartNumberChangedAt: patients.chartNumberChangedAt,
      archivedAt: patients.archivedAt,
      archiveReason: patients.archiveReason,
      archivedByName: users.displayName,
    })
    .from(patients)
    .innerJoin(practices, eq(practices.id, patients.practiceId))
    .leftJoin(users, eq(users.id, patients.archivedBy))
    .where(and(eq(patients.id, id), visiblePatients(scope)));
  return row ?? null;
}

/** The sites of one patient with the system of their current placement, for the Arch. */
export async function listSitesOfPatient(db: Db, patientId: string) {
  return db
    .select({
      id: implantSites.id,
      practiceId: implantSites.practiceId,
      patientId: implantSites.patientId,
      fdi: implantSites.fdi,
      status: implantSites.status,
      systemName: implantSystems.name,
    })
    .from(implantSites)
    .leftJoin(placements, and(eq(placements.siteId, implantSites.id), isCurrentVersion(placements)))
    .leftJoin(platforms, eq(platforms.id, placements.platformId))
    .leftJoin(implantSystems, eq(implantSystems.id, platforms.systemId))
    .where(eq(implantSites.patientId, patientId))
    .orderBy(asc(implantSites.fdi));
}

/**
 * The parts in place of a patient (with the specification they were installed with) and the
 * current torque entries on them: what the Arch needs to flag a missing seating torque.
 */
export async function seatingOfPatientParts(db: Db, patientId: string) {
  const [parts, torque] = await Promise.all([
    db
      .select({
        instanceId: componentInstances.id,
        siteId: componentInstances.siteId,
        torqueSpecNcm: components.torqueSpecNcm,
      })
      .from(componentInstances)
      .innerJoin(components, eq(components.id, componentInstances.componentId))
      .where(and(eq(componentInstances.patientId, patientId), partInPlace())),
    db
      .select({
        instanceId: torqueEvents.componentInstanceId,
        reason: torqueEvents.reason,
        performedAt: torqueEvents.performedAt,
      })
      .from(torqueEvents)
      .where(and(eq(torqueEvents.patientId, patientId), isCurrentVersion(torqueEvents))),
  ]);
  return { parts, torque };
}
