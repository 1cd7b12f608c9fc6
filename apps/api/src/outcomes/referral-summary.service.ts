// The referral summary of a patient for the surgeon of a share: drawn as a PDF (download), or
// e-mailed: a request is a row in referral_summary_mails, sent through the shared mail queue
// (mail/mail-queue.ts: locked, the PDF drawn at send time, sent once, retried with back-off,
// swept every minute). The idempotency key and the one-pending-per-share index make a second
// press the same request.
import { Inject, Injectable } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import type { ReferralSummaryMail, ReferralSummaryMailBody, ReferralSummaryState } from '@torquetrail/contracts';
import { isRetrievable, type Retention } from '@torquetrail/domain';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, type Scope, sharedSitesOf } from '../authz/scope.js';
import { reportChange } from '../common/audit-context.js';
import { fieldError } from '../common/field-error.js';
import { ENV, type Env } from '../config/env.js';
import { findPrintingPractice } from '../db/practice-contact.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database, type Tx } from '../db/database.js';
import { JobsService } from '../jobs/jobs.service.js';
import { type MailOutcome, MailQueue } from '../mail/mail-queue.js';
import { MailService, type OutgoingMail } from '../mail/mail.service.js';
import { boneChangeSinceLoading } from './bone-change.js';
import { boneLevelsOfSites } from './outcomes.repository.js';
import * as repo from './referral-summary.repository.js';
import { renderReferralSummary, type SummaryPdfSite } from './referral-summary.pdf.js';

type Patient = NonNullable<Awaited<ReturnType<typeof repo.findVisiblePatient>>>;
type MailRow = NonNullable<Awaited<ReturnType<typeof repo.lockMail>>>;

const words = (value: string) => value.replace(/-/g, ' ');
const STATUS_WORDS: Record<string, string> = {
  placed: 'in function',
  restored: 'in function',
  failed: 'failed',
  removed: 'removed',
  planned: 'planned',
};
const filename = (chartNumber: string) =>
  `referral-summary-${chartNumber.replace(/[^A-Za-z0-9_-]+/g, '_').slice(0, 40)}.pdf`;
const toMail = (m: Awaited<ReturnType<typeof repo.mailsOfPatient>>[number]): ReferralSummaryMail => ({
  ...m,
  status: m.status === 'withheld' ? 'failed' : m.status,
  requestedAt: m.requestedAt.toISOString(),
  sentAt: m.sentAt?.toISOString() ?? null,
});

@Injectable()
export class ReferralSummaryService {
  private readonly mails: MailQueue<MailRow>;

  constructor(
    @Inject(ENV) env: Env,
    @Inject(DB) private readonly db: Database,
    jobs: JobsService,
    mail: MailService,
  ) {
    this.mails = new MailQueue(
      { env, db, jobs, mail },
      {
        name: 'referral-summary-mail',
        lock: repo.lockMail,
        pending: repo.listPendingMails,
        compose: (row, tx) => this.compose(row, tx),
        markSent: (tx, row, messageId) => repo.markMailSent(tx, row.id, messageId),
        markFailed: (tx, row, error, finalAttempt) => repo.markMailAttemptFailed(tx, row.id, error, finalAttempt),
      },
    );
  }

  /** Whom the summary can go to (the shares in force) and the mails requested so far. */
  async state(ability: AppAbility, scope: Scope, patientId: string): Promise<ReferralSummaryState> {
    const patient = await this.patient(ability, scope, patientId, 'read');
    const [shares, mails] = await Promise.all([
      repo.activeShares(this.db, patient.id),
      repo.mailsOfPatient(this.db, patient.id),
    ]);
    return {
      recipients: shares.map((s) => ({ shareId: s.shareId, surgeonName: s.surgeonName, practiceName: s.practiceName })),
      mails: mails.map(toMail),
    };
  }

  async download(ability: AppAbility, scope: Scope, patientId: string): Promise<{ pdf: Buffer; filename: string }> {
    const patient = await this.patient(ability, scope, patientId, 'read');
    // A share of chosen sites (with the outcomes scope) draws those sites only.
    const sites = sharedSitesOf(scope, patient.id);
    return { pdf: await this.render(patient, sites), filename: filename(patient.chartNumber) };
  }

  /** Records the request (or finds the one it repeats) and queues its send after the commit. */
  async requestMail(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    patientId: string,
    body: ReferralSummaryMailBody,
  ): Promise<ReferralSummaryMail> {
    const patient = await this.patient(ability, scope, patientId, 'create');
    const share = (await repo.activeShares(this.db, patient.id)).find((s) => s.shareId === body.shareId);
    if (!share) throw fieldError({ shareId: 'Not a share of this patient that is still in force' });
    const { mail } = await auditedTransaction(this.db, async (tx) => {
      const made = await repo.requestMail(tx, {
        practiceId: patient.practiceId,
        patientId: patient.id,
        shareId: share.shareId,
        sentTo: share.surgeonEmail,
        idempotencyKey: body.idempotencyKey,
        requestedBy: user.id,
      });
      reportChange({
        type: 'ReferralSummaryMail',
        id: made.mail.id,
        patientId: patient.id,
        before: null,
        after: { ...made.mail, repeated: !made.created },
      });
      return made;
    });
    await this.mails.queue(mail.id);
    return toMail(mail);
  }

  /** Queues a send job for every pending request (the singleton key skips those already queued). */
  sweep(): Promise<void> {
    return this.mails.sweep();
  }

  /** Sends one request at most once: locked for the send, marked sent only after SMTP accepted it. */
  deliver(mailId: string, finalAttempt = false): Promise<MailOutcome> {
    return this.mails.deliver(mailId, finalAttempt);
  }

  /** The summary as it stands at send time, of the sites the share opens, no other. */
  private async compose(row: MailRow, tx: Tx): Promise<OutgoingMail> {
    const patient = await repo.findVisiblePatient(
      tx,
      { practiceId: row.practiceId, sharedPatientIds: [] },
      row.patientId,
    );
    if (!patient) throw new Error('the patient is no longer in the practice');
    const practice = await repo.practiceName(tx, row.practiceId);
    const pdf = await this.render(patient, await repo.shareSiteIds(tx, row.shareId));
    return {
      to: row.sentTo,
      subject: `Referral summary ${patient.chartNumber} from ${practice}`,
      text: `Please find attached the implant summary of ${patient.givenName} ${patient.familyName} (chart ${patient.chartNumber}).\n\n${practice}`,
      attachments: [{ filename: filename(patient.chartNumber), content: pdf, contentType: 'application/pdf' }],
      headers: { 'X-Torquetrail-Referral-Summary': row.id },
    };
  }

  private async patient(ability: AppAbility, scope: Scope, id: string, action: 'read' | 'create'): Promise<Patient> {
    return assertCan(ability, action, 'ReferralSummary', await repo.findVisiblePatient(this.db, scope, id), 'patient');
  }

  /** The PDF of the patient's implants, or of the chosen ones only (`onlySites`, a share's sites). */
  private async render(patient: Patient, onlySites: readonly string[] | null): Promise<Buffer> {
    const sites = (await repo.summarySites(this.db, patient.id)).filter(
      (s) => onlySites === null || onlySites.includes(s.siteId),
    );
    const ids = sites.map((s) => s.siteId);
    const [parts, bone, practice] = await Promise.all([
      repo.partsInPlace(this.db, ids),
      boneLevelsOfSites(this.db, ids),
      findPrintingPractice(this.db, patient.practiceId),
    ]);
    const pdfSites: SummaryPdfSite[] = sites.map((s) => {
      const readings = bone.filter((b) => b.siteId === s.siteId);
      const change = boneChangeSinceLoading(readings, s.deliveredOn);
      return {
        fdi: s.fdi,
        status: STATUS_WORDS[s.status] ?? s.status,
        endedOn: s.endedOn,
        placedOn: s.placedOn,
        implant: `${s.system} (${s.manufacturer}), platform ${s.platform} Ø ${s.diameterMm} mm`,
        lengthMm: s.lengthMm,
        lot: s.lot,
        surgeonName: s.surgeonName,
        insertionTorqueNcm: s.insertionTorqueNcm,
        stabilityIsq: s.stabilityIsq,
        loadingProtocol: s.loadingProtocol ? words(s.loadingProtocol) : null,
        restoration: s.kind ? `${words(s.kind)}, ${words(s.retention!)}, ${words(s.material!)}` : null,
        deliveredOn: s.deliveredOn,
        retrievable: s.retention ? isRetrievable(s.retention as Retention) : null,
        parts: parts.filter((p) => p.siteId === s.siteId),
        lastExam: s.examStatus && s.examinedOn ? { status: words(s.examStatus), on: s.examinedOn } : null,
        boneLevels: readings.map((b) => ({ date: b.date, mm: b.boneLevelMm })),
        boneChange: change,
      };
    });
    return renderReferralSummary({
      practice,
      patientName: `${patient.givenName} ${patient.familyName}`,
      birthDate: patient.birthDate,
      chartNumber: patient.chartNumber,
      generatedOn: new Date().toISOString().slice(0, 10),
      sites: pdfSites,
    });
  }
}
