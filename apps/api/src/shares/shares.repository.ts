// Shares and their notices. A share is found through the sharing practice only (the `where`
// clause names it); another practice's user is found by the exact e-mail and nothing else.
import { and, asc, desc, eq, inArray, isNull, ne, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import type { ShareNoticeKind, ShareScope } from '@torquetrail/contracts';
import type { Scope } from '../authz/scope.js';
import { visiblePatients } from '../authz/visible-patients.js';
import type { Db } from '../db/database.js';
import { liveShare } from '../db/live-share.js';
import {
  implantSites,
  invitations,
  patients,
  patientShares,
  practices,
  shareNotices,
  users,
} from '../db/schema/index.js';

const surgeon = alias(users, 'surgeon');
const sharedBy = alias(users, 'shared_by');
const revokedBy = alias(users, 'revoked_by');
const surgeonPractice = alias(practices, 'surgeon_practice');

function selectShares(db: Db, where: SQL) {
  return db
    .select({
      id: patientShares.id,
      practiceId: patientShares.practiceId,
      patientId: patientShares.patientId,
      givenName: patients.givenName,
      familyName: patients.familyName,
      chartNumber: patients.chartNumber,
      surgeonId: patientShares.sharedWithUserId,
      surgeonName: surgeon.displayName,
      surgeonEmail: sql<string>`coalesce(${surgeon.email}, ${invitations.email})`,
      surgeonPracticeName: surgeonPractice.name,
      invitationId: patientShares.invitationId,
      invitationExpiresAt: invitations.expiresAt,
      /** An invited surgeon's link still works (or its mail is still on its way). */
      invitationOpen: sql<boolean>`(${invitations.acceptedAt} is null and ${invitations.revokedAt} is null
        and (${invitations.expiresAt} is null or ${invitations.expiresAt} > now()))`,
      scopes: patientShares.scopes,
      siteIds: patientShares.siteIds,
      endsOn: patientShares.endsOn,
      reason: patientShares.reason,
      live: sql<boolean>`(${liveShare()})`,
      sharedByName: sharedBy.displayName,
      since: patientShares.since,
      revokedAt: patientShares.revokedAt,
      revokedByName: revokedBy.displayName,
      revokeReason: patientShares.revokeReason,
    })
    .from(patientShares)
    .innerJoin(patients, eq(patients.id, patientShares.patientId))
    .leftJoin(surgeon, eq(surgeon.id, patientShares.sharedWithUserId))
    .leftJoin(surgeonPractice, eq(surgeonPractice.id, surgeon.practiceId))
    .leftJoin(invitations, eq(invitations.id, patientShares.invitationId))
    .innerJoin(sharedBy, eq(sharedBy.id, patientShares.sharedByUserId))
    .leftJoin(revokedBy, eq(revokedBy.id, patientShares.revokedBy))
    .where(where)
    .orderBy(desc(patientShares.since), asc(patientShares.id));
}

export type ShareRow = Awaited<ReturnType<typeof selectShares>>[number];

/** The practice's shares, newest first (patient_shares_patient_idx, practice filter). */
export function listPracticeShares(db: Db, practiceId: string) {
  return selectShares(db, eq(patientShares.practiceId, practiceId));
}

export function listPatientShares(db: Db, practiceId: string, patientId: string) {
  return selectShares(db, and(eq(patientShares.practiceId, practiceId), eq(patientShares.patientId, patientId))!);
}

/** One share of the practice; null for another practice's share (the caller answers 404). */
export async function findShare(db: Db, practiceId: string, id: string) {
  const [row] = await selectShares(db, and(eq(patientShares.id, id), eq(patientShares.practiceId, practiceId))!);
  return row ?? null;
}

/** The FDI positions of the given sites of one patient (sites of another patient are left out). */
export function findSitesOfPatient(db: Db, patientId: string, siteIds: readonly string[]) {
  if (siteIds.length === 0) return Promise.resolve([]);
  return db
    .select({ id: implantSites.id, fdi: implantSites.fdi })
    .from(implantSites)
    .where(and(eq(implantSites.patientId, patientId), inArray(implantSites.id, [...siteIds])))
    .orderBy(asc(implantSites.fdi));
}

/** The FDI positions of the sites shares name (read with the shares of the practice). */
export function findSiteFdis(db: Db, siteIds: readonly string[]) {
  if (siteIds.length === 0) return Promise.resolve([]);
  return db
    .select({ id: implantSites.id, fdi: implantSites.fdi })
    .from(implantSites)
    .where(inArray(implantSites.id, [...siteIds]));
}

/** A user by the exact address (active or not): the only way a user of another practice is found. */
export async function findUserByEmail(db: Db, email: string) {
  const [row] = await db
    .select({ id: users.id, role: users.role, practiceId: users.practiceId, active: users.active })
    .from(users)
    .where(eq(users.email, email.toLowerCase()));
  return row ?? null;
}

/**
 * The practice's invitation still open for this address (not accepted or withdrawn), locked: a
 * second share with the same new surgeon joins it; `expired` ones are withdrawn and made anew.
 */
export async function lockOpenInvitation(tx: Db, practiceId: string, email: string) {
  const [row] = await tx
    .select({
      id: invitations.id,
      ownPractice: invitations.ownPractice,
      expired: sql<boolean>`(${invitations.expiresAt} is not null and ${invitations.expiresAt} <= now())`,
    })
    .from(invitations)
    .where(
      and(
        eq(invitations.practiceId, practiceId),
        eq(invitations.email, email),
        isNull(invitations.acceptedAt),
        isNull(invitations.revokedAt),
      ),
    )
    .for('update');
  return row ?? null;
}

/** An invitation of a referring surgeon to Torquetrail, to a practice of their own. */
export async function insertSurgeonInvitation(
  tx: Db,
  v: { practiceId: string; email: string; invitedBy: string; linkOrigin: string },
): Promise<string> {
  const [row] = await tx
    .insert(invitations)
    .values({ ...v, role: 'surgeon', ownPractice: true })
    .returning({ id: invitations.id });
  return row.id;
}

export async function withdrawInvitation(tx: Db, id: string, by: string): Promise<void> {
  await tx
    .update(invitations)
    .set({ revokedAt: new Date(), revokedBy: by })
    .where(and(eq(invitations.id, id), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)));
}

/** Whether an invitation still has a share waiting on it other than `exceptShareId`. */
export async function invitationHasOtherShares(tx: Db, invitationId: string, exceptShareId: string) {
  const rows = await tx
    .select({ id: patientShares.id })
    .from(patientShares)
    .where(
      and(
        eq(patientShares.invitationId, invitationId),
        ne(patientShares.id, exceptShareId),
        isNull(patientShares.revokedAt),
      ),
    )
    .limit(1);
  return rows.length > 0;
}

export async function insertShare(
  tx: Db,
  v: {
    practiceId: string;
    patientId: string;
    sharedWithUserId: string | null;
    invitationId: string | null;
    sharedByUserId: string;
    scopes: ShareScope[];
    siteIds: string[] | null;
    endsOn: string | null;
    reason: string;
  },
) {
  const [row] = await tx.insert(patientShares).values(v).returning({ id: patientShares.id });
  return row.id;
}

/** Revokes a share not yet revoked; false when it already was (a concurrent revoke). */
export async function revokeShare(tx: Db, id: string, by: string, reason: string): Promise<boolean> {
  const rows = await tx
    .update(patientShares)
    .set({ revokedAt: new Date(), revokedBy: by, revokeReason: reason })
    .where(and(eq(patientShares.id, id), isNull(patientShares.revokedAt)))
    .returning({ id: patientShares.id });
  return rows.length === 1;
}

export async function insertNotice(tx: Db, shareId: string, kind: ShareNoticeKind) {
  const [row] = await tx.insert(shareNotices).values({ shareId, kind }).returning({ id: shareNotices.id });
  return row.id;
}

/** Notices still waiting for SMTP (the sweep queues a job for each; the singleton key dedupes). */
export function listPendingNotices(db: Db) {
  return db.select({ id: shareNotices.id }).from(shareNotices).where(eq(shareNotices.status, 'pending')).limit(500);
}

/** Locks a notice for its send, with what the e-mail says. */
export async function lockNotice(tx: Db, id: string) {
  const [row] = await tx
    .select({
      id: shareNotices.id,
      kind: shareNotices.kind,
      status: shareNotices.status,
      to: surgeon.email,
      surgeonName: surgeon.displayName,
      practiceName: practices.name,
      dateFormat: practices.dateFormat,
      scopes: patientShares.scopes,
      siteIds: patientShares.siteIds,
      endsOn: patientShares.endsOn,
    })
    .from(shareNotices)
    .innerJoin(patientShares, eq(patientShares.id, shareNotices.shareId))
    .innerJoin(surgeon, eq(surgeon.id, patientShares.sharedWithUserId))
    .innerJoin(practices, eq(practices.id, patientShares.practiceId))
    .where(eq(shareNotices.id, id))
    .for('update', { of: shareNotices });
  return row ?? null;
}

export async function markNoticeSent(tx: Db, id: string) {
  await tx
    .update(shareNotices)
    .set({ status: 'sent', sentAt: new Date(), attempts: sql`${shareNotices.attempts} + 1`, lastError: null })
    .where(eq(shareNotices.id, id));
}

export async function markNoticeFailed(tx: Db, id: string, reason: string, final: boolean) {
  await tx
    .update(shareNotices)
    .set({
      attempts: sql`${shareNotices.attempts} + 1`,
      lastError: reason.slice(0, 500),
      ...(final ? { status: 'failed' as const } : {}),
    })
    .where(eq(shareNotices.id, id));
}

/** A patient the user may see (scoped in SQL). */
export async function findVisiblePatient(db: Db, scope: Scope, patientId: string) {
  const [row] = await db
    .select({ id: patients.id, practiceId: patients.practiceId })
    .from(patients)
    .where(and(eq(patients.id, patientId), visiblePatients(scope)));
  return row ?? null;
}
