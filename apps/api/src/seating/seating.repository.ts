// SQL of seating checks. Every lookup joins the patient and puts the user's scope in the `where`
// clause, so another practice's restoration, radiograph or check is never loaded.
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type { SeatingEvent } from '@torquetrail/contracts';
import type { Db } from '../db/database.js';
import { insertAmendment, isCurrentVersion, supersededById } from '../db/amendments.js';
import {
  patients,
  radiographs,
  radiographSites,
  restorationSites,
  restorations,
  seatingChecks,
  users,
} from '../db/schema/index.js';
import type { Scope } from '../authz/scope.js';
import { visiblePatients } from '../authz/visible-patients.js';

/** A restoration the user may see, with the dates of its impression and delivery and its sites. */
export async function findVisibleRestoration(db: Db, scope: Scope, id: string) {
  const [row] = await db
    .select({
      id: restorations.id,
      practiceId: restorations.practiceId,
      patientId: restorations.patientId,
      // The date noted at delivery, else the current version of the recorded impression (analog or
      // digital): a digital impression's scan bodies are shown seated on this check's radiograph.
      impressionTakenOn: sql<string | null>`coalesce(${restorations.impressionTakenOn}::text, (select i.taken_on::text
        from impressions i where i.restoration_id = ${restorations.id}
        and not exists (select 1 from impressions n where n.supersedes_id = i.id) limit 1))`,
      deliveredOn: restorations.deliveredOn,
      current: sql<boolean>`${isCurrentVersion(restorations)}`,
    })
    .from(restorations)
    .innerJoin(patients, eq(patients.id, restorations.patientId))
    .where(and(eq(restorations.id, id), visiblePatients(scope)));
  if (!row) return null;
  const sites = await db
    .select({ siteId: restorationSites.siteId })
    .from(restorationSites)
    .where(eq(restorationSites.restorationId, id));
  return { ...row, siteIds: sites.map((s) => s.siteId) };
}

/** A radiograph the user may see, with the sites it shows. */
export async function findVisibleRadiograph(db: Db, scope: Scope, id: string) {
  const [row] = await db
    .select({
      id: radiographs.id,
      practiceId: radiographs.practiceId,
      patientId: radiographs.patientId,
      takenOn: radiographs.takenOn,
      enteredInErrorAt: radiographs.enteredInErrorAt,
    })
    .from(radiographs)
    .innerJoin(patients, eq(patients.id, radiographs.patientId))
    .where(and(eq(radiographs.id, id), visiblePatients(scope)));
  if (!row) return null;
  const sites = await db
    .select({ siteId: radiographSites.siteId })
    .from(radiographSites)
    .where(eq(radiographSites.radiographId, id));
  return { ...row, siteIds: sites.map((s) => s.siteId) };
}

const checkColumns = {
  c: seatingChecks,
  recordedByName: users.displayName,
  radiographTakenOn: radiographs.takenOn,
  radiographEnteredInError: sql<boolean>`${radiographs.enteredInErrorAt} is not null`,
  supersededById: supersededById(seatingChecks),
};

const flatten = (row: {
  c: typeof seatingChecks.$inferSelect;
  recordedByName: string;
  radiographTakenOn: string | null;
  radiographEnteredInError: boolean;
  supersededById: string | null;
}) => ({
  ...row.c,
  recordedByName: row.recordedByName,
  radiographTakenOn: row.radiographTakenOn,
  radiographEnteredInError: row.radiographEnteredInError,
  supersededById: row.supersededById,
});
export type SeatingCheckRow = ReturnType<typeof flatten>;

export async function findCheck(db: Db, scope: Scope, id: string) {
  const [row] = await db
    .select(checkColumns)
    .from(seatingChecks)
    .innerJoin(patients, eq(patients.id, seatingChecks.patientId))
    .innerJoin(users, eq(users.id, seatingChecks.recordedBy))
    .innerJoin(radiographs, eq(radiographs.id, seatingChecks.radiographId))
    .where(and(eq(seatingChecks.id, id), visiblePatients(scope)));
  return row ? flatten(row) : null;
}

/** Every version of every check of the restorations, oldest first. */
export async function checksOfRestorations(db: Db, restorationIds: readonly string[]) {
  if (restorationIds.length === 0) return [];
  const rows = await db
    .select(checkColumns)
    .from(seatingChecks)
    .innerJoin(users, eq(users.id, seatingChecks.recordedBy))
    .innerJoin(radiographs, eq(radiographs.id, seatingChecks.radiographId))
    .where(inArray(seatingChecks.restorationId, [...restorationIds]))
    .orderBy(asc(seatingChecks.recordedAt));
  return rows.map(flatten);
}

/** The first version of the check of one event, if any (the unique index keeps it to one). */
export async function firstCheckOf(db: Db, restorationId: string, event: SeatingEvent) {
  const [row] = await db
    .select({ id: seatingChecks.id })
    .from(seatingChecks)
    .where(
      and(
        eq(seatingChecks.restorationId, restorationId),
        eq(seatingChecks.event, event),
        sql`${seatingChecks.supersedesId} is null`,
      ),
    );
  return row ?? null;
}

export async function insertCheck(db: Db, values: typeof seatingChecks.$inferInsert) {
  const [row] = await db.insert(seatingChecks).values(values).returning({ id: seatingChecks.id });
  return row.id;
}

export function insertCheckAmendment(
  db: Db,
  values: typeof seatingChecks.$inferInsert & { supersedesId: string; amendmentReason: string },
) {
  return insertAmendment(db, seatingChecks, values);
}
