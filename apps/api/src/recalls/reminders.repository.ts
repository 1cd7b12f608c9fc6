import { and, desc, eq, inArray, isNull, ne, sql } from 'drizzle-orm';
import type { DateFormat, ReminderKind, ReminderStatus } from '@torquetrail/contracts';
import type { Db } from '../db/database.js';
import { patients, recallPolicies, recalls, reminderLog } from '../db/schema/index.js';
import { DEFAULT_POLICY } from './exams.repository.js';

/**
 * Scheduled recalls of patients who may be reminded: not archived, with an e-mail address and
 * their consent to e-mail reminders; with their practice's policy.
 */
export async function listScheduledRecalls(db: Db, practiceId?: string) {
  return db
    .select({
      practiceId: recalls.practiceId,
      patientId: recalls.patientId,
      dueOn: recalls.dueOn,
      reminderDaysBefore: sql<number>`coalesce(${recallPolicies.reminderDaysBefore}, ${DEFAULT_POLICY.reminderDaysBefore})`,
      overdueReminderDaysAfter: sql<number>`coalesce(${recallPolicies.overdueReminderDaysAfter}, ${DEFAULT_POLICY.overdueReminderDaysAfter})`,
    })
    .from(recalls)
    .innerJoin(patients, eq(patients.id, recalls.patientId))
    .leftJoin(recallPolicies, eq(recallPolicies.practiceId, recalls.practiceId))
    .where(
      and(
        eq(recalls.status, 'scheduled'),
        sql`${patients.email} is not null`,
        eq(patients.emailReminderConsent, true),
        isNull(patients.archivedAt),
        practiceId ? eq(recalls.practiceId, practiceId) : undefined,
      ),
    );
}

/** Logs each reminder once: the idempotency key is unique, so a second scan inserts nothing. */
export async function logReminders(
  db: Db,
  rows: { practiceId: string; patientId: string; recallDueOn: string; kind: ReminderKind; idempotencyKey: string }[],
): Promise<number> {
  if (rows.length === 0) return 0;
  const inserted = await db
    .insert(reminderLog)
    .values(rows)
    .onConflictDoNothing({ target: reminderLog.idempotencyKey })
    .returning({ id: reminderLog.id });
  return inserted.length;
}

/** Reminders not yet accepted by SMTP, for the keys given: these (re)enter the queue. */
export async function listUnsent(db: Db, keys: string[]) {
  if (keys.length === 0) return [];
  return db
    .select({ id: reminderLog.id, idempotencyKey: reminderLog.idempotencyKey })
    .from(reminderLog)
    .where(and(inArray(reminderLog.idempotencyKey, keys), ne(reminderLog.status, 'sent')));
}

/** Locks one reminder row for the duration of the caller's transaction (one sender at a time). */
export async function lockReminder(db: Db, id: string) {
  const result = await db.execute<{
    id: string;
    status: ReminderStatus;
    kind: ReminderKind;
    recall_due_on: string;
    idempotency_key: string;
    attempts: number;
    email: string | null;
    consent: boolean;
    archived: boolean;
    given_name: string;
    family_name: string;
    practice_name: string;
    date_format: DateFormat;
  }>(sql`
    select r.id, r.status, r.kind, r.recall_due_on::text as recall_due_on, r.idempotency_key, r.attempts,
           p.email, p.email_reminder_consent as consent, p.archived_at is not null as archived, p.given_name, p.family_name, pr.name as practice_name, pr.date_format
    from reminder_log r join patients p on p.id = r.patient_id join practices pr on pr.id = r.practice_id
    where r.id = ${id}
    for update of r
  `);
  return result.rows[0] ?? null;
}

export async function markSent(db: Db, id: string, messageId: string) {
  await db
    .update(reminderLog)
    .set({ status: 'sent', messageId, sentAt: new Date(), attempts: sql`${reminderLog.attempts} + 1`, lastError: null })
    .where(eq(reminderLog.id, id));
}

export async function markFailedAttempt(db: Db, id: string, error: string, final: boolean) {
  await db
    .update(reminderLog)
    .set({
      status: final ? 'failed' : 'pending',
      attempts: sql`${reminderLog.attempts} + 1`,
      lastError: error.slice(0, 500),
    })
    .where(and(eq(reminderLog.id, id), ne(reminderLog.status, 'sent')));
}

export async function listReminderLog(db: Db, practiceId: string) {
  return db
    .select({
      id: reminderLog.id,
      patientId: reminderLog.patientId,
      patientName: sql<string>`${patients.givenName} || ' ' || ${patients.familyName}`,
      chartNumber: patients.chartNumber,
      recallDueOn: reminderLog.recallDueOn,
      kind: reminderLog.kind,
      status: reminderLog.status,
      attempts: reminderLog.attempts,
      lastError: reminderLog.lastError,
      sentAt: reminderLog.sentAt,
      createdAt: reminderLog.createdAt,
    })
    .from(reminderLog)
    .innerJoin(patients, eq(patients.id, reminderLog.patientId))
    .where(eq(reminderLog.practiceId, practiceId))
    .orderBy(desc(reminderLog.createdAt), desc(reminderLog.recallDueOn))
    .limit(500);
}

/** A logged reminder that must not go out any more (patient archived, consent withdrawn). */
export async function markWithheld(db: Db, id: string, why: string) {
  await db
    .update(reminderLog)
    .set({ status: 'withheld', lastError: why })
    .where(and(eq(reminderLog.id, id), ne(reminderLog.status, 'sent')));
}
