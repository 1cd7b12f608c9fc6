// Lab prescription e-mails: a request is a row in lab_prescription_mails, sent through the shared
// mail queue (mail/mail-queue.ts: locked, sent once, retried with back-off, swept every minute).
// The stored PDF goes with it, and the impression's scan files attached or linked.
import { Inject, Injectable } from '@nestjs/common';
import { type DatePrinter, datePrinter } from '../common/printed-dates.js';
import { ENV, type Env } from '../config/env.js';
import { DB, type Database } from '../db/database.js';
import { ImpressionsService, type ImpressionLabSheet } from '../impressions/impressions.service.js';
import { JobsService } from '../jobs/jobs.service.js';
import { MailQueue } from '../mail/mail-queue.js';
import { MailService, type OutgoingMail } from '../mail/mail.service.js';
import { StorageService } from '../storage/storage.service.js';
import {
  LAB_FILE_LINK_TTL_MS,
  LAB_MAIL_ATTACHMENT_LIMIT_BYTES,
  signLabFileLink,
} from '../impressions/lab-file-link.js';
import * as repo from './lab-prescriptions.repository.js';
import { pdfFilename } from './pdf-filename.js';

type LabMailRow = NonNullable<Awaited<ReturnType<typeof repo.lockMail>>>;

/** The scan bodies the clinician marked on the scan files, named for the lab (empty when none). */
const markedText = (sheet: ImpressionLabSheet | null) => {
  const fdis = (sheet?.scanBodies ?? []).filter((b) => b.marked).map((b) => b.fdi);
  if (fdis.length === 0) return '';
  return `\nThe scan bodies at ${fdis.join(', ')} (FDI) are marked in the scan file.`;
};

@Injectable()
export class LabMailService {
  private readonly secret: string;
  /** Where the mailed links point: APP_URL, else this API's own address (development, tests). */
  private readonly origin: string;
  private readonly mails: MailQueue<LabMailRow>;

  constructor(
    @Inject(ENV) env: Env,
    @Inject(DB) private readonly db: Database,
    jobs: JobsService,
    mail: MailService,
    private readonly storage: StorageService,
    private readonly impressions: ImpressionsService,
  ) {
    this.secret = env.JWT_SECRET;
    this.origin = (env.APP_URL ?? `http://localhost:${env.PORT}`).replace(/\/+$/, '');
    this.mails = new MailQueue(
      { env, db, jobs, mail },
      {
        name: 'lab-prescription-mail',
        lock: repo.lockMail,
        pending: repo.listPendingMails,
        compose: (row) => this.compose(row),
        markSent: (tx, row, messageId) => repo.markMailSent(tx, row.id, row.labPrescriptionId, row.sentTo, messageId),
        markFailed: (tx, row, error, finalAttempt) => repo.markMailAttemptFailed(tx, row.id, error, finalAttempt),
      },
    );
  }

  /** Records a request (or finds the one already waiting) and queues its send. */
  async request(v: { practiceId: string; labPrescriptionId: string; sentTo: string; requestedBy: string }) {
    const mailId = await repo.requestMail(this.db, v);
    await this.mails.queue(mailId);
    return mailId;
  }

  /**
   * The scan files of a digital impression: attached while they stay within
   * LAB_MAIL_ATTACHMENT_LIMIT_BYTES together, else one time-limited link per file in the text.
   */
  private async scanFilesPart(sheet: ImpressionLabSheet | null, dates: DatePrinter) {
    const files = sheet?.files ?? [];
    if (files.length === 0) return { mode: 'none', text: '', attachments: [] };
    const total = files.reduce((n, f) => n + f.sizeBytes, 0);
    if (total <= LAB_MAIL_ATTACHMENT_LIMIT_BYTES) {
      const attachments = await Promise.all(
        files.map(async (f) => ({
          filename: f.name,
          content: await this.storage.get(f.objectKey),
          contentType: 'application/octet-stream',
        })),
      );
      return { mode: 'attached', text: `\n\nThe scan files are attached too.${markedText(sheet)}`, attachments };
    }
    const expiresAt = new Date(Date.now() + LAB_FILE_LINK_TTL_MS);
    const lines = files.map(
      (f) =>
        `${f.name} (${f.fileType.toUpperCase()}, ${f.sizeBytes} bytes):\n${this.origin}/api/lab-files/${signLabFileLink(this.secret, f.id, expiresAt)}`,
    );
    return {
      mode: 'linked',
      text: `\n\nThe scan files are too large to attach. Download them until ${dates.instantUtc(expiresAt)}:\n${lines.join('\n')}${markedText(sheet)}`,
      attachments: [],
    };
  }

  /** The stored PDF, and the impression's scan files attached or linked. */
  private async compose(row: LabMailRow): Promise<OutgoingMail> {
    const pdf = await this.storage.get(row.objectKey);
    // Dates in the practice's order, as on the prescription it sends (issue 15 §7).
    const dates = datePrinter(row.dateFormat);
    const scans = await this.scanFilesPart(await this.impressions.labSheet(row.restorationId), dates);
    return {
      to: row.sentTo,
      subject: `Lab prescription ${row.chartNumber} from ${row.practiceName}`,
      text: `Please find the lab prescription for ${row.chartNumber} attached.${row.dueOn ? ` Due ${dates.date(row.dueOn)}.` : ''}${scans.text}\n\n${row.practiceName}`,
      attachments: [
        { filename: pdfFilename(row.chartNumber), content: pdf, contentType: 'application/pdf' },
        ...scans.attachments,
      ],
      headers: {
        'X-Torquetrail-Lab-Prescription': row.labPrescriptionId,
        'X-Torquetrail-Lab-Mail': row.id,
        'X-Torquetrail-Scan-Files': scans.mode,
      },
    };
  }
}
