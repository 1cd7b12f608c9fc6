// Lab prescription e-mails through the API's job queue, like the recall reminders: a request is
// a row in lab_prescription_mails; its send job (one per row: the queue's singleton key) locks
// the row, reads the stored PDF, sends through SMTP and marks it sent only after SMTP accepted
// it. A failed attempt (SMTP or S3 away) is recorded and retried with exponential back-off; a
// row already sent is never sent again. A sweep every minute queues a job for any request still
// pending without one (queue not running when it was made, a job lost with the database).
import { Inject, Injectable } from '@nestjs/common';
import { ENV, type Env } from '../config/env.js';
import { DB, type Database } from '../db/database.js';
import { ImpressionsService, type ImpressionLabSheet } from '../impressions/impressions.service.js';
import { JobsService } from '../jobs/jobs.service.js';
import { MailService } from '../mail/mail.service.js';
import { StorageService } from '../storage/storage.service.js';
import {
  LAB_FILE_LINK_TTL_MS,
  LAB_MAIL_ATTACHMENT_LIMIT_BYTES,
  signLabFileLink,
} from '../impressions/lab-file-link.js';
import * as repo from './lab-prescriptions.repository.js';
import { pdfFilename } from './pdf-filename.js';

const SEND_QUEUE = 'lab-prescription-mail-send';
const SWEEP_QUEUE = 'lab-prescription-mail-sweep';

interface SendJob {
  mailId: string;
}

export type LabMailOutcome = 'sent' | 'already-sent' | 'gone' | 'failed';

@Injectable()
export class LabMailService {
  private readonly secret: string;
  /** Where the mailed links point: APP_URL, else this API's own address (development, tests). */
  private readonly origin: string;
  constructor(
    @Inject(ENV) env: Env,
    @Inject(DB) private readonly db: Database,
    private readonly jobs: JobsService,
    private readonly mail: MailService,
    private readonly storage: StorageService,
    private readonly impressions: ImpressionsService,
  ) {
    this.secret = env.JWT_SECRET;
    this.origin = (env.APP_URL ?? `http://localhost:${env.PORT}`).replace(/\/+$/, '');
    // The same retry settings as reminders: every mail waits for SMTP the same way.
    jobs.register<SendJob>({
      name: SEND_QUEUE,
      policy: 'exclusive',
      retryLimit: env.REMINDER_RETRY_LIMIT,
      retryDelay: env.REMINDER_RETRY_DELAY_S,
      pollingIntervalSeconds: 1,
      handle: async ({ mailId }, { finalAttempt }) => {
        if ((await this.deliver(mailId, finalAttempt)) === 'failed')
          throw new Error(`lab mail ${mailId} not sent; will retry`);
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

  /** Records a request (or finds the one already waiting) and queues its send. */
  async request(v: { practiceId: string; labPrescriptionId: string; sentTo: string; requestedBy: string }) {
    const mailId = await repo.requestMail(this.db, v);
    await this.jobs.send(SEND_QUEUE, { mailId } satisfies SendJob, mailId);
    return mailId;
  }

  /** Queues a send job for every pending request (the singleton key skips those already queued). */
  async sweep(): Promise<void> {
    for (const { id } of await repo.listPendingMails(this.db))
      await this.jobs.send(SEND_QUEUE, { mailId: id } satisfies SendJob, id);
  }

  /**
   * The scan files of a digital impression: attached while they stay within
   * LAB_MAIL_ATTACHMENT_LIMIT_BYTES together, else one time-limited link per file in the text.
   */
  private async scanFilesPart(sheet: ImpressionLabSheet | null) {
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
      return { mode: 'attached', text: '\n\nThe scan files are attached too.', attachments };
    }
    const expiresAt = new Date(Date.now() + LAB_FILE_LINK_TTL_MS);
    const lines = files.map(
      (f) =>
        `${f.name} (${f.fileType.toUpperCase()}, ${f.sizeBytes} bytes):\n${this.origin}/api/lab-files/${signLabFileLink(this.secret, f.id, expiresAt)}`,
    );
    return {
      mode: 'linked',
      text: `\n\nThe scan files are too large to attach. Download them until ${expiresAt.toISOString().slice(0, 16).replace('T', ' ')} UTC:\n${lines.join('\n')}`,
      attachments: [],
    };
  }

  /** Sends one request at most once: locked for the send, marked sent only after SMTP accepted it. */
  async deliver(mailId: string, finalAttempt = false): Promise<LabMailOutcome> {
    return this.db.transaction(async (tx) => {
      const row = await repo.lockMail(tx, mailId);
      if (!row) return 'gone';
      if (row.status === 'sent') return 'already-sent';
      try {
        const pdf = await this.storage.get(row.objectKey);
        const scans = await this.scanFilesPart(await this.impressions.labSheet(row.restorationId));
        const messageId = await this.mail.send({
          to: row.sentTo,
          subject: `Lab prescription ${row.chartNumber} from ${row.practiceName}`,
          text: `Please find the lab prescription for ${row.chartNumber} attached.${row.dueOn ? ` Due ${row.dueOn}.` : ''}${scans.text}\n\n${row.practiceName}`,
          attachments: [
            { filename: pdfFilename(row.chartNumber), content: pdf, contentType: 'application/pdf' },
            ...scans.attachments,
          ],
          headers: {
            'X-Torquetrail-Lab-Prescription': row.labPrescriptionId,
            'X-Torquetrail-Lab-Mail': row.id,
            'X-Torquetrail-Scan-Files': scans.mode,
          },
        });
        await repo.markMailSent(tx, row.id, row.labPrescriptionId, row.sentTo, messageId);
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
}
