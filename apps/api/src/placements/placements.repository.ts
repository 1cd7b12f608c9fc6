import { and, asc, eq, inArray, notInArray } from 'drizzle-orm';
import { CLOSURE_KINDS } from '@torquetrail/contracts';
import { currentPartVersions } from '../db/catalogue-parts.js';
import type { Db, Tx } from '../db/database.js';
import {
  componentInstances,
  components,
  implantSites,
  implantSystems,
  patients,
  placements,
  platforms,
  users,
} from '../db/schema/index.js';
import type { Scope } from '../authz/scope.js';
import { visiblePatients } from '../authz/visible-patients.js';
import { insertAmendment, isCurrentVersion, supersededById } from '../db/amendments.js';
import { learnSystemGtin } from '../db/system-gtins.js';

/** A patient the user may see (scoped in SQL), with the practice a new site belongs to. */
export async function findVisiblePatient(db: Db, scope: Scope, patientId: string) {
  const [row] = await db
    .select({ id: patients.id, practiceId: patients.practiceId })
    .from(patients)
    .where(and(eq(patients.id, patientId), visiblePatients(scope)));
  return row ?? null;
}

/** A site whose patient the user may see, with its position and status. */
export async function findVisibleSite(db: Db, scope: Scope, siteId: string) {
  const [row] = await db
    .select({
      id: implantSites.id,
      practiceId: implantSites.practiceId,
      patientId: implantSites.patientId,
      fdi: implantSites.fdi,
      status: implantSites.status,
    })
    .from(implantSites)
    .innerJoin(patients, eq(patients.id, implantSites.patientId))
    .where(and(eq(implantSites.id, siteId), visiblePatients(scope)));
  return row ?? null;
}

/** The live site (not failed, not removed) of a patient at an FDI position; a unique index keeps it to one. */
export async function findLiveSiteAt(db: Db, practiceId: string, patientId: string, fdi: number) {
  const [row] = await db
    .select({ id: implantSites.id, status: implantSites.status })
    .from(implantSites)
    .where(
      and(
        eq(implantSites.practiceId, practiceId),
        eq(implantSites.patientId, patientId),
        eq(implantSites.fdi, fdi),
        notInArray(implantSites.status, ['failed', 'removed']),
      ),
    );
  return row ?? null;
}

export async function insertPlannedSite(tx: Tx, v: { practiceId: string; patientId: string; fdi: number }) {
  const [row] = await tx
    .insert(implantSites)
    .values({ ...v, status: 'planned' })
    .returning({ id: implantSites.id, fdi: implantSites.fdi, status: implantSites.status });
  return row;
}

/** Locks a site until the transaction ends: two placements of one planned site run one after the other. */
export async function lockSite(tx: Tx, siteId: string) {
  const [row] = await tx
    .select({ status: implantSites.status })
    .from(implantSites)
    .where(eq(implantSites.id, siteId))
    .for('update');
  return row ?? null;
}

export async function setSiteStatus(tx: Tx, siteId: string, status: 'placed') {
  await tx.update(implantSites).set({ status }).where(eq(implantSites.id, siteId));
}

/** Platforms of one practice with their systems and closure parts (healing abutments, cover screws). */
export async function listPlacementOptions(db: Db, practiceId: string) {
  const rows = await db
    .select({
      systemId: implantSystems.id,
      systemName: implantSystems.name,
      manufacturer: implantSystems.manufacturer,
      platformId: platforms.id,
      platformName: platforms.name,
      diameterMm: platforms.diameterMm,
      connection: platforms.connection,
      platformShift: platforms.platformShift,
    })
    .from(platforms)
    .innerJoin(implantSystems, eq(implantSystems.id, platforms.systemId))
    .where(eq(platforms.practiceId, practiceId))
    .orderBy(asc(implantSystems.name), asc(platforms.diameterMm), asc(platforms.name));
  const parts = await db
    .select({
      id: components.id,
      platformId: components.platformId,
      kind: components.kind,
      name: components.name,
      referenceCode: components.referenceCode,
      requiresLot: components.requiresLot,
    })
    .from(components)
    .where(
      and(
        eq(components.practiceId, practiceId),
        inArray(components.kind, [...CLOSURE_KINDS]),
        isCurrentVersion(components),
      ),
    )
    .orderBy(asc(components.kind), asc(components.name));
  return { rows, parts };
}

/** A platform of the given practice (another practice's platform is simply not found). */
export async function findPlatformOfPractice(db: Db, practiceId: string, platformId: string) {
  const [row] = await db
    .select({ id: platforms.id })
    .from(platforms)
    .where(and(eq(platforms.id, platformId), eq(platforms.practiceId, practiceId)));
  return row ?? null;
}

/** A part of the given platform within the practice, as its current version (new work, ADR 0006). */
export async function findComponentOfPlatform(db: Db, practiceId: string, platformId: string, componentId: string) {
  const [row] = await currentPartVersions(db, practiceId, [componentId]);
  return row && row.platformId === platformId
    ? { id: row.id, kind: row.kind, name: row.name, requiresLot: row.requiresLot }
    : null;
}

type PlacementValues = typeof placements.$inferInsert;
/** A placement; the catalogue learns the system of its UDI's GTIN if it did not know it. */
export async function insertPlacement(tx: Tx, v: PlacementValues) {
  const [row] = await tx.insert(placements).values(v).returning({ id: placements.id });
  await learnSystemGtin(tx, { practiceId: v.practiceId, platformId: v.platformId, gtin: v.gtin ?? null });
  return row.id;
}

/** A new version of a placement; a second amendment of one version is refused by the database. */
export async function insertPlacementAmendment(
  tx: Db,
  v: PlacementValues & { supersedesId: string; amendmentReason: string },
) {
  const id = await insertAmendment(tx, placements, v);
  await learnSystemGtin(tx, { practiceId: v.practiceId, platformId: v.platformId, gtin: v.gtin ?? null });
  return id;
}

export async function insertClosurePart(tx: Tx, v: typeof componentInstances.$inferInsert) {
  const [row] = await tx.insert(componentInstances).values(v).returning({ id: componentInstances.id });
  return row.id;
}

/** A placement whose patient the user may see, with the id of the version that supersedes it, if any. */
export async function findVisiblePlacement(db: Db, scope: Scope, id: string) {
  const [row] = await db
    .select({
      id: placements.id,
      practiceId: placements.practiceId,
      patientId: placements.patientId,
      siteId: placements.siteId,
      surgeonUserId: placements.surgeonUserId,
      surgeonName: placements.surgeonName,
      supersededById: supersededById(placements),
    })
    .from(placements)
    .innerJoin(patients, eq(patients.id, placements.patientId))
    .where(and(eq(placements.id, id), visiblePatients(scope)));
  return row ?? null;
}

export async function loadPlacement(db: Db, id: string) {
  const [row] = await db
    .select({
      id: placements.id,
      siteId: placements.siteId,
      platformId: placements.platformId,
      platformName: platforms.name,
      systemName: implantSystems.name,
      placedOn: placements.placedOn,
      surgeonName: placements.surgeonName,
      lengthMm: placements.lengthMm,
      lot: placements.lot,
      udi: placements.udi,
      insertionTorqueNcm: placements.insertionTorqueNcm,
      stabilityIsq: placements.stabilityIsq,
      grafting: placements.grafting,
      loadingProtocol: placements.loadingProtocol,
      axisX: placements.axisX,
      axisY: placements.axisY,
      axisZ: placements.axisZ,
      notes: placements.notes,
      supersedesId: placements.supersedesId,
      amendmentReason: placements.amendmentReason,
      recordedAt: placements.recordedAt,
      recordedByName: users.displayName,
    })
    .from(placements)
    .innerJoin(platforms, eq(platforms.id, placements.platformId))
    .innerJoin(implantSystems, eq(implantSystems.id, platforms.systemId))
    .leftJoin(users, eq(users.id, placements.recordedBy))
    .where(eq(placements.id, id));
  return row;
}
