// Writes of patients' records. A patient row is only ever written together with its version
// (`insertPatientWithVersion`, `updatePatientWithVersion`): there is no other update here, so
// nothing overwrites a record without leaving who, when and what changed.
import { and, asc, eq, ne, sql } from 'drizzle-orm';
import type { Db, Tx } from '../db/database.js';
import { chartNumberSequences, patients, patientVersions, type PatientFieldChange, users } from '../db/schema/index.js';
import type { PatientVersionKind } from '@torquetrail/contracts';

/** A new practice's chart numbers start so, until the practice admin sets its prefix. */
const DEFAULT_CHART_PREFIX = 'P-';
const FIRST_CHART_NUMBER = 1;

/** prefix + the number with at least four digits: 'LL-' and 1006 → 'LL-1006'. */
export const formatChartNumber = (prefix: string, n: number) => `${prefix}${String(n).padStart(4, '0')}`;

export type PatientRow = typeof patients.$inferSelect;
export type { PatientFieldChange };
type PatientInsert = typeof patients.$inferInsert;
/** The columns a version may change. */
export type PatientChange = Partial<Omit<PatientInsert, 'id' | 'practiceId' | 'createdAt'>>;

/**
 * The next free chart number of the practice. Each call takes a number with one atomic
 * `insert … on conflict do update … returning`: the row stays locked until the caller's
 * transaction ends, so parallel creates queue behind each other. Numbers already used (typed by
 * hand, imported) are skipped.
 */
export async function takeChartNumber(tx: Tx, practiceId: string): Promise<string> {
  for (let attempt = 0; attempt < 10_000; attempt += 1) {
    const result = await tx.execute<{ prefix: string; taken: number }>(sql`
      insert into ${chartNumberSequences} (practice_id, prefix, next_number)
      values (${practiceId}, ${DEFAULT_CHART_PREFIX}, ${FIRST_CHART_NUMBER + 1})
      on conflict (practice_id) do update set next_number = ${chartNumberSequences.nextNumber} + 1
      returning prefix, next_number - 1 as taken
    `);
    const { prefix, taken } = result.rows[0];
    const chartNumber = formatChartNumber(prefix, taken);
    if (!(await chartNumberTaken(tx, practiceId, chartNumber))) return chartNumber;
  }
  throw new Error('no free chart number found');
}

export async function chartNumberTaken(db: Db, practiceId: string, chartNumber: string, exceptId?: string) {
  const [row] = await db
    .select({ id: patients.id })
    .from(patients)
    .where(
      and(
        eq(patients.practiceId, practiceId),
        eq(patients.chartNumber, chartNumber),
        exceptId ? ne(patients.id, exceptId) : undefined,
      ),
    )
    .limit(1);
  return row !== undefined;
}

export async function insertPatientWithVersion(
  tx: Tx,
  values: PatientInsert,
  version: { changes: PatientFieldChange[]; changedBy: string },
): Promise<string> {
  const [row] = await tx.insert(patients).values(values).returning({ id: patients.id });
  await tx.insert(patientVersions).values({
    practiceId: values.practiceId,
    patientId: row.id,
    version: 1,
    kind: 'created',
    changes: version.changes,
    changedBy: version.changedBy,
  });
  return row.id;
}

/** The patient's row, locked until the caller's transaction ends (one change at a time). */
export async function lockPatient(tx: Tx, practiceId: string, id: string): Promise<PatientRow | null> {
  const [row] = await tx
    .select()
    .from(patients)
    .where(and(eq(patients.id, id), eq(patients.practiceId, practiceId)))
    .for('update');
  return row ?? null;
}

/** Writes a change and its version in the caller's transaction (the patient row locked first). */
export async function updatePatientWithVersion(
  tx: Tx,
  patient: { id: string; practiceId: string },
  set: PatientChange,
  version: { kind: PatientVersionKind; changes: PatientFieldChange[]; reason: string | null; changedBy: string },
): Promise<void> {
  await tx.update(patients).set(set).where(eq(patients.id, patient.id));
  await tx.insert(patientVersions).values({
    practiceId: patient.practiceId,
    patientId: patient.id,
    version: sql`(select coalesce(max(${patientVersions.version}), 0) + 1 from ${patientVersions} where ${patientVersions.patientId} = ${patient.id})`,
    kind: version.kind,
    changes: version.changes,
    reason: version.reason,
    changedBy: version.changedBy,
  });
}

export async function listVersions(db: Db, patientId: string) {
  return db
    .select({
      version: patientVersions.version,
      kind: patientVersions.kind,
      changedAt: patientVersions.changedAt,
      changedByName: users.displayName,
      reason: patientVersions.reason,
      changes: patientVersions.changes,
    })
    .from(patientVersions)
    .innerJoin(users, eq(users.id, patientVersions.changedBy))
    .where(eq(patientVersions.patientId, patientId))
    .orderBy(asc(patientVersions.version));
}

/** A family name without case or accents: é, Ü, ñ, å … compare as e, u, n, a (combining marks removed after NFD). */
const folded = (value: unknown) => sql`lower(regexp_replace(normalize(${value}, NFD), ${'[\u0300-\u036f]'}, '', 'g'))`;

/** The practice's patients (archived ones too) with this family name, folded, and birth date. */
export async function findDuplicates(
  db: Db,
  practiceId: string,
  q: { familyName: string; birthDate: string; excludeId?: string },
) {
  return db
    .select({
      id: patients.id,
      chartNumber: patients.chartNumber,
      givenName: patients.givenName,
      familyName: patients.familyName,
      birthDate: patients.birthDate,
      archivedAt: patients.archivedAt,
    })
    .from(patients)
    .where(
      and(
        eq(patients.practiceId, practiceId),
        eq(patients.birthDate, q.birthDate),
        sql`${folded(patients.familyName)} = ${folded(q.familyName.trim())}`,
        q.excludeId ? ne(patients.id, q.excludeId) : undefined,
      ),
    )
    .orderBy(asc(patients.chartNumber))
    .limit(20);
}

export async function findChartSettings(db: Db, practiceId: string) {
  const [row] = await db
    .select({ prefix: chartNumberSequences.prefix, nextNumber: chartNumberSequences.nextNumber })
    .from(chartNumberSequences)
    .where(eq(chartNumberSequences.practiceId, practiceId));
  return row ?? { prefix: DEFAULT_CHART_PREFIX, nextNumber: FIRST_CHART_NUMBER };
}

/** A new prefix; the numbering goes on where it was. */
export async function setChartPrefix(db: Db, practiceId: string, prefix: string, userId: string) {
  await db
    .insert(chartNumberSequences)
    .values({ practiceId, prefix, nextNumber: FIRST_CHART_NUMBER, updatedBy: userId })
    .onConflictDoUpdate({
      target: chartNumberSequences.practiceId,
      set: { prefix, updatedBy: userId, updatedAt: new Date() },
    });
}
