// SQL of the scan-body markers on scan files. The scan file is loaded in the user's scope first
// (impressions.repository.ts `findScanFile`); these queries then read by its id.
import { and, asc, eq, isNotNull } from 'drizzle-orm';
import type { Db, Tx } from '../db/database.js';
import { insertAmendment, isCurrentVersion } from '../db/amendments.js';
import { implantSites, scanBodyMarkers, users } from '../db/schema/index.js';

const markerColumns = {
  m: scanBodyMarkers,
  fdi: implantSites.fdi,
  placedByName: users.displayName,
};
export type MarkerRow = typeof scanBodyMarkers.$inferSelect & { fdi: number; placedByName: string };
const flatten = (row: { m: typeof scanBodyMarkers.$inferSelect; fdi: number; placedByName: string }): MarkerRow => ({
  ...row.m,
  fdi: row.fdi,
  placedByName: row.placedByName,
});

/** The current version of every marker on the file that still has a point, by chart number. */
export async function currentMarkers(db: Db, scanFileId: string): Promise<MarkerRow[]> {
  const rows = await db
    .select(markerColumns)
    .from(scanBodyMarkers)
    .innerJoin(implantSites, eq(implantSites.id, scanBodyMarkers.siteId))
    .innerJoin(users, eq(users.id, scanBodyMarkers.placedBy))
    .where(
      and(eq(scanBodyMarkers.scanFileId, scanFileId), isCurrentVersion(scanBodyMarkers), isNotNull(scanBodyMarkers.x)),
    )
    .orderBy(asc(implantSites.fdi));
  return rows.map(flatten);
}

/** The current version of the marker of one site on the file (a cleared one too), if any. */
export async function currentMarkerAt(db: Db, scanFileId: string, siteId: string) {
  const [row] = await db
    .select({ id: scanBodyMarkers.id, x: scanBodyMarkers.x, y: scanBodyMarkers.y, z: scanBodyMarkers.z })
    .from(scanBodyMarkers)
    .where(
      and(
        eq(scanBodyMarkers.scanFileId, scanFileId),
        eq(scanBodyMarkers.siteId, siteId),
        isCurrentVersion(scanBodyMarkers),
      ),
    );
  return row ?? null;
}

export async function findMarker(db: Db, id: string): Promise<MarkerRow | null> {
  const [row] = await db
    .select(markerColumns)
    .from(scanBodyMarkers)
    .innerJoin(implantSites, eq(implantSites.id, scanBodyMarkers.siteId))
    .innerJoin(users, eq(users.id, scanBodyMarkers.placedBy))
    .where(eq(scanBodyMarkers.id, id));
  return row ? flatten(row) : null;
}

/** The patient's site of that id, for naming it in a refusal (null when it is not the patient's). */
export async function siteOfPatient(db: Db, patientId: string, siteId: string) {
  const [row] = await db
    .select({ fdi: implantSites.fdi })
    .from(implantSites)
    .where(and(eq(implantSites.id, siteId), eq(implantSites.patientId, patientId)));
  return row ?? null;
}

export async function insertMarker(tx: Tx, values: typeof scanBodyMarkers.$inferInsert): Promise<string> {
  const [row] = await tx.insert(scanBodyMarkers).values(values).returning({ id: scanBodyMarkers.id });
  return row.id;
}

export function insertMarkerAmendment(
  tx: Tx,
  values: typeof scanBodyMarkers.$inferInsert & { supersedesId: string; amendmentReason: string },
): Promise<string> {
  return insertAmendment(tx, scanBodyMarkers, values);
}

/** Sites with a marker placed on any of the files (current version with a point): for the lab sheet. */
export async function markedSites(db: Db, scanFileIds: string[]): Promise<Set<string>> {
  const sets = await Promise.all(scanFileIds.map((id) => currentMarkers(db, id)));
  return new Set(sets.flat().map((m) => m.siteId));
}
