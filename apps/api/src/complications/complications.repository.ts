import { and, eq } from 'drizzle-orm';
import type { Db } from '../db/database.js';
import { complications, componentInstances, implantSites, patients, users } from '../db/schema/index.js';
import type { Scope } from '../authz/scope.js';
import { visiblePatients } from '../authz/visible-patients.js';
import { insertAmendment, supersededById } from '../db/amendments.js';

/** A site whose patient the user may see, with what a complication is recorded against. */
export async function findVisibleSite(db: Db, scope: Scope, siteId: string) {
  const [row] = await db
    .select({ id: implantSites.id, practiceId: implantSites.practiceId, patientId: implantSites.patientId })
    .from(implantSites)
    .innerJoin(patients, eq(patients.id, implantSites.patientId))
    .where(and(eq(implantSites.id, siteId), visiblePatients(scope)));
  return row ?? null;
}

/** A part instance of the given site (current or removed), and whether it was entered in error. */
export async function findPartAtSite(db: Db, siteId: string, componentInstanceId: string) {
  const [row] = await db
    .select({ id: componentInstances.id, enteredInErrorAt: componentInstances.enteredInErrorAt })
    .from(componentInstances)
    .where(and(eq(componentInstances.id, componentInstanceId), eq(componentInstances.siteId, siteId)));
  return row ?? null;
}

type ComplicationValues = typeof complications.$inferInsert;

export async function insertComplication(db: Db, v: ComplicationValues) {
  const [row] = await db.insert(complications).values(v).returning({ id: complications.id });
  return row.id;
}

/** A new version of a complication; a second amendment of one version is refused by the database. */
export const insertComplicationAmendment = (
  db: Db,
  v: ComplicationValues & { supersedesId: string; amendmentReason: string },
) => insertAmendment(db, complications, v);

/** The entry with its scope, if the user may see its patient; `supersededById` when already amended. */
export async function findVisibleComplication(db: Db, scope: Scope, id: string) {
  const [row] = await db
    .select({
      id: complications.id,
      practiceId: complications.practiceId,
      patientId: complications.patientId,
      siteId: complications.siteId,
      componentInstanceId: complications.componentInstanceId,
      kind: complications.kind,
      occurredOn: complications.occurredOn,
      notes: complications.notes,
      supersededById: supersededById(complications),
    })
    .from(complications)
    .innerJoin(patients, eq(patients.id, complications.patientId))
    .where(and(eq(complications.id, id), visiblePatients(scope)));
  return row ?? null;
}

export async function loadComplication(db: Db, id: string) {
  const [row] = await db
    .select({
      id: complications.id,
      siteId: complications.siteId,
      componentInstanceId: complications.componentInstanceId,
      kind: complications.kind,
      occurredOn: complications.occurredOn,
      notes: complications.notes,
      supersedesId: complications.supersedesId,
      amendmentReason: complications.amendmentReason,
      recordedByName: users.displayName,
    })
    .from(complications)
    .leftJoin(users, eq(users.id, complications.recordedBy))
    .where(eq(complications.id, id));
  return row;
}
