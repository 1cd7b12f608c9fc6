import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { componentSpecColumns } from '../db/catalogue-parts.js';
import type { Db } from '../db/database.js';
import { componentInstances, components, implantSystems, platforms, torqueWrenches } from '../db/schema/index.js';

const componentColumns = {
  ...componentSpecColumns,
  practiceId: components.practiceId,
  inUse: sql<boolean>`exists (select 1 from ${componentInstances} ci where ci.component_id = ${components.id})`,
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

export async function listComponents(db: Db, practiceId: string, platformId?: string) {
  return db
    .select(componentColumns)
    .from(components)
    .where(and(eq(components.practiceId, practiceId), platformId ? eq(components.platformId, platformId) : undefined))
    .orderBy(asc(components.kind), asc(components.name));
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

/** Parts by id, within one practice (ids of another practice's catalogue are simply not found). */
export async function findComponents(db: Db, practiceId: string, ids: string[]) {
  if (ids.length === 0) return [];
  return db
    .select(componentColumns)
    .from(components)
    .where(and(eq(components.practiceId, practiceId), inArray(components.id, ids)));
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
export async function insertComponent(db: Db, row: typeof components.$inferInsert) {
  const [out] = await db.insert(components).values(row).returning({ id: components.id });
  return out.id;
}
export async function updateComponent(
  db: Db,
  practiceId: string,
  id: string,
  patch: Partial<typeof components.$inferInsert>,
) {
  if (Object.keys(patch).length > 0)
    await db
      .update(components)
      .set(patch)
      .where(and(eq(components.id, id), eq(components.practiceId, practiceId)));
}

const wrenchColumns = {
  id: torqueWrenches.id,
  practiceId: torqueWrenches.practiceId,
  label: torqueWrenches.label,
  type: torqueWrenches.type,
  lastCalibratedOn: torqueWrenches.lastCalibratedOn,
};

export async function listWrenches(db: Db, practiceId: string) {
  return db
    .select(wrenchColumns)
    .from(torqueWrenches)
    .where(eq(torqueWrenches.practiceId, practiceId))
    .orderBy(asc(torqueWrenches.label));
}
export async function findWrench(db: Db, practiceId: string, id: string) {
  const [row] = await db
    .select(wrenchColumns)
    .from(torqueWrenches)
    .where(and(eq(torqueWrenches.id, id), eq(torqueWrenches.practiceId, practiceId)));
  return row ?? null;
}
export async function insertWrench(db: Db, row: typeof torqueWrenches.$inferInsert) {
  const [out] = await db.insert(torqueWrenches).values(row).returning({ id: torqueWrenches.id });
  return out.id;
}
export async function updateWrench(
  db: Db,
  practiceId: string,
  id: string,
  patch: Partial<typeof torqueWrenches.$inferInsert>,
) {
  if (Object.keys(patch).length > 0)
    await db
      .update(torqueWrenches)
      .set(patch)
      .where(and(eq(torqueWrenches.id, id), eq(torqueWrenches.practiceId, practiceId)));
}
