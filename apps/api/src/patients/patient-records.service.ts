// Creating and changing patients' records. Every change is a version (who, when, each field
// before and after), written with the change in one transaction; archiving is a version too,
// and nothing is deleted. The hygienist may change contact details only (CASL field rules).
import { ConflictException, ForbiddenException, Inject, Injectable } from '@nestjs/common';
import { type AppAbility, subject } from '@torquetrail/authz';
import {
  type ArchivePatientBody,
  type DuplicateCheckQuery,
  type DuplicateCheckReply,
  type NewPatientRecord,
  PATIENT_RECORD_FIELDS,
  type PatientDetail,
  type PatientSettingsBody,
  type PatientSettingsReply,
  type PatientVersionsReply,
  patientRecordProblems,
  type UpdatePatientBody,
} from '@torquetrail/contracts';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, type Scope } from '../authz/scope.js';
import { reportChange } from '../common/audit-context.js';
import { fieldError } from '../common/field-error.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import { RecallClock } from '../recalls/recall-clock.js';
import {
  chartNumberTaken,
  findChartSettings,
  findDuplicates,
  formatChartNumber,
  insertPatientWithVersion,
  listVersions,
  lockPatient,
  type PatientChange,
  type PatientFieldChange,
  type PatientRow,
  setChartPrefix,
  takeChartNumber,
  updatePatientWithVersion,
} from './patient-records.repository.js';
import { findVisiblePatient } from './patients.repository.js';
import { PatientsService } from './patients.service.js';

const VERSIONED_FIELDS = PATIENT_RECORD_FIELDS;
type VersionedField = (typeof VERSIONED_FIELDS)[number];
type Record_ = Pick<PatientRow, VersionedField>;
const RISK_FIELDS = ['smoker', 'diabetesPoorlyControlled', 'periodontitisHistory'] as const;

@Injectable()
export class PatientRecordsService {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly patients: PatientsService,
    private readonly clock: RecallClock,
  ) {}

  async create(ability: AppAbility, user: SessionUser, scope: Scope, body: NewPatientRecord): Promise<PatientDetail> {
    const record = body;
    this.refuseFutureDates(record);
    const id = await auditedTransaction(this.db, async (tx) => {
      const chartNumber = await takeChartNumber(tx, user.practiceId);
      const values = { ...record, chartNumber };
      const changes = VERSIONED_FIELDS.map((field) => ({ field, before: null, after: values[field] ?? null }));
      const newId = await insertPatientWithVersion(
        tx,
        { ...values, practiceId: user.practiceId },
        { changedBy: user.id, changes },
      );
      reportChange({ type: 'Patient', id: newId, patientId: newId, after: asChangeMap(changes, 'after') });
      return newId;
    });
    return this.patients.detail(ability, scope, id);
  }

  async update(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    id: string,
    body: UpdatePatientBody,
  ): Promise<PatientDetail> {
    const visible = assertCan(ability, 'read', 'Patient', await findVisiblePatient(this.db, scope, id), 'patient');
    const asSubject = subject('Patient', { id: visible.id, practiceId: visible.practiceId });
    const refused = Object.keys(body).filter((field) => !ability.can('update', asSubject, field));
    if (refused.length > 0) {
      throw new ForbiddenException({
        message: `Your role may change only the contact details: ${refused.length === 1 ? 'one field was' : `${refused.length} fields were`} not changed`,
        fields: Object.fromEntries(refused.map((f) => [f, 'Your role may not change this field'])),
      });
    }
    await auditedTransaction(this.db, async (tx) => {
      const row = (await lockPatient(tx, visible.practiceId, id))!;
      if (row.archivedAt) throw new ConflictException('This patient is archived: bring them back before editing');
      const next: Record_ = { ...pick(row), ...body };
      // Risk factors changed without a new date: they were recorded today.
      if (RISK_FIELDS.some((f) => next[f] !== row[f]) && next.riskFactorsRecordedOn === row.riskFactorsRecordedOn) {
        next.riskFactorsRecordedOn = this.clock.today();
      }
      this.refuseFutureDates(next);
      const problems = patientRecordProblems(next);
      if (Object.keys(problems).length > 0) throw fieldError(problems);
      const set: PatientChange = {};
      const changes: PatientFieldChange[] = [];
      for (const field of VERSIONED_FIELDS) {
        if (next[field] === row[field]) continue;
        changes.push({ field, before: row[field], after: next[field] });
        Object.assign(set, { [field]: next[field] });
      }
      if (changes.length === 0) return;
      if (set.chartNumber !== undefined) {
        if (row.chartNumberChangedAt) {
          throw new ConflictException({
            message: 'The chart number was changed once already; it cannot be changed again',
            fields: { chartNumber: 'This chart number was changed once already and is now fixed' },
          });
        }
        if (await chartNumberTaken(tx, row.practiceId, set.chartNumber, row.id)) {
          throw new ConflictException({
            message: `${set.chartNumber} is another patient's chart number`,
            fields: { chartNumber: `${set.chartNumber} is already another patient's chart number` },
          });
        }
        set.chartNumberChangedAt = new Date();
      }
      await updatePatientWithVersion(tx, row, set, { kind: 'edited', changes, reason: null, changedBy: user.id });
      reportChange({
        type: 'Patient',
        id: row.id,
        patientId: row.id,
        before: asChangeMap(changes, 'before'),
        after: asChangeMap(changes, 'after'),
      });
    });
    return this.patients.detail(ability, scope, id);
  }

  /** Archive (or bring back) with a reason: a version like any other change; the row stays. */
  async setArchived(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    id: string,
    archived: boolean,
    body: ArchivePatientBody,
  ): Promise<PatientDetail> {
    const visible = assertCan(ability, 'archive', 'Patient', await findVisiblePatient(this.db, scope, id), 'patient');
    const reason = body.reason.trim();
    await auditedTransaction(this.db, async (tx) => {
      const row = (await lockPatient(tx, visible.practiceId, id))!;
      if ((row.archivedAt !== null) === archived) {
        throw new ConflictException(archived ? 'This patient is archived already' : 'This patient is not archived');
      }
      const at = archived ? new Date() : null;
      await updatePatientWithVersion(
        tx,
        row,
        { archivedAt: at, archivedBy: archived ? user.id : null, archiveReason: archived ? reason : null },
        {
          kind: archived ? 'archived' : 'unarchived',
          changes: [{ field: 'archived', before: row.archivedAt !== null, after: archived }],
          reason,
          changedBy: user.id,
        },
      );
      reportChange({
        type: 'Patient',
        id: row.id,
        patientId: row.id,
        before: { archived: row.archivedAt !== null },
        after: { archived, reason },
      });
    });
    return this.patients.detail(ability, scope, id);
  }

  async versions(ability: AppAbility, scope: Scope, id: string): Promise<PatientVersionsReply> {
    const patient = assertCan(ability, 'read', 'Patient', await findVisiblePatient(this.db, scope, id), 'patient');
    assertCan(ability, 'read', 'PatientVersion', { practiceId: patient.practiceId, patientId: patient.id }, 'patient');
    const rows = await listVersions(this.db, patient.id);
    return {
      items: rows.map((r) => ({
        ...r,
        changedAt: r.changedAt.toISOString(),
        changes: r.changes.map((c) => ({ field: c.field, before: stored(c.before), after: stored(c.after) })),
      })),
    };
  }

  async duplicates(user: SessionUser, q: DuplicateCheckQuery): Promise<DuplicateCheckReply> {
    const rows = await findDuplicates(this.db, user.practiceId, q);
    return { matches: rows.map((r) => ({ ...r, archivedAt: r.archivedAt?.toISOString() ?? null })) };
  }

  async settings(practiceId: string): Promise<PatientSettingsReply> {
    const { prefix, nextNumber } = await findChartSettings(this.db, practiceId);
    return { chartPrefix: prefix, nextChartNumber: formatChartNumber(prefix, nextNumber) };
  }

  async updateSettings(user: SessionUser, body: PatientSettingsBody): Promise<PatientSettingsReply> {
    await auditedTransaction(this.db, async (tx) => {
      const before = await findChartSettings(tx, user.practiceId);
      await setChartPrefix(tx, user.practiceId, body.chartPrefix, user.id);
      reportChange({ type: 'Practice', id: user.practiceId, before: { chartPrefix: before.prefix }, after: body });
    });
    return this.settings(user.practiceId);
  }

  private refuseFutureDates(record: Pick<Record_, 'birthDate' | 'emailReminderConsentOn' | 'riskFactorsRecordedOn'>) {
    const today = this.clock.today();
    const problems: Record<string, string> = {};
    if (record.birthDate > today) problems.birthDate = 'The date of birth cannot be in the future';
    if (record.emailReminderConsentOn && record.emailReminderConsentOn > today)
      problems.emailReminderConsentOn = 'The consent date cannot be in the future';
    if (record.riskFactorsRecordedOn && record.riskFactorsRecordedOn > today)
      problems.riskFactorsRecordedOn = 'The date cannot be in the future';
    if (Object.keys(problems).length > 0) throw fieldError(problems);
  }
}

const pick = (row: PatientRow): Record_ => Object.fromEntries(VERSIONED_FIELDS.map((f) => [f, row[f]])) as Record_;

/** A stored before/after value as the reply carries it. */
const stored = (value: unknown): string | number | boolean | null =>
  typeof value === 'string' || typeof value === 'number' || typeof value === 'boolean' ? value : null;

/** A version's field changes as the audit row's before or after map. */
function asChangeMap(changes: readonly { field: string; before: unknown; after: unknown }[], side: 'before' | 'after') {
  return Object.fromEntries(changes.map((c) => [c.field, c[side]]));
}
