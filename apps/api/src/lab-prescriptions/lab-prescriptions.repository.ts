import { and, eq } from 'drizzle-orm';
import type { Db } from '../db/database.js';
import { labPrescriptions, patients } from '../db/schema/index.js';
import type { Scope } from '../authz/scope.js';
import { visiblePatients } from '../authz/visible-patients.js';

export async function insertLabPrescription(db: Db, v: typeof labPrescriptions.$inferInsert) {
  const [row] = await db.insert(labPrescriptions).values(v).returning();
  return row;
}

export async function markEmailed(db: Db, id: string, emailedTo: string, emailedAt: Date) {
  await db.update(labPrescriptions).set({ emailedTo, emailedAt }).where(eq(labPrescriptions.id, id));
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
