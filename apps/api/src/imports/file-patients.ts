// Which patient each row of a file is about: a patient of the practice matched by chart number
// (or, without one, by name and birth date), or a new patient created with their first good row.
import { randomUUID } from 'node:crypto';
import type { ImportCounts, ImportRow } from '@torquetrail/contracts';
import type * as repo from './imports.repository.js';
import { key, RowError } from './import-row.js';

type KnownPatient = Awaited<ReturnType<typeof repo.practicePatients>>[number];

/** A patient as the file names it: known, or new and created with its first good row. */
export interface FilePatient {
  patientId: string;
  identity: string;
  row: number;
  create: ImportRow | null;
}

/** What matching reports to the plan: its counts, its writes, its warnings and its entries. */
export interface PatientPlan {
  readonly counts: ImportCounts;
  readonly writes: repo.ImportWrites;
  warning(row: number, column: string | null, message: string): void;
  entry(row: number, recordTable: string, recordId: string): void;
}

export class FilePatients {
  /** The patients the file touches, for the result's links (id → chart and name). */
  readonly touched = new Map<string, { id: string; chartNumber: string; name: string }>();

  private readonly byChart = new Map<string, KnownPatient>();
  private readonly byIdentity = new Map<string, KnownPatient>();
  private readonly fileChart = new Map<string, FilePatient>();
  private readonly matchedOnce = new Set<string>();

  constructor(
    patients: KnownPatient[],
    private readonly who: { practiceId: string; userId: string },
    private readonly plan: PatientPlan,
  ) {
    for (const p of patients) {
      this.byChart.set(key(p.chartNumber), p);
      this.byIdentity.set(key(p.familyName, p.givenName, p.birthDate), p);
    }
  }

  /** The row's patient; a chart number the file or the practice gives another person fails the row. */
  of(rowNumber: number, row: ImportRow): FilePatient {
    const identity = key(row.familyName, row.givenName, row.birthDate);
    const chart = key(row.chartNumber);
    const seen = this.fileChart.get(chart);
    if (seen) {
      if (seen.identity !== identity)
        throw new RowError(
          'chart_number',
          `Chart number ${row.chartNumber} has another name or birth date on row ${seen.row}`,
        );
      return seen;
    }
    const existing = this.byChart.get(chart);
    let found: FilePatient;
    if (existing) {
      if (key(existing.familyName, existing.givenName, existing.birthDate) !== identity)
        throw new RowError(
          'chart_number',
          `Chart number ${row.chartNumber} belongs to a patient with another name or birth date in Torquetrail`,
        );
      found = { patientId: existing.id, identity, row: rowNumber, create: null };
      this.matched(
        rowNumber,
        existing.id,
        `Matches the existing patient with chart number ${existing.chartNumber}: the rows are added to their record`,
      );
    } else {
      const sameIdentity = this.byIdentity.get(identity);
      if (sameIdentity) {
        found = { patientId: sameIdentity.id, identity, row: rowNumber, create: null };
        this.matched(
          rowNumber,
          sameIdentity.id,
          `Same name and birth date as the existing patient with chart number ${sameIdentity.chartNumber}: the rows are added to that record`,
        );
      } else {
        // Written with the patient's first row that checks, so a patient of only bad rows is not counted.
        found = { patientId: randomUUID(), identity, row: rowNumber, create: row };
      }
    }
    this.fileChart.set(chart, found);
    if (this.touched.size < 50)
      this.touched.set(found.patientId, {
        id: found.patientId,
        chartNumber: row.chartNumber,
        name: `${row.familyName}, ${row.givenName}`,
      });
    return found;
  }

  /** Writes a new patient with the first of their rows that checked (once). */
  create(rowNumber: number, patient: FilePatient) {
    const row = patient.create;
    if (!row) return;
    patient.create = null;
    this.plan.counts.patientsNew++;
    const values = {
      id: patient.patientId,
      practiceId: this.who.practiceId,
      chartNumber: row.chartNumber,
      givenName: row.givenName,
      familyName: row.familyName,
      birthDate: row.birthDate,
    };
    this.plan.writes.patients.push(values);
    this.plan.writes.patientVersions.push({
      practiceId: this.who.practiceId,
      patientId: patient.patientId,
      version: 1,
      kind: 'created',
      changes: (['chartNumber', 'givenName', 'familyName', 'birthDate'] as const).map((field) => ({
        field,
        before: null,
        after: values[field],
      })),
      reason: 'Legacy import',
      changedBy: this.who.userId,
    });
    this.plan.entry(rowNumber, 'patients', patient.patientId);
  }

  private matched(rowNumber: number, patientId: string, message: string) {
    if (this.matchedOnce.has(patientId)) return;
    this.matchedOnce.add(patientId);
    this.plan.counts.patientsMatched++;
    this.plan.warning(rowNumber, 'chart_number', message);
  }
}
