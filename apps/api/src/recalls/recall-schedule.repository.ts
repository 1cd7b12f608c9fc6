import { eq } from 'drizzle-orm';
import type { Db } from '../db/database.js';
import { patients } from '../db/schema/index.js';

/** The risk factors nextRecallDate weighs, of a patient the caller has already scoped. */
export async function findPatientRisk(db: Db, patientId: string) {
  const [row] = await db
    .select({
      id: patients.id,
      practiceId: patients.practiceId,
      smoker: patients.smoker,
      diabetesPoorlyControlled: patients.diabetesPoorlyControlled,
      periodontitisHistory: patients.periodontitisHistory,
    })
    .from(patients)
    .where(eq(patients.id, patientId));
  if (!row) throw new Error(`patient ${patientId} not found`);
  return row;
}
