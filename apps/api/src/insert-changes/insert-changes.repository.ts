import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { OVERDENTURE_KINDS } from '@torquetrail/domain';
import type { Database, Db } from '../db/database.js';
import { preparedFor } from '../db/prepared.js';
import {
  components,
  implantSites,
  insertChanges,
  patients,
  restorationSites,
  restorations,
  users,
} from '../db/schema/index.js';
import type { Scope } from '../authz/scope.js';
import { visiblePatients } from '../authz/visible-patients.js';
import { insertAmendment, isCurrentVersion, supersededById } from '../db/amendments.js';

/** A site whose patient the user may see, with its fdi. */
export async function findVisibleSite(db: Db, scope: Scope, siteId: string) {
  const [row] = await db
    .select({
      id: implantSites.id,
      practiceId: implantSites.practiceId,
      patientId: implantSites.patientId,
      fdi: implantSites.fdi,
    })
    .from(implantSites)
    .innerJoin(patients, eq(patients.id, implantSites.patientId))
    .where(and(eq(implantSites.id, siteId), visiblePatients(scope)));
  return row ?? null;
}

/** The delivered overdenture (current version, still in place) on a site, or null. */
export async function findDeliveredOverdenture(db: Database, siteId: string) {
  const [row] = await deliveredOverdentureQuery(db).execute({ siteId });
  return row && row.deliveredOn ? { ...row, deliveredOn: row.deliveredOn } : null;
}
// A named statement: the Site file asks it on every open, of every site.
const deliveredOverdentureQuery = preparedFor((db) =>
  db
    .select({ id: restorations.id, kind: restorations.kind, deliveredOn: restorations.deliveredOn })
    .from(restorationSites)
    .innerJoin(restorations, eq(restorations.id, restorationSites.restorationId))
    .where(
      and(
        eq(restorationSites.siteId, sql.placeholder('siteId')),
        eq(restorations.status, 'delivered'),
        inArray(restorations.kind, [...OVERDENTURE_KINDS]),
        isCurrentVersion(restorations),
      ),
    )
    .orderBy(desc(restorations.deliveredOn))
    .limit(1)
    .prepare('delivered_overdenture_of_site'),
);

/** A catalogue part of the practice (any version), with what an insert change shows of it. */
export async function findPart(db: Db, practiceId: string, componentId: string) {
  const [row] = await db
    .select({
      id: components.id,
      kind: components.kind,
      name: components.name,
      retentionLabel: components.retentionLabel,
      retentionN: components.retentionN,
    })
    .from(components)
    .where(and(eq(components.id, componentId), eq(components.practiceId, practiceId)));
  return row ?? null;
}

type InsertChangeValues = typeof insertChanges.$inferInsert;

export async function insertInsertChange(db: Db, v: InsertChangeValues) {
  const [row] = await db.insert(insertChanges).values(v).returning({ id: insertChanges.id });
  return row.id;
}

/** A new version of an insert change; a second amendment of one version is refused by the database. */
export const insertInsertChangeAmendment = (
  db: Db,
  v: InsertChangeValues & { supersedesId: string; amendmentReason: string },
) => insertAmendment(db, insertChanges, v);

/** The entry with its scope, if the user may see its patient; `supersededById` when already amended. */
export async function findVisibleInsertChange(db: Db, scope: Scope, id: string) {
  const [row] = await db
    .select({
      id: insertChanges.id,
      practiceId: insertChanges.practiceId,
      patientId: insertChanges.patientId,
      siteId: insertChanges.siteId,
      restorationId: insertChanges.restorationId,
      changedOn: insertChanges.changedOn,
      oldComponentId: insertChanges.oldComponentId,
      newComponentId: insertChanges.newComponentId,
      reason: insertChanges.reason,
      notes: insertChanges.notes,
      supersededById: supersededById(insertChanges),
    })
    .from(insertChanges)
    .innerJoin(patients, eq(patients.id, insertChanges.patientId))
    .where(and(eq(insertChanges.id, id), visiblePatients(scope)));
  return row ?? null;
}

const oldPart = alias(components, 'old_part');
const newPart = alias(components, 'new_part');

const changeColumns = {
  id: insertChanges.id,
  siteId: insertChanges.siteId,
  changedOn: insertChanges.changedOn,
  reason: insertChanges.reason,
  notes: insertChanges.notes,
  supersedesId: insertChanges.supersedesId,
  amendmentReason: insertChanges.amendmentReason,
  recordedByName: users.displayName,
  recordedAt: insertChanges.recordedAt,
  old: {
    componentId: oldPart.id,
    name: oldPart.name,
    retentionLabel: oldPart.retentionLabel,
    retentionN: oldPart.retentionN,
  },
  next: {
    componentId: newPart.id,
    name: newPart.name,
    retentionLabel: newPart.retentionLabel,
    retentionN: newPart.retentionN,
  },
};

function withParts<T extends { old: { componentId: string | null } | null; next: unknown }>(row: T) {
  const { old, next, ...rest } = row;
  return {
    ...rest,
    oldPart: old && old.componentId ? (old as NonNullable<T['old']> & { componentId: string }) : null,
    newPart: next as NonNullable<T['next']>,
  };
}

const changesSelect = (db: Db) =>
  db
    .select(changeColumns)
    .from(insertChanges)
    .leftJoin(oldPart, eq(oldPart.id, insertChanges.oldComponentId))
    .innerJoin(newPart, eq(newPart.id, insertChanges.newComponentId))
    .leftJoin(users, eq(users.id, insertChanges.recordedBy));

export async function loadInsertChange(db: Db, id: string) {
  const [row] = await changesSelect(db).where(eq(insertChanges.id, id));
  const { recordedAt: _at, ...change } = withParts(row);
  return change;
}

/** The site's current insert changes (amended versions left out), newest first. */
export async function currentChangesOfSite(db: Db, siteId: string) {
  const rows = await changesSelect(db)
    .where(and(eq(insertChanges.siteId, siteId), isCurrentVersion(insertChanges)))
    .orderBy(desc(insertChanges.changedOn), desc(insertChanges.recordedAt));
  return rows.map((r) => {
    const { recordedAt: _at, ...change } = withParts(r);
    return change;
  });
}

/** Every insert change of the site (amended versions too), for the Timeline. */
export async function allChangesOfSite(db: Database, siteId: string) {
  const rows = await allChangesOfSiteQuery(db).execute({ siteId });
  return rows.map(withParts);
}
// A named statement: the Timeline asks it on every open of a site.
const allChangesOfSiteQuery = preparedFor((db) =>
  db
    .select({ ...changeColumns, amended: sql<boolean>`${supersededById(insertChanges)} is not null` })
    .from(insertChanges)
    .leftJoin(oldPart, eq(oldPart.id, insertChanges.oldComponentId))
    .innerJoin(newPart, eq(newPart.id, insertChanges.newComponentId))
    .leftJoin(users, eq(users.id, insertChanges.recordedBy))
    .where(eq(insertChanges.siteId, sql.placeholder('siteId')))
    .prepare('timeline_insert_changes'),
);

/** The latest current insert change on any site of the overdenture since its delivery, or null. */
export async function lastChangeOfRestoration(db: Db, restorationId: string, deliveredOn: string) {
  const [row] = await db
    .select({ last: sql<string | null>`max(${insertChanges.changedOn})` })
    .from(insertChanges)
    .where(
      and(
        inArray(
          insertChanges.siteId,
          db
            .select({ siteId: restorationSites.siteId })
            .from(restorationSites)
            .where(eq(restorationSites.restorationId, restorationId)),
        ),
        sql`${insertChanges.changedOn} >= ${deliveredOn}`,
        isCurrentVersion(insertChanges),
      ),
    );
  return row?.last ?? null;
}
