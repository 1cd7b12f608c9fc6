import { and, desc, eq, gte, lt, sql, type SQL } from 'drizzle-orm';
import type { AuditAction } from '@torquetrail/contracts';
import type { Db } from '../db/database.js';
import { auditEvents, patients, users } from '../db/schema/index.js';

export interface AuditFilter {
  practiceId: string;
  patientId?: string;
  userId?: string;
  action?: AuditAction;
  /** UTC days, both inclusive. */
  from?: string;
  to?: string;
}

const nextDay = (day: string) => new Date(Date.parse(`${day}T00:00:00Z`) + 86_400_000);

/**
 * One page of a practice's audit trail, newest first, in SQL: every filter is a `where` on the
 * indexed columns (practice + time, + patient, + user), and the page starts after the row
 * `before` (keyset: at, then id, so rows of one instant are neither lost nor repeated).
 */
export function listAuditEvents(db: Db, filter: AuditFilter, before: string | undefined, limit: number) {
  const where: SQL[] = [eq(auditEvents.practiceId, filter.practiceId)];
  if (filter.patientId) where.push(eq(auditEvents.patientId, filter.patientId));
  if (filter.userId) where.push(eq(auditEvents.userId, filter.userId));
  if (filter.action) where.push(eq(auditEvents.action, filter.action));
  if (filter.from) where.push(gte(auditEvents.at, new Date(`${filter.from}T00:00:00Z`)));
  if (filter.to) where.push(lt(auditEvents.at, nextDay(filter.to)));
  if (before) {
    where.push(
      sql`(${auditEvents.at}, ${auditEvents.id}) < (select b.at, b.id from audit_events b where b.id = ${before} and b.practice_id = ${filter.practiceId})`,
    );
  }
  return db
    .select({
      id: auditEvents.id,
      at: auditEvents.at,
      action: auditEvents.action,
      outcome: auditEvents.outcome,
      httpStatus: auditEvents.httpStatus,
      route: auditEvents.route,
      recordType: auditEvents.recordType,
      recordId: auditEvents.recordId,
      patientId: auditEvents.patientId,
      patientName: sql<string | null>`${patients.givenName} || ' ' || ${patients.familyName}`,
      chartNumber: patients.chartNumber,
      userId: auditEvents.userId,
      userName: users.displayName,
      role: auditEvents.role,
      address: auditEvents.address,
      userAgent: auditEvents.userAgent,
      query: auditEvents.query,
      before: auditEvents.before,
      after: auditEvents.after,
    })
    .from(auditEvents)
    .leftJoin(patients, eq(patients.id, auditEvents.patientId))
    .leftJoin(users, eq(users.id, auditEvents.userId))
    .where(and(...where))
    .orderBy(desc(auditEvents.at), desc(auditEvents.id))
    .limit(limit);
}

export type AuditEventRow = Awaited<ReturnType<typeof listAuditEvents>>[number];

/** A patient of the practice (the patient's trail is the practice's own: no share opens it). */
export async function findPracticePatient(db: Db, practiceId: string, id: string) {
  const [row] = await db
    .select({ id: patients.id, practiceId: patients.practiceId })
    .from(patients)
    .where(and(eq(patients.id, id), eq(patients.practiceId, practiceId)));
  return row ? { ...row, patientId: row.id } : null;
}

/** The practice's people, for the Audit page's user filter. */
export function listPracticePeople(db: Db, practiceId: string) {
  return db
    .select({ id: users.id, name: users.displayName, role: users.role })
    .from(users)
    .where(eq(users.practiceId, practiceId))
    .orderBy(users.displayName);
}
