import { randomUUID } from 'node:crypto';
import { ConflictException, Inject, Injectable } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import type { PassportMail, RecordsOutStatus } from '@torquetrail/contracts';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, type Scope } from '../authz/scope.js';
import { reportChange } from '../common/audit-context.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import { StorageService } from '../storage/storage.service.js';
import { patientBundle } from './fhir-bundle.js';
import { renderPassport } from './passport.pdf.js';
import { PassportMailService } from './passport-mail.service.js';
import { fhirFilename, passportFilename, retrievalCardFilename } from './pdf-names.js';
import { buildSnapshot, type ImpressionRows, type RecordSnapshot } from './record-snapshot.js';
import * as repo from './records-out.repository.js';
import { renderRetrievalCard } from './retrieval-card.pdf.js';

type Patient = NonNullable<Awaited<ReturnType<typeof repo.findVisiblePatient>>>;

/** Why the passport cannot be e-mailed to this patient, or null when it can. */
function emailBlockedReason(p: Pick<Patient, 'email' | 'emailConsent'>): string | null {
  if (!p.email) return 'The patient has no e-mail address on record';
  if (!p.emailConsent) return 'The patient has not consented to e-mail';
  return null;
}

const mailReply = (m: Awaited<ReturnType<typeof repo.passportMailsOf>>[number]): PassportMail => ({
  ...m,
  requestedAt: m.requestedAt.toISOString(),
  sentAt: m.sentAt?.toISOString() ?? null,
});

@Injectable()
export class RecordsOutService {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly storage: StorageService,
    private readonly mails: PassportMailService,
  ) {}

  /** The patient if the user may use this record output on them (404 when they may not see the patient). */
  private async patient(
    ability: AppAbility,
    scope: Scope,
    patientId: string,
    subject: 'PatientExport' | 'ImplantPassport',
    action: 'read' | 'create' = 'read',
  ) {
    const found = await repo.findVisiblePatient(this.db, scope, patientId);
    return assertCan(ability, action, subject, found && { ...found, patientId: found.id }, 'patient');
  }

  private async snapshot(patient: Patient): Promise<RecordSnapshot> {
    const [placements, restorations, parts, exams, nextRecallOn, impressions] = await Promise.all([
      repo.placementsOfPatient(this.db, patient.id),
      repo.deliveredRestorationsOfPatient(this.db, patient.id),
      repo.partsOfPatient(this.db, patient.id),
      repo.examsOfPatient(this.db, patient.id),
      repo.nextRecallOf(this.db, patient.id),
      this.impressionRows(patient.id),
    ]);
    const [torque, probing] = await Promise.all([
      repo.torqueOfParts(
        this.db,
        parts.map((p) => p.id),
      ),
      repo.probingOfExams(
        this.db,
        exams.map((e) => e.id),
      ),
    ]);
    return buildSnapshot({
      patient,
      placements,
      restorations,
      parts,
      torque,
      exams,
      probing,
      nextRecallOn,
      impressions,
    });
  }

  /** The patient's impressions (current versions) with their sites, copings or scan bodies, and scan files. */
  private async impressionRows(patientId: string): Promise<ImpressionRows> {
    const impressions = await repo.impressionsOfPatient(this.db, patientId);
    const restorationIds = [...new Set(impressions.map((i) => i.restorationId))];
    const [sites, scanBodies, copings, lots, files] = await Promise.all([
      repo.sitesOfRestorations(this.db, restorationIds),
      repo.scanBodiesOfImpressions(
        this.db,
        impressions.map((i) => i.id),
      ),
      repo.copingsOfRestorations(this.db, restorationIds),
      repo.partLotsOfRestorations(this.db, restorationIds),
      repo.scanFilesOfRestorations(this.db, restorationIds),
    ]);
    return { impressions, sites, scanBodies, copings, lots, files };
  }

  async fhir(ability: AppAbility, scope: Scope, patientId: string) {
    const patient = await this.patient(ability, scope, patientId, 'PatientExport');
    const bundle = patientBundle(await this.snapshot(patient), new Date());
    return { json: JSON.stringify(bundle, null, 2), filename: fhirFilename(patient.chartNumber) };
  }

  async passport(ability: AppAbility, user: SessionUser, scope: Scope, patientId: string) {
    const patient = await this.patient(ability, scope, patientId, 'ImplantPassport');
    const pdf = await renderPassport(await this.snapshot(patient), this.printedBy(user));
    return { pdf, filename: passportFilename(patient.chartNumber) };
  }

  async retrievalCard(ability: AppAbility, user: SessionUser, scope: Scope, patientId: string) {
    const patient = await this.patient(ability, scope, patientId, 'ImplantPassport');
    const pdf = await renderRetrievalCard(await this.snapshot(patient), this.printedBy(user));
    return { pdf, filename: retrievalCardFilename(patient.chartNumber) };
  }

  async mailStatus(ability: AppAbility, scope: Scope, patientId: string): Promise<RecordsOutStatus> {
    const patient = await this.patient(ability, scope, patientId, 'ImplantPassport');
    return {
      emailBlockedReason: emailBlockedReason(patient),
      mails: (await repo.passportMailsOf(this.db, patient.id)).map(mailReply),
    };
  }

  /**
   * E-mails the passport to the patient's own address, only with their e-mail consent. The PDF
   * is rendered now and stored, the request recorded with it (audited), and the job queue sends
   * it. While a request for this patient still waits, pressing again queues nothing more.
   */
  async requestMail(ability: AppAbility, user: SessionUser, scope: Scope, patientId: string): Promise<PassportMail> {
    const patient = await this.patient(ability, scope, patientId, 'ImplantPassport', 'create');
    const blocked = emailBlockedReason(patient);
    if (blocked || !patient.email) throw new ConflictException(blocked ?? 'No e-mail address');
    const pdf = await renderPassport(await this.snapshot(patient), this.printedBy(user));
    const objectKey = `practices/${patient.practiceId}/passports/${randomUUID()}.pdf`;
    await this.storage.put(objectKey, pdf, 'application/pdf');
    const sentTo = patient.email;
    let mail: { id: string; created: boolean };
    try {
      mail = await auditedTransaction(this.db, async (tx) => {
        const made = await repo.requestPassportMail(tx, {
          practiceId: patient.practiceId,
          patientId: patient.id,
          sentTo,
          objectKey,
          requestedBy: user.id,
        });
        reportChange({
          type: 'PassportMail',
          id: made.id,
          patientId: patient.id,
          after: { sentTo, created: made.created },
        });
        return made;
      });
    } catch (error) {
      await this.storage.delete(objectKey).catch(() => undefined);
      throw error;
    }
    // A request already waiting keeps its own PDF: this one is not needed.
    if (!mail.created) await this.storage.delete(objectKey).catch(() => undefined);
    await this.mails.queue(mail.id);
    const row = (await repo.passportMailsOf(this.db, patient.id)).find((m) => m.id === mail.id);
    if (!row) throw new Error(`passport mail ${mail.id} not found after it was written`);
    return mailReply(row);
  }

  private printedBy(user: SessionUser) {
    return { name: user.displayName, at: new Date().toISOString() };
  }
}
