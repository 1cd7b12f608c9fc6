import { randomUUID } from 'node:crypto';
import { and, asc, desc, eq, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { isCurrentVersion, supersededById } from '../db/amendments.js';
import { componentSpecColumns } from '../db/catalogue-parts.js';
import type { Db, Tx } from '../db/database.js';
import {
  componentInstances,
  components,
  implantSystems,
  platforms,
  systemGtins,
  torqueWrenches,
  users,
  wrenchCalibrations,
} from '../db/schema/index.js';

/** 1 for a lineage's first version: versions are saved one at a time, so their order is their number. */
// Outer columns in these select-list subqueries are qualified by hand: drizzle leaves column names
// bare in a select list, where the subquery's own table would capture them.
const versionOf = (table: 'components' | 'torque_wrenches') =>
  sql<number>`(select count(*)::int from ${sql.identifier(table)} older where older.lineage_id = ${sql.identifier(table)}.lineage_id and older.created_at <= ${sql.identifier(table)}.created_at)`;

const componentColumns = {
  ...componentSpecColumns,
  practiceId: components.practiceId,
  lineageId: components.lineageId,
  version: versionOf('components'),
  versionedAt: components.createdAt,
  inUse: sql<boolean>`exists (select 1 from ${componentInstances} ci join ${components} v on v.id = ci.component_id where v.lineage_id = "components".lineage_id)`,
};

export async function listSystems(db: Db, practiceId: string) {
  return db
    .select({
      id: implantSystems.id,
      practiceId: implantSystems.practiceId,
      name: implantSystems.name,
      manufacturer: implantSystems.manufacturer,
    })
    .from(implantSystems)
    .where(eq(implantSystems.practiceId, practiceId))
    .orderBy(asc(implantSystems.name));
}

export async function listPlatforms(db: Db, practiceId: string) {
  return db
    .select({
      id: platforms.id,
      practiceId: platforms.practiceId,
      systemId: platforms.systemId,
      name: platforms.name,
      diameterMm: platforms.diameterMm,
      connection: platforms.connection,
      platformShift: platforms.platformShift,
    })
    .from(platforms)
    .where(eq(platforms.practiceId, practiceId))
    .orderBy(asc(platforms.diameterMm), asc(platforms.name));
}

/** The current version of every part (of one platform when given). */
export async function listComponents(db: Db, practiceId: string, platformId?: string) {
  return db
    .select(componentColumns)
    .from(components)
    .where(
      and(
        eq(components.practiceId, practiceId),
        platformId ? eq(components.platformId, platformId) : undefined,
        isCurrentVersion(components),
      ),
    )
    .orderBy(asc(components.kind), asc(components.name));
}

/** The GTINs the practice's catalogue gives its systems, entered or learned from placements. */
export function listSystemGtins(db: Db, practiceId: string) {
  return db
    .select({
      systemId: systemGtins.systemId,
      gtin: systemGtins.gtin,
      entered: sql<boolean>`${systemGtins.enteredBy} is not null`,
    })
    .from(systemGtins)
    .where(eq(systemGtins.practiceId, practiceId))
    .orderBy(asc(systemGtins.gtin));
}

/** Gives each GTIN to the system, as entered by `by`: one the catalogue gave another system moves. */
export async function enterSystemGtins(
  tx: Db,
  v: { practiceId: string; systemId: string; gtins: readonly string[]; by: string },
) {
  if (v.gtins.length === 0) return;
  await tx
    .insert(systemGtins)
    .values(v.gtins.map((gtin) => ({ practiceId: v.practiceId, systemId: v.systemId, gtin, enteredBy: v.by })))
    .onConflictDoUpdate({
      target: [systemGtins.practiceId, systemGtins.gtin],
      set: { systemId: v.systemId, enteredBy: v.by },
    });
}

export async function findSystem(db: Db, practiceId: string, id: string) {
  const row = (await listSystems(db, practiceId)).find((s) => s.id === id);
  return row ?? null;
}

export async function findPlatform(db: Db, practiceId: string, id: string) {
  const [row] = await db
    .select({
      id: platforms.id,
      practiceId: platforms.practiceId,
      systemId: platforms.systemId,
      name: platforms.name,
      diameterMm: platforms.diameterMm,
      connection: platforms.connection,
      platformShift: platforms.platformShift,
    })
    .from(platforms)
    .where(and(eq(platforms.id, id), eq(platforms.practiceId, practiceId)));
  return row ?? null;
}

/** One version of a part by its id, within one practice, with the id of the version that replaced it. */
export async function findComponent(db: Db, practiceId: string, id: string) {
  const [row] = await db
    .select({ ...componentColumns, supersededById: supersededById(components) })
    .from(components)
    .where(and(eq(components.practiceId, practiceId), eq(components.id, id)));
  return row ?? null;
}

/** Every version of a part's lineage, oldest first, with who saved it. */
export async function listComponentVersions(db: Db, practiceId: string, lineageId: string) {
  return db
    .select({
      ...componentColumns,
      byName: users.displayName,
      current: sql<boolean>`not exists (select 1 from ${components} newer where newer.supersedes_id = "components".id)`,
    })
    .from(components)
    .leftJoin(users, eq(users.id, components.createdBy))
    .where(and(eq(components.practiceId, practiceId), eq(components.lineageId, lineageId)))
    .orderBy(asc(components.createdAt));
}

export async function insertSystem(db: Db, row: typeof implantSystems.$inferInsert) {
  const [out] = await db.insert(implantSystems).values(row).returning({ id: implantSystems.id });
  return out.id;
}
export async function updateSystem(
  db: Db,
  practiceId: string,
  id: string,
  patch: Partial<typeof implantSystems.$inferInsert>,
) {
  if (Object.keys(patch).length > 0)
    await db
      .update(implantSystems)
      .set(patch)
      .where(and(eq(implantSystems.id, id), eq(implantSystems.practiceId, practiceId)));
}
export async function insertPlatform(db: Db, row: typeof platforms.$inferInsert) {
  const [out] = await db.insert(platforms).values(row).returning({ id: platforms.id });
  return out.id;
}
export async function updatePlatform(
  db: Db,
  practiceId: string,
  id: string,
  patch: Partial<typeof platforms.$inferInsert>,
) {
  if (Object.keys(patch).length > 0)
    await db
      .update(platforms)
      .set(patch)
      .where(and(eq(platforms.id, id), eq(platforms.practiceId, practiceId)));
}
type ComponentValues = Omit<typeof components.$inferInsert, 'id' | 'lineageId' | 'supersedesId'>;

/** A new part: its first version, which is its own lineage. */
export async function insertComponent(db: Db, row: ComponentValues) {
  const id = randomUUID();
  await db.insert(components).values({ ...row, id, lineageId: id });
  return id;
}

/**
 * A new version of a part. The unique index on supersedes_id refuses a second version of one
 * version (two admins editing at once): HttpExceptionFilter answers 409.
 */
export async function insertComponentVersion(
  db: Db,
  row: ComponentValues & { lineageId: string; supersedesId: string },
) {
  const [out] = await db.insert(components).values(row).returning({ id: components.id });
  return out.id;
}

const wrenchColumns = {
  id: torqueWrenches.id,
  practiceId: torqueWrenches.practiceId,
  lineageId: torqueWrenches.lineageId,
  label: torqueWrenches.label,
  type: torqueWrenches.type,
  version: versionOf('torque_wrenches'),
  lastCalibratedOn: sql<
    string | null
  >`(select max(wc.calibrated_on)::text from ${wrenchCalibrations} wc where wc.wrench_lineage_id = "torque_wrenches".lineage_id)`,
};

/** The current version of every wrench. */
export async function listWrenches(db: Db, practiceId: string) {
  return db
    .select(wrenchColumns)
    .from(torqueWrenches)
    .where(and(eq(torqueWrenches.practiceId, practiceId), isCurrentVersion(torqueWrenches)))
    .orderBy(asc(torqueWrenches.label));
}

/** One version of a wrench, within one practice, with the id of the version that replaced it. */
export async function findWrench(db: Db, practiceId: string, id: string) {
  const [row] = await db
    .select({ ...wrenchColumns, supersededById: supersededById(torqueWrenches) })
    .from(torqueWrenches)
    .where(and(eq(torqueWrenches.id, id), eq(torqueWrenches.practiceId, practiceId)));
  return row ?? null;
}

type WrenchValues = Omit<typeof torqueWrenches.$inferInsert, 'id' | 'lineageId' | 'supersedesId'>;

/** A new wrench (its first version, its own lineage), with its first calibration when known. */
export async function insertWrench(tx: Tx, row: WrenchValues, calibration: CalibrationValues | null) {
  const id = randomUUID();
  await tx.insert(torqueWrenches).values({ ...row, id, lineageId: id });
  if (calibration) await insertCalibration(tx, { ...calibration, wrenchLineageId: id });
  return id;
}

/** A new version of a wrench; a second version of one version is refused by the unique index (409). */
export async function insertWrenchVersion(db: Db, row: WrenchValues & { lineageId: string; supersedesId: string }) {
  const [out] = await db.insert(torqueWrenches).values(row).returning({ id: torqueWrenches.id });
  return out.id;
}

type CalibrationValues = Omit<typeof wrenchCalibrations.$inferInsert, 'id' | 'wrenchLineageId'>;

export async function insertCalibration(db: Db, row: CalibrationValues & { wrenchLineageId: string }) {
  const [out] = await db.insert(wrenchCalibrations).values(row).returning({ id: wrenchCalibrations.id });
  return out.id;
}

/** A wrench's calibrations (of its lineage: the physical instrument), newest first. */
export async function listCalibrations(db: Db, practiceId: string, wrenchLineageId: string) {
  const recorder = alias(users, 'recorder');
  return db
    .select({
      id: wrenchCalibrations.id,
      calibratedOn: wrenchCalibrations.calibratedOn,
      note: wrenchCalibrations.note,
      byName: recorder.displayName,
      recordedAt: wrenchCalibrations.recordedAt,
    })
    .from(wrenchCalibrations)
    .leftJoin(recorder, eq(recorder.id, wrenchCalibrations.recordedBy))
    .where(and(eq(wrenchCalibrations.practiceId, practiceId), eq(wrenchCalibrations.wrenchLineageId, wrenchLineageId)))
    .orderBy(desc(wrenchCalibrations.calibratedOn), desc(wrenchCalibrations.recordedAt));
}
