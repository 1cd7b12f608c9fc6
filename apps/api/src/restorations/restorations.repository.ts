import { and, asc, desc, eq, inArray, ne, or } from 'drizzle-orm';
import { partInPlace } from '../db/parts-in-place.js';
import type { Db, Tx } from '../db/database.js';
import {
  componentInstances,
  components,
  findingAcknowledgements,
  implantSites,
  implantSystems,
  labPrescriptionMails,
  labPrescriptions,
  patients,
  placements,
  platforms,
  practices,
  restorationSiteComponents,
  restorationSites,
  restorations,
  users,
} from '../db/schema/index.js';
import type { Scope } from '../authz/scope.js';
import { visiblePatients } from '../authz/visible-patients.js';
import { componentSpecColumns, currentPartVersions } from '../db/catalogue-parts.js';
import { insertAmendment, isCurrentVersion, supersededById } from '../db/amendments.js';

const notSuperseded = isCurrentVersion(placements);

/** The patient's implant sites with the platform and axis of the current placement. */
export async function listRestorableSites(db: Db, patientId: string, siteIds?: readonly string[] | null) {
  return db
    .select({
      siteId: implantSites.id,
      practiceId: implantSites.practiceId,
      patientId: implantSites.patientId,
      fdi: implantSites.fdi,
      status: implantSites.status,
      platformId: placements.platformId,
      systemName: implantSystems.name,
      manufacturer: implantSystems.manufacturer,
      platformName: platforms.name,
      connection: platforms.connection,
      diameterMm: platforms.diameterMm,
      lengthMm: placements.lengthMm,
      axisX: placements.axisX,
      axisY: placements.axisY,
      axisZ: placements.axisZ,
    })
    .from(implantSites)
    .leftJoin(placements, and(eq(placements.siteId, implantSites.id), notSuperseded))
    .leftJoin(platforms, eq(platforms.id, placements.platformId))
    .leftJoin(implantSystems, eq(implantSystems.id, platforms.systemId))
    .where(and(eq(implantSites.patientId, patientId), siteIds ? inArray(implantSites.id, [...siteIds]) : undefined))
    .orderBy(asc(implantSites.fdi));
}
export type RestorableSiteRow = Awaited<ReturnType<typeof listRestorableSites>>[number];

/** A patient the user may see, with what the lab prescription needs. */
export async function findVisiblePatientBrief(db: Db, scope: Scope, id: string) {
  const [row] = await db
    .select({
      id: patients.id,
      practiceId: patients.practiceId,
      chartNumber: patients.chartNumber,
      givenName: patients.givenName,
      familyName: patients.familyName,
      practiceName: practices.name,
    })
    .from(patients)
    .innerJoin(practices, eq(practices.id, patients.practiceId))
    .where(and(eq(patients.id, id), visiblePatients(scope)));
  return row ?? null;
}

const restorationColumns = {
  id: restorations.id,
  practiceId: restorations.practiceId,
  patientId: restorations.patientId,
  kind: restorations.kind,
  retention: restorations.retention,
  material: restorations.material,
  shade: restorations.shade,
  status: restorations.status,
  copingsSplinted: restorations.copingsSplinted,
  impressionTakenOn: restorations.impressionTakenOn,
  deliveredOn: restorations.deliveredOn,
  labName: restorations.labName,
  labEmail: restorations.labEmail,
  dueOn: restorations.dueOn,
  notes: restorations.notes,
  findings: restorations.findings,
  rulesVersion: restorations.rulesVersion,
  plannedBy: restorations.plannedBy,
  plannedByName: users.displayName,
  createdAt: restorations.createdAt,
  supersedesId: restorations.supersedesId,
  amendmentReason: restorations.amendmentReason,
  supersededById: supersededById(restorations),
  provisional: restorations.provisional,
  plannedReplacementOn: restorations.plannedReplacementOn,
  replacedById: restorations.replacedById,
  cantileverLeftMm: restorations.cantileverLeftMm,
  cantileverRightMm: restorations.cantileverRightMm,
  apSpreadMm: restorations.apSpreadMm,
};

/** A restoration whose patient the user may see (scoped in SQL). */
export async function findVisibleRestoration(db: Db, scope: Scope, id: string) {
  const [row] = await db
    .select(restorationColumns)
    .from(restorations)
    .innerJoin(patients, eq(patients.id, restorations.patientId))
    .leftJoin(users, eq(users.id, restorations.plannedBy))
    .where(and(eq(restorations.id, id), visiblePatients(scope)));
  // `row` is undefined when no row is visible (callers answer 404).
  if (!row) return row;
  // The sites it spans: a share of one of them opens it (assertCan).
  const sites = await db
    .select({ siteId: restorationSites.siteId })
    .from(restorationSites)
    .where(eq(restorationSites.restorationId, id));
  return { ...row, siteIds: sites.map((s) => s.siteId) };
}
export type RestorationRow = Omit<NonNullable<Awaited<ReturnType<typeof findVisibleRestoration>>>, 'siteIds'>;

/**
 * Locks one restoration version for its delivery until the transaction ends: a concurrent
 * delivery or amendment of the version waits, and the delivery re-reads it after the lock.
 */
export async function lockRestoration(tx: Tx, id: string) {
  await tx.select({ id: restorations.id }).from(restorations).where(eq(restorations.id, id)).for('update');
}

/**
 * Share-locks one version for an amendment: a delivery of it waits until the amendment ends (and
 * the amendment, re-reading after the lock, sees a delivery committed before). Two amendments do
 * not wait for each other here; the unique index on supersedes_id decides between them.
 */
export async function shareLockRestoration(tx: Tx, id: string) {
  await tx.select({ id: restorations.id }).from(restorations).where(eq(restorations.id, id)).for('share');
}

/** A patient's restorations; with `siteIds` (a share of chosen sites) only those on one of them. */
export async function listRestorationsOfPatient(db: Db, patientId: string, siteIds: readonly string[] | null = null) {
  const onSites = siteIds
    ? inArray(
        restorations.id,
        db
          .select({ id: restorationSites.restorationId })
          .from(restorationSites)
          .where(inArray(restorationSites.siteId, [...siteIds])),
      )
    : undefined;
  return db
    .select(restorationColumns)
    .from(restorations)
    .leftJoin(users, eq(users.id, restorations.plannedBy))
    .where(and(eq(restorations.patientId, patientId), onSites))
    .orderBy(desc(restorations.createdAt));
}

/** Sites of restorations with their current placement's platform, and the chosen parts. */
export async function loadRestorationSites(db: Db, restorationIds: string[]) {
  if (restorationIds.length === 0) return { sites: [], parts: [] };
  const sites = await db
    .select({
      id: restorationSites.id,
      restorationId: restorationSites.restorationId,
      siteId: restorationSites.siteId,
      fdi: implantSites.fdi,
      interface: restorationSites.interface,
      impressionCoping: restorationSites.impressionCoping,
      multiUnitAngleDeg: restorationSites.multiUnitAngleDeg,
      restorativeSpaceMm: restorationSites.restorativeSpaceMm,
      axisX: restorationSites.axisX,
      axisY: restorationSites.axisY,
      axisZ: restorationSites.axisZ,
      platformId: placements.platformId,
      systemName: implantSystems.name,
      manufacturer: implantSystems.manufacturer,
      platformName: platforms.name,
      connection: platforms.connection,
      diameterMm: platforms.diameterMm,
      lengthMm: placements.lengthMm,
    })
    .from(restorationSites)
    .innerJoin(implantSites, eq(implantSites.id, restorationSites.siteId))
    .leftJoin(placements, and(eq(placements.siteId, implantSites.id), notSuperseded))
    .leftJoin(platforms, eq(platforms.id, placements.platformId))
    .leftJoin(implantSystems, eq(implantSystems.id, platforms.systemId))
    .where(inArray(restorationSites.restorationId, restorationIds))
    .orderBy(asc(implantSites.fdi));
  const parts =
    sites.length === 0
      ? []
      : await db
          .select({ restorationSiteId: restorationSiteComponents.restorationSiteId, ...componentSpecColumns })
          .from(restorationSiteComponents)
          .innerJoin(components, eq(components.id, restorationSiteComponents.componentId))
          .where(
            inArray(
              restorationSiteComponents.restorationSiteId,
              sites.map((s) => s.id),
            ),
          )
          .orderBy(asc(restorationSiteComponents.id));
  return { sites, parts };
}

export async function loadAcknowledgements(db: Db, restorationIds: string[]) {
  if (restorationIds.length === 0) return [];
  return db
    .select({
      restorationId: findingAcknowledgements.restorationId,
      code: findingAcknowledgements.code,
      fdi: findingAcknowledgements.fdi,
      byName: users.displayName,
      at: findingAcknowledgements.acknowledgedAt,
    })
    .from(findingAcknowledgements)
    .innerJoin(users, eq(users.id, findingAcknowledgements.acknowledgedBy))
    .where(inArray(findingAcknowledgements.restorationId, restorationIds))
    .orderBy(asc(findingAcknowledgements.acknowledgedAt));
}

export async function loadLabPrescriptions(db: Db, restorationIds: string[]) {
  if (restorationIds.length === 0) return [];
  return db
    .select({
      id: labPrescriptions.id,
      restorationId: labPrescriptions.restorationId,
      number: labPrescriptions.number,
      sizeBytes: labPrescriptions.sizeBytes,
      emailedTo: labPrescriptions.emailedTo,
      emailedAt: labPrescriptions.emailedAt,
      createdAt: labPrescriptions.createdAt,
    })
    .from(labPrescriptions)
    .where(inArray(labPrescriptions.restorationId, restorationIds))
    .orderBy(desc(labPrescriptions.createdAt), desc(labPrescriptions.id));
}

/** The latest e-mail request of each lab prescription. */
export async function loadLatestLabMails(db: Db, labPrescriptionIds: string[]) {
  if (labPrescriptionIds.length === 0) return [];
  return db
    .selectDistinctOn([labPrescriptionMails.labPrescriptionId], {
      labPrescriptionId: labPrescriptionMails.labPrescriptionId,
      to: labPrescriptionMails.sentTo,
      status: labPrescriptionMails.status,
      attempts: labPrescriptionMails.attempts,
      requestedAt: labPrescriptionMails.requestedAt,
    })
    .from(labPrescriptionMails)
    .where(inArray(labPrescriptionMails.labPrescriptionId, labPrescriptionIds))
    .orderBy(labPrescriptionMails.labPrescriptionId, desc(labPrescriptionMails.requestedAt));
}

/** Parts of the practice's catalogue by the id of any version, as their current version (new work, ADR 0006). */
export const findCatalogueParts = currentPartVersions;

type RestorationValues = typeof restorations.$inferInsert;
type ComponentKind = (typeof components.$inferSelect)['kind'];

export async function insertRestoration(tx: Tx, v: RestorationValues) {
  const [row] = await tx.insert(restorations).values(v).returning({ id: restorations.id });
  return row.id;
}

/** A new version of a plan; a second amendment of one version is refused by the database. */
export const insertRestorationAmendment = (
  tx: Tx,
  v: RestorationValues & { supersedesId: string; amendmentReason: string },
) => insertAmendment(tx, restorations, v);

export async function insertRestorationSite(tx: Tx, v: typeof restorationSites.$inferInsert) {
  const [row] = await tx.insert(restorationSites).values(v).returning({ id: restorationSites.id });
  return row.id;
}

export async function insertSiteComponents(tx: Tx, rows: (typeof restorationSiteComponents.$inferInsert)[]) {
  if (rows.length > 0) await tx.insert(restorationSiteComponents).values(rows);
}

export async function insertAcknowledgements(tx: Tx, rows: (typeof findingAcknowledgements.$inferInsert)[]) {
  if (rows.length > 0) await tx.insert(findingAcknowledgements).values(rows);
}

/** Parts of the given kinds still in place at the sites get `removedOn`. */
export async function removePartsOfKinds(tx: Tx, siteIds: string[], kinds: readonly ComponentKind[], on: string) {
  const found = await tx
    .select({ id: componentInstances.id })
    .from(componentInstances)
    .innerJoin(components, eq(components.id, componentInstances.componentId))
    .where(and(inArray(componentInstances.siteId, siteIds), partInPlace(), inArray(components.kind, [...kinds])));
  if (found.length > 0)
    await tx
      .update(componentInstances)
      .set({ removedOn: on })
      .where(
        inArray(
          componentInstances.id,
          found.map((h) => h.id),
        ),
      );
}

/** Restorations delivered at any of the sites, other than the one given. */
export async function findDeliveredAt(tx: Tx, siteIds: string[], exceptId: string) {
  const rows = await tx
    .selectDistinct({ id: restorations.id })
    .from(restorations)
    .innerJoin(restorationSites, eq(restorationSites.restorationId, restorations.id))
    .where(
      and(
        inArray(restorationSites.siteId, siteIds),
        eq(restorations.status, 'delivered'),
        ne(restorations.id, exceptId),
      ),
    );
  return rows.map((r) => r.id);
}

/**
 * The restorations become 'removed'; their parts still in place come out (`removedOn`) at the
 * given sites, and parts of the given kinds come out at every site they span.
 */
export async function removeRestorations(
  tx: Tx,
  ids: string[],
  siteIds: string[],
  everywhereKinds: readonly ComponentKind[],
  on: string,
  replacedById: string,
) {
  await tx.update(restorations).set({ status: 'removed', replacedById }).where(inArray(restorations.id, ids));
  const everywhere = tx
    .select({ id: components.id })
    .from(components)
    .where(inArray(components.kind, [...everywhereKinds]));
  await tx
    .update(componentInstances)
    .set({ removedOn: on })
    .where(
      and(
        inArray(componentInstances.restorationId, ids),
        partInPlace(),
        or(inArray(componentInstances.siteId, siteIds), inArray(componentInstances.componentId, everywhere)),
      ),
    );
}

export async function installParts(tx: Tx, rows: (typeof componentInstances.$inferInsert)[]) {
  await tx.insert(componentInstances).values(rows);
}

/** The version is delivered; its sites are restored. */
export async function markDelivered(
  tx: Tx,
  id: string,
  siteIds: string[],
  v: { deliveredOn: string; impressionTakenOn: string | null },
) {
  await tx
    .update(restorations)
    .set({ status: 'delivered', deliveredOn: v.deliveredOn, impressionTakenOn: v.impressionTakenOn })
    .where(eq(restorations.id, id));
  await tx.update(implantSites).set({ status: 'restored' }).where(inArray(implantSites.id, siteIds));
}
