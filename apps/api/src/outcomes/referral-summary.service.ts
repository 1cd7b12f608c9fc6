// The referral summary of a patient for the surgeon of a share: drawn as a PDF (download), or
// e-mailed through the job queue like the lab prescriptions. A request is a row in
// referral_summary_mails; its send job (the row id as singleton key) locks the row, draws the PDF,
// sends through SMTP and marks it sent only after SMTP accepted it. A failed attempt is recorded
// and retried with back-off; a row already sent is never sent again; the idempotency key and the
// one-pending-per-share index make a second press the same request. A sweep every minute queues
// a job for any request still pending without one.
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
import { DB, type Database } from '../db/database.js';
import { JobsService } from '../jobs/jobs.service.js';
import { MailService } from '../mail/mail.service.js';
import { boneChangeSinceLoading } from './bone-change.js';
import { boneLevelsOfSites } from './outcomes.repository.js';
import * as repo from './referral-summary.repository.js';
import { renderReferralSummary, type SummaryPdfSite } from './referral-summary.pdf.js';

const SEND_QUEUE = 'referral-summary-mail-send';
const SWEEP_QUEUE = 'referral-summary-mail-sweep';

interface SendJob {
  mailId: string;
}

type Patient = NonNullable<Awaited<ReturnType<typeof repo.findVisiblePatient>>>;
export type ReferralMailOutcome = 'sent' | 'already-sent' | 'gone' | 'failed';

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
  constructor(
    @Inject(ENV) env: Env,
    @Inject(DB) private readonly db: Database,
    private readonly jobs: JobsService,
    private readonly mail: MailService,
  ) {
    // The same retry settings as reminders and lab mails: every mail waits for SMTP the same way.
    jobs.register<SendJob>({
      name: SEND_QUEUE,
      policy: 'exclusive',
      retryLimit: env.REMINDER_RETRY_LIMIT,
      retryDelay: env.REMINDER_RETRY_DELAY_S,
      pollingIntervalSeconds: 1,
      handle: async ({ mailId }, { finalAttempt }) => {
        if ((await this.deliver(mailId, finalAttempt)) === 'failed')
          throw new Error(`referral summary mail ${mailId} not sent; will retry`);
      },
    });
    jobs.register<object>({
      name: SWEEP_QUEUE,
      policy: 'standard',
      retryLimit: 0,
      retryDelay: 60,
      cron: '* * * * *',
      handle: () => this.sweep(),
    });
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
    await this.jobs.send(SEND_QUEUE, { mailId: mail.id } satisfies SendJob, mail.id);
    return toMail(mail);
  }

  /** Queues a send job for every pending request (the singleton key skips those already queued). */
  async sweep(): Promise<void> {
    for (const { id } of await repo.listPendingMails(this.db))
      await this.jobs.send(SEND_QUEUE, { mailId: id } satisfies SendJob, id);
  }

  /** Sends one request at most once: locked for the send, marked sent only after SMTP accepted it. */
  async deliver(mailId: string, finalAttempt = false): Promise<ReferralMailOutcome> {
    return this.db.transaction(async (tx) => {
      const row = await repo.lockMail(tx, mailId);
      if (!row) return 'gone';
      if (row.status === 'sent') return 'already-sent';
      try {
        const patient = await repo.findVisiblePatient(
          tx,
          { practiceId: row.practiceId, sharedPatientIds: [] },
          row.patientId,
        );
        if (!patient) throw new Error('the patient is no longer in the practice');
        const practice = await repo.practiceName(tx, row.practiceId);
        // The surgeon receives the sites their share opens, no other.
        const pdf = await this.render(patient, await repo.shareSiteIds(tx, row.shareId));
        const messageId = await this.mail.send({
          to: row.sentTo,
          subject: `Referral summary ${patient.chartNumber} from ${practice}`,
          text: `Please find attached the implant summary of ${patient.givenName} ${patient.familyName} (chart ${patient.chartNumber}).\n\n${practice}`,
          attachments: [{ filename: filename(patient.chartNumber), content: pdf, contentType: 'application/pdf' }],
          headers: { 'X-Torquetrail-Referral-Summary': row.id },
        });
        await repo.markMailSent(tx, row.id, messageId);
        return 'sent';
      } catch (error) {
        await repo.markMailAttemptFailed(
          tx,
          row.id,
          error instanceof Error ? error.message : String(error),
          finalAttempt,
        );
        return 'failed';
      }
    });
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
