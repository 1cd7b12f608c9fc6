import { and, desc, eq, sql } from 'drizzle-orm';
import type { Db, Tx } from '../db/database.js';
import { labPrescriptionMails, labPrescriptions, patients, practices, restorations } from '../db/schema/index.js';
import type { Scope } from '../authz/scope.js';
import { visiblePatients } from '../authz/visible-patients.js';

export async function insertLabPrescription(db: Db, v: typeof labPrescriptions.$inferInsert) {
  const [row] = await db.insert(labPrescriptions).values(v).returning();
  return row;
}

/**
 * The practice's next prescription number, drawn before the PDF is rendered so the sheet can print
 * it. The row lock of the update serialises two draws of one practice; a draw whose prescription
 * is then not written leaves a gap, never a duplicate.
 */
export async function nextPrescriptionNumber(db: Db, practiceId: string): Promise<number> {
  const [row] = await db
    .update(practices)
    .set({ labPrescriptionCounter: sql`${practices.labPrescriptionCounter} + 1` })
    .where(eq(practices.id, practiceId))
    .returning({ number: practices.labPrescriptionCounter });
  return row.number;
}

/** Serialises the prescriptions of one plan version, so two presses at once cannot both write one. */
export async function lockPrescriptionsOf(tx: Tx, restorationId: string): Promise<void> {
  await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`lab-prescription:${restorationId}`}))`);
}

/** A stored lab prescription, if the user may see its patient, with the chart number for its file name. */
export async function findVisibleLabPrescription(db: Db, scope: Scope, id: string) {
  const [row] = await db
    .select({
      id: labPrescriptions.id,
      practiceId: labPrescriptions.practiceId,
      patientId: labPrescriptions.patientId,
      objectKey: labPrescriptions.objectKey,
      chartNumber: patients.chartNumber,
    })
    .from(labPrescriptions)
    .innerJoin(patients, eq(patients.id, labPrescriptions.patientId))
    .where(and(eq(labPrescriptions.id, id), visiblePatients(scope)));
  return row ?? null;
}

/** The plan version's latest prescription (the one pressing again re-uses), if any. */
export async function findLatestForRestoration(db: Db, restorationId: string) {
  const [row] = await db
    .select({ id: labPrescriptions.id })
    .from(labPrescriptions)
    .where(eq(labPrescriptions.restorationId, restorationId))
    .orderBy(desc(labPrescriptions.createdAt), desc(labPrescriptions.id))
    .limit(1);
  return row ?? null;
}

/**
 * Records a request to e-mail a prescription, or finds the one already waiting (the partial
 * unique index keeps one pending request per prescription, also under concurrent presses).
 */
export async function requestMail(
  db: Db,
  v: { practiceId: string; labPrescriptionId: string; sentTo: string; requestedBy: string },
): Promise<string> {
  const [inserted] = await db
    .insert(labPrescriptionMails)
    .values(v)
    .onConflictDoNothing()
    .returning({ id: labPrescriptionMails.id });
  if (inserted) return inserted.id;
  const [pending] = await db
    .select({ id: labPrescriptionMails.id })
    .from(labPrescriptionMails)
    .where(
      and(eq(labPrescriptionMails.labPrescriptionId, v.labPrescriptionId), eq(labPrescriptionMails.status, 'pending')),
    );
  if (!pending) throw new Error('the pending lab mail vanished between insert and select');
  return pending.id;
}

/** Requests still waiting for SMTP (the sweep queues a job for each; the singleton key dedupes). */
export async function listPendingMails(db: Db) {
  return db
    .select({ id: labPrescriptionMails.id })
    .from(labPrescriptionMails)
    .where(eq(labPrescriptionMails.status, 'pending'));
}

/** Locks one mail request for its send, with what the message needs. */
export async function lockMail(tx: Tx, id: string) {
  const [row] = await tx
    .select({
      id: labPrescriptionMails.id,
      status: labPrescriptionMails.status,
      sentTo: labPrescriptionMails.sentTo,
      labPrescriptionId: labPrescriptions.id,
      restorationId: labPrescriptions.restorationId,
      objectKey: labPrescriptions.objectKey,
      chartNumber: patients.chartNumber,
      practiceName: practices.name,
      dateFormat: practices.dateFormat,
      dueOn: restorations.dueOn,
    })
    .from(labPrescriptionMails)
    .innerJoin(labPrescriptions, eq(labPrescriptions.id, labPrescriptionMails.labPrescriptionId))
    .innerJoin(patients, eq(patients.id, labPrescriptions.patientId))
    .innerJoin(practices, eq(practices.id, labPrescriptions.practiceId))
    .innerJoin(restorations, eq(restorations.id, labPrescriptions.restorationId))
    .where(eq(labPrescriptionMails.id, id))
    .for('update', { of: labPrescriptionMails });
  return row ?? null;
}

export async function markMailSent(tx: Tx, id: string, labPrescriptionId: string, sentTo: string, messageId: string) {
  const sentAt = new Date();
  await tx
    .update(labPrescriptionMails)
    .set({ status: 'sent', messageId, sentAt, attempts: sql`${labPrescriptionMails.attempts} + 1`, lastError: null })
    .where(eq(labPrescriptionMails.id, id));
  await tx
    .update(labPrescriptions)
    .set({ emailedTo: sentTo, emailedAt: sentAt })
    .where(eq(labPrescriptions.id, labPrescriptionId));
}

export async function markMailAttemptFailed(tx: Tx, id: string, error: string, final: boolean) {
  await tx
    .update(labPrescriptionMails)
    .set({
      attempts: sql`${labPrescriptionMails.attempts} + 1`,
      lastError: error.slice(0, 500),
      ...(final ? { status: 'failed' as const } : {}),
    })
    .where(eq(labPrescriptionMails.id, id));
}
